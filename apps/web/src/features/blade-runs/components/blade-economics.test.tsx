import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { in2ToMm2 } from '@kerfline/domain/units/units';
import { makeRun } from '../../../test-support/records';
import { BladeEconomicsPanel } from './blade-economics';

const id = (n: number) => `8e4c3d5f-6a7b-4c8d-ab9e-0f1a2b3c4d${String(n).padStart(2, '0')}`;
const off = { removedAt: '2026-03-05T13:00:00.000Z', costMinor: 6000, currency: 'USD' };

/**
 * A saw's recent blades, newest first: three off with their area (200, 100, 300 in²; $60.00 each), one off
 * without its area, and one still on. 1 in² = 645.16 mm² exactly (NIST SP 811 (2008), B.8).
 */
const runs = [
  makeRun({ id: id(1) }),
  makeRun({ id: id(2), ...off, removalReason: 'worn_out', areaCutMm2: in2ToMm2(200), cuts: 40 }),
  makeRun({ id: id(3), ...off, removalReason: 'broken', areaCutMm2: in2ToMm2(100), cuts: 20 }),
  makeRun({ id: id(4), ...off, removalReason: 'worn_out', areaCutMm2: in2ToMm2(300) }),
  makeRun({ id: id(5), ...off, removalReason: 'fatigue_crack' }),
];

const figure = (panel: HTMLElement, label: string) => within(panel).getByText(label).nextElementSibling;

describe('the saw page’s recent blades', () => {
  it('gives blade life and cost per area of the blades taken off, in the site’s units, and says what it counts', () => {
    render(<BladeEconomicsPanel runs={runs} system="imperial" currency="USD" />);
    const panel = screen.getByRole('region', { name: 'Its recent blades' });
    // Median of 100, 200, 300 in² = 200 in²; the blade still on and the one without its area do not count.
    expect(figure(panel, 'Area per blade (median)')).toHaveTextContent(/^200\sin²$/);
    // Mean of the cuts recorded: (40 + 20) / 2 = 30.
    expect(figure(panel, 'Cuts per blade (mean)')).toHaveTextContent('30');
    // $180.00 over 600 in² = $0.30/in² (worked by hand).
    expect(figure(panel, 'Cost per area cut')).toHaveTextContent(/^\$0\.30\/in²$/);
    // Broken and fatigue crack are failures; worn out is not.
    expect(figure(panel, 'Came off failed')).toHaveTextContent('2 of 4');
    expect(panel).toHaveTextContent(
      'its last 4 blades taken off, 3 of them with the area they cut recorded in USD. Cost per area is their cost ($180.00)',
    );
  });

  it('reads metric on a metric site', () => {
    render(<BladeEconomicsPanel runs={runs} system="metric" currency="USD" />);
    const panel = screen.getByRole('region', { name: 'Its recent blades' });
    // 200 in² = 1,290.32 cm²; $0.30/in² ÷ 6.4516 cm²/in² = $0.0465/cm², two significant digits.
    expect(figure(panel, 'Area per blade (median)')).toHaveTextContent(/cm²$/);
    expect(figure(panel, 'Cost per area cut')).toHaveTextContent(/^\$0\.047\/cm²$/);
  });

  it('says there is no blade life yet while no blade has come off', () => {
    render(<BladeEconomicsPanel runs={[makeRun()]} system="imperial" currency="USD" />);
    expect(
      screen.getByText('No blade has come off this saw yet, so there is no blade life to show.'),
    ).toBeInTheDocument();
    expect(screen.queryByText('Cost per area cut')).not.toBeInTheDocument();
  });
});
