import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { makeSaw } from '../../../test-support/fixtures';
import { SawDetailPanel } from './saw-detail-panel';

const machine = () => within(screen.getByRole('region', { name: 'Machine' }));

describe('SawDetailPanel head down-force', () => {
  it('shows a spring-fed saw’s own limit in the site’s unit, who set it and when, and the site’s setting for the other', () => {
    render(
      <SawDetailPanel
        saw={makeSaw({
          headFeed: 'gravity_spring',
          maxHeadForceN: 26.6893,
          headForceSet: { byName: 'Ines Carvalho', at: '2026-11-03T15:00:00.000Z' },
        })}
        unitSystem="imperial"
        timeZone="America/Chicago"
      />,
    );
    // 26.6893 N ÷ 4.4482216152605 N/lbf = 6 lbf (NIST SP 811 (2008), B.8).
    expect(machine().getByText('Largest head force').nextSibling).toHaveTextContent(/^6\slbf$/);
    expect(machine().getByText('Least head force').nextSibling).toHaveTextContent('The site’s setting');
    expect(machine().getByText(/This saw’s limit, set by Ines Carvalho on/)).toBeInTheDocument();
  });

  it('leaves both limits to the site when the saw has none, and shows none on a hydraulic head', () => {
    const { unmount } = render(
      <SawDetailPanel saw={makeSaw({ headFeed: 'gravity_spring' })} unitSystem="metric" timeZone="UTC" />,
    );
    expect(machine().getAllByText('The site’s setting')).toHaveLength(2);
    expect(machine().queryByText(/This saw’s limit/)).not.toBeInTheDocument();
    unmount();
    render(
      <SawDetailPanel saw={makeSaw({ headFeed: 'hydraulic', maxHeadForceN: 30 })} unitSystem="metric" timeZone="UTC" />,
    );
    expect(machine().queryByText('Largest head force')).not.toBeInTheDocument();
  });
});
