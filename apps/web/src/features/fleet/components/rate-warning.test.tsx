import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { MemoryRouter } from 'react-router-dom';
import { makeFigures } from '../../../test-support/fleet';
import { FleetTotals } from './fleet-totals';
import { RateWarning } from './rate-warning';

// The API words each missing rate as "<currency> → <reporting currency>: no rate for <month>".
const warnings = ['CAD → USD: no rate for 2026-04', 'EUR → USD: no rate for 2026-05'];

describe('the missing-rate warning', () => {
  it('names each currency and month without a rate, says the marked totals leave that money out, and says who can fix it', () => {
    render(
      <MemoryRouter>
        <RateWarning warnings={warnings} canEnterRates={false} />
      </MemoryRouter>,
    );
    const note = screen.getByRole('note');
    expect(within(note).getByText('Some money could not be converted')).toBeInTheDocument();
    expect(
      within(note)
        .getAllByRole('listitem')
        .map((li) => li.textContent),
    ).toEqual(warnings);
    expect(note).toHaveTextContent('Totals marked * leave that money out');
    expect(note).toHaveTextContent('An administrator can enter the rates.');
    expect(within(note).queryByRole('link')).not.toBeInTheDocument();
  });

  it('takes an administrator to the rates', () => {
    render(
      <MemoryRouter>
        <RateWarning warnings={warnings} canEnterRates />
      </MemoryRouter>,
    );
    expect(screen.getByRole('link', { name: 'Enter the rates' })).toHaveAttribute('href', '/exchange-rates');
  });

  it('is not there when every rate was found', () => {
    const { container } = render(
      <MemoryRouter>
        <RateWarning warnings={[]} canEnterRates />
      </MemoryRouter>,
    );
    expect(container).toBeEmptyDOMElement();
  });

  it('has its partner in the totals: spend short of a rate carries the *, and cost per area is withheld', () => {
    const short = makeFigures({
      spend: {
        amountMinor: 25_800,
        currency: 'USD',
        complete: false,
        missing: [{ amountMinor: 12_000, currency: 'CAD', month: '2026-04' }],
      },
      costPerAreaComplete: false,
    });
    render(<FleetTotals current={short} units="imperial" />);
    const spend = screen.getByText('Blade spend').closest('div')!;
    expect(spend).toHaveTextContent('$258.00 *');
    expect(screen.getByText('Cost per area').closest('div')).toHaveTextContent('No rate *');
  });

  it('marks nothing when the money is whole', () => {
    render(<FleetTotals current={makeFigures()} units="imperial" />);
    expect(screen.getByText('Blade spend').closest('div')).not.toHaveTextContent('*');
    expect(screen.getByText('Cost per area').closest('div')).not.toHaveTextContent('*');
  });
});
