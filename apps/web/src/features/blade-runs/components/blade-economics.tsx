import type { BladeRun } from '@kerfline/domain/blade-runs/schema';
import { bladeLife, costPerAreaCut } from '@kerfline/domain/metrics/blade-economics';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatArea, formatMoneyPerArea, formatNumber } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';
import { Card } from '../../../lib/ui/card';

/**
 * Blade life and cost per area of a saw's recent blades, from the domain's blade economics: only blades taken
 * off with their area recorded count toward life (a blade still on has not finished its life), and cost per area
 * is their cost over the area they cut, in the site's currency.
 */
export function economicsOf(runs: readonly BladeRun[], currency: string) {
  const removed = runs.filter((r) => r.removedAt !== null);
  const withArea = removed.filter((r) => r.areaCutMm2 !== null && r.currency === currency);
  const life = bladeLife(withArea.map((r) => ({ areaCutMm2: r.areaCutMm2!, cuts: r.cuts ?? 0, removed: true })));
  const withCuts = removed.filter((r) => r.cuts !== null);
  const meanCuts = withCuts.length === 0 ? null : withCuts.reduce((t, r) => t + r.cuts!, 0) / withCuts.length;
  const cost =
    withArea.length === 0
      ? null
      : costPerAreaCut({
          currency,
          costMinor: withArea.reduce((t, r) => t + r.costMinor, 0),
          areaCutMm2: withArea.reduce((t, r) => t + r.areaCutMm2!, 0),
        });
  const failures = removed.filter((r) => r.removalReason !== null && r.removalReason !== 'worn_out').length;
  return {
    removed: removed.length,
    counted: withArea.length,
    life,
    meanCuts,
    withCuts: withCuts.length,
    cost,
    failures,
  };
}

export function BladeEconomicsPanel({
  runs,
  system,
  currency,
}: {
  /** The saw's latest runs, newest first (a page from the server). */
  runs: BladeRun[];
  system: UnitSystem;
  currency: string;
}) {
  const e = economicsOf(runs, currency);
  return (
    <Card aria-labelledby="economics-heading" className="p-4 sm:p-5">
      <h2 id="economics-heading" className="text-lg font-bold text-ink">
        Its recent blades
      </h2>
      {e.removed === 0 ? (
        <p className="mt-2 text-ink-muted">No blade has come off this saw yet, so there is no blade life to show.</p>
      ) : (
        <>
          <dl className="mt-3 grid grid-cols-2 gap-4">
            <div>
              <dt className="text-sm text-ink-muted">Area per blade (median)</dt>
              <dd className="tabular text-2xl font-extrabold text-ink">
                {e.life.medianAreaMm2PerBlade !== null ? formatArea(e.life.medianAreaMm2PerBlade, system) : '—'}
              </dd>
            </div>
            <div>
              <dt className="text-sm text-ink-muted">Cuts per blade (mean)</dt>
              <dd className="tabular text-2xl font-extrabold text-ink">
                {e.meanCuts !== null ? formatNumber(e.meanCuts) : '—'}
              </dd>
            </div>
            <div>
              <dt className="text-sm text-ink-muted">Cost per area cut</dt>
              <dd className="tabular text-2xl font-extrabold text-ink">
                {e.cost?.minorPerMm2 != null ? formatMoneyPerArea(e.cost.minorPerMm2, currency, system) : '—'}
              </dd>
            </div>
            <div>
              <dt className="text-sm text-ink-muted">Came off failed</dt>
              <dd className="tabular text-2xl font-extrabold text-ink">
                {formatNumber(e.failures)} of {formatNumber(e.removed)}
              </dd>
            </div>
          </dl>
          <p className="mt-3 text-sm text-ink-muted">
            From this saw’s records: its last {formatNumber(e.removed)} blade{e.removed === 1 ? '' : 's'} taken off
            {e.counted < e.removed
              ? `, ${formatNumber(e.counted)} of them with the area they cut recorded in ${currency}`
              : ''}
            . Cost per area is their cost ({e.cost ? formatMoney(e.cost.costMinor, currency) : '—'}) over the area they
            cut; the median is given because a few early failures pull an average down.
          </p>
        </>
      )}
    </Card>
  );
}
