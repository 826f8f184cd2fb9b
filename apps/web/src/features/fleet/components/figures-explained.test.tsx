import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { FiguresExplained } from './figures-explained';

describe('what the fleet figures mean', () => {
  it('names availability as operational and gives IEC 60050-192 as its source', async () => {
    render(<FiguresExplained />);
    await userEvent.click(screen.getByText('What these figures mean and where they come from'));
    const term = screen.getByText('Operational availability', { selector: 'dt' });
    const meaning = term.nextElementSibling!;
    expect(meaning.textContent).toMatch(/not the inherent availability/);
    expect(meaning.nextElementSibling!.textContent).toMatch(/^Source: IEC 60050-192:2015/);
    expect(screen.getByText('Flagged against its peers', { selector: 'dt' }).parentElement!.textContent).toMatch(
      /Iglewicz and D\. C\. Hoaglin/,
    );
  });
});
