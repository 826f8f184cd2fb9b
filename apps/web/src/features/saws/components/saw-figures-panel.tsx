import type { Saw } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { stressToDisplay } from '@kerfline/domain/units/display';
import { formatLength, formatNumber } from '../../../lib/format';
import { Card } from '../../../lib/ui/card';
import { sawFigures } from './saw-figures';

function Row({ label, value, note }: { label: string; value: string; note: string }) {
  return (
    <div className="border-t border-rule py-3 first:border-t-0 sm:grid sm:grid-cols-[12rem_1fr] sm:gap-4">
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd>
        <span className="tabular text-lg font-semibold text-ink">{value}</span>
        <span className="mt-0.5 block text-sm text-ink-muted">{note}</span>
      </dd>
    </div>
  );
}

/**
 * What the trade's arithmetic says about this saw's recorded geometry: whether the band length agrees with the
 * wheels, how hard the wheels bend the band, and the targets for the checks made at every blade change.
 */
export function SawFiguresPanel({ saw, unitSystem }: { saw: Saw; unitSystem: UnitSystem }) {
  const figures = sawFigures(saw);
  if (!figures) return null;
  const length = (mm: number) => formatLength(mm, unitSystem);
  const difference = `${figures.lengthDifferenceMm >= 0 ? '+' : '−'}${length(Math.abs(figures.lengthDifferenceMm))}`;
  return (
    <Card aria-label="Figures for this saw" className="px-4 py-3 sm:px-5">
      <h2 className="pb-1 text-sm font-bold tracking-wider text-ink-muted uppercase">Figures for this saw</h2>
      {figures.lengthMismatch ? (
        <p
          role="note"
          className="my-2 flex items-start gap-2 rounded-sheet border border-signal-caution bg-signal-caution-soft px-3 py-2 text-sm text-ink"
        >
          <svg aria-hidden="true" viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0">
            <path d="M10 2 19 18H1Z" className="fill-signal-caution-bg stroke-ink" strokeWidth="1.5" />
          </svg>
          <span>
            <strong>Check the record:</strong> the band length differs from what these wheels and centre distance take
            by {difference}. One of the three figures is probably wrong.
          </span>
        </p>
      ) : null}
      <dl>
        <Row
          label="Band length from the wheels"
          value={length(figures.geometryLengthMm)}
          note={`Open-belt formula 2C + πD; the record says ${length(saw.bandLengthMm)} (${difference}).`}
        />
        <Row
          label="Bending stress on the wheels"
          value={stressToDisplay(figures.bendingStressPa, unitSystem).text}
          note="E·t/D with E = 207 GPa for carbon steel (a published strength-of-materials figure): the stress each wheel puts in the band, on top of its tension."
        />
        <Row
          label="Bends per hour at top speed"
          value={formatNumber(figures.bendCyclesPerHourAtTopSpeed)}
          note="Two wheel bends a pass: why a band on small wheels tires sooner."
        />
        <Row
          label="Guide opening"
          value={length(figures.guideClearance.targetMm)}
          note={`Band thickness plus your site's guide-opening setting; ${length(figures.guideClearance.minMm)} to ${length(figures.guideClearance.maxMm)} passes, anything tighter pinches the band.`}
        />
        <Row
          label="Tracking overhang"
          value={length(figures.trackingOverhangMm)}
          note="Tooth edge past the wheel face with the band's back flush to the wheel's back edge (your site's tracking setting)."
        />
      </dl>
    </Card>
  );
}
