import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { recommendPitches } from '@kerfline/domain/teeth-in-work/recommend-pitches';
import { teethInWorkForStock } from '@kerfline/domain/teeth-in-work/teeth-in-work';
import { formatNumber } from '../../../lib/format';
import { shippedSettings } from '@kerfline/domain/settings/schema';
import { TeethInWorkCalculator } from './teeth-in-work-calculator';

const field = (name: RegExp) => screen.getByRole('textbox', { name });
const result = () => screen.getByRole('region', { name: 'Result' });
const fourSix = { kind: 'variable', coarseTpi: 4, fineTpi: 6 } as const;

function renderCalculator(system: UnitSystem) {
  const view = render(<TeethInWorkCalculator system={system} />);
  return { ...view, user: userEvent.setup() };
}

describe('TeethInWorkCalculator', () => {
  it('counts 4/6 TPI teeth in a 50 mm round bar, then shows the metal under the band in inches', async () => {
    const { user, rerender } = renderCalculator('metric');
    await user.type(field(/Diameter/), '50');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Pitch' }), '4/6 TPI (variable)');

    const teeth = teethInWorkForStock({ kind: 'round_bar', diameterMm: 50 }, fourSix);
    // By hand: 4/6 TPI counts as 5 TPI; the full diameter 50 mm = 1.9685 in (NIST SP 811, B.8) → 9.84 teeth; the
    // mean chord π·50/4 = 39.27 mm = 1.5461 in → 7.73 teeth.
    expect(teeth.max).toBeCloseTo(9.8425, 4);
    expect(teeth.min).toBeCloseTo(7.7303, 4);
    const low = formatNumber(teeth.min, 1);
    const high = formatNumber(teeth.max, 1);
    // Each figure is named for what it is: the mean over the cut and the chord at the centre line.
    expect(result()).toHaveTextContent(
      `4/6 TPI puts ${low} to ${high} teeth in this 50 mm round bar (${low} mean over the cut, ${high} at the centre line) — in the preferred 6–12.`,
    );
    expect(result()).toHaveTextContent('Best: 6–12 teeth');
    // 39.27–50 mm of metal under the band.
    expect(result()).toHaveTextContent('Metal under the band39.3–50mm');

    rerender(<TeethInWorkCalculator system="imperial" />);
    // The same bar in inches: 39.27 mm = 1.546 in, 50 mm = 1.969 in; the teeth do not change.
    expect(result()).toHaveTextContent('Metal under the band1.546–1.969in');
    expect(result()).toHaveTextContent(`puts ${low} to ${high} teeth in this 1.969 in round bar`);
    expect(field(/Diameter/)).toHaveValue('1.9685');
  });

  it('counts teeth for stock typed in inches', async () => {
    const { user } = renderCalculator('imperial');
    await user.type(field(/Diameter/), '2');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Pitch' }), '4/6 TPI (variable)');
    // By hand: 5 TPI × 2 in = 10 teeth at the centre; 5 × π·2/4 = 7.85 teeth on the mean chord.
    const teeth = teethInWorkForStock({ kind: 'round_bar', diameterMm: 50.8 }, fourSix);
    expect(teeth.max).toBeCloseTo(10, 9);
    expect(result()).toHaveTextContent(`4/6 TPI puts ${formatNumber(teeth.min, 1)} to 10 teeth in this 2 in round bar`);
  });

  it('ranks the pitches the domain recommends, and takes one from the list', async () => {
    const { user } = renderCalculator('metric');
    await user.type(field(/Diameter/), '50');
    const best = recommendPitches({ kind: 'round_bar', diameterMm: 50 }).slice(0, 5);
    const list = within(screen.getByRole('region', { name: 'Pitches that suit this stock' })).getAllByRole('listitem');
    expect(list).toHaveLength(best.length);
    best.forEach((candidate, index) => expect(list[index]).toHaveTextContent(`${candidate.label} TPI`));
    await user.click(screen.getByRole('button', { name: `Use ${best[0]!.label} TPI` }));
    expect(screen.getByRole('combobox', { name: 'Pitch' })).toHaveDisplayValue(new RegExp(`^${best[0]!.label} TPI`));
    expect(result()).toHaveTextContent(`${best[0]!.label} TPI puts`);
  });

  it('warns in words when too few teeth are in the work', async () => {
    const { user } = renderCalculator('metric');
    await user.type(field(/Diameter/), '10');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Pitch' }), '3 TPI');
    // 3 TPI × 10 mm ÷ 25.4 = 1.18 teeth at most: below the trade's 3 (common practice, no source).
    expect(result()).toHaveTextContent('Outside 3–24 teeth');
    expect(result()).toHaveTextContent(/teeth may strip\. Choose a finer pitch\./);
  });

  it('puts the shape schema’s message beside the field, in inches too', async () => {
    const { user } = renderCalculator('imperial');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Shape' }), 'Round tube');
    await user.type(field(/Outside diameter/), '2');
    await user.type(field(/Wall/), '1.5');
    await user.tab();
    expect(field(/Wall/)).toHaveAccessibleDescription(/Wall must be less than half the outside diameter/);
    await user.clear(field(/Outside diameter/));
    await user.type(field(/Outside diameter/), '200');
    await user.tab();
    // 3000 mm ÷ 25.4 = 118.11 in, shown to 0.1 in above 100 in.
    expect(field(/Outside diameter/)).toHaveAccessibleDescription(
      /Outside diameter must be at most 118\.1\sin \(3,000\smm\)/,
    );
    expect(result()).not.toHaveTextContent(/NaN/);
  });

  it('reads another pitch as the trade writes it, and explains one it cannot read', async () => {
    const { user } = renderCalculator('metric');
    await user.type(field(/Diameter/), '80');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Pitch' }), 'Another pitch…');
    await user.type(field(/Other pitch/), '6/4');
    await user.tab();
    expect(field(/Other pitch/)).toHaveAccessibleDescription(/coarse end first, e\.g\. 4\/6/);
    // The stock's advice still stands while the pitch is being corrected.
    expect(screen.getByRole('region', { name: 'Pitches that suit this stock' })).toBeInTheDocument();
    await user.clear(field(/Other pitch/));
    await user.type(field(/Other pitch/), '2/3');
    expect(result()).toHaveTextContent('2/3 TPI puts');
  });

  it('judges against the site’s own guards and says whose they are', async () => {
    const settings = shippedSettings().map((item) =>
      item.key === 'teeth_in_work'
        ? {
            ...item,
            source: 'site' as const,
            value: { fewestTeeth: 8, preferredFewestTeeth: 10, preferredMostTeeth: 14, mostTeeth: 30 },
            changedById: '00000000-0000-4000-8000-000000000009',
            changedByName: 'Ines Carvalho',
            changedAt: '2026-10-01T12:00:00.000Z',
          }
        : item,
    );
    const user = userEvent.setup();
    render(<TeethInWorkCalculator system="metric" settings={settings} timeZone="UTC" />);
    await user.type(field(/Diameter/), '50');
    await user.selectOptions(screen.getByRole('combobox', { name: 'Pitch' }), '4/6 TPI (variable)');
    // 7.7–9.8 teeth: within the shipped 3–24, but below this site's fewest 8 at the mean.
    expect(result()).toHaveTextContent('Workable: 8–30 teeth');
    expect(result()).toHaveTextContent('These guards: Your site’s setting, changed by Ines Carvalho on Oct 1, 2026.');
  });
});
