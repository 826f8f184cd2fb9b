import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { Figures } from '@kerfline/domain/fleet/schema';
import { formatNumber } from '../../../lib/format';
import { Card } from '../../../lib/ui/card';
import { ChangeNote } from './change-note';
import { changeOf, pointsChangeOf, costPerAreaText, hoursText, lifeText, percentText, spendText } from './figure-text';

/** The headline row for all the shown sites together, each figure with its change against the previous period. */
export function FleetTotals({
  current,
  previous,
  units,
  previousLabel,
  title = 'All shown sites',
}: {
  current: Figures;
  /** Without it, no changes are shown (a site's or saw's own page). */
  previous?: Figures;
  units: UnitSystem;
  previousLabel?: string;
  title?: string;
}) {
  const p = previous ?? null;
  const items = [
    {
      label: 'Blade spend',
      value: spendText(current.spend),
      change: p && changeOf(current.spend.amountMinor, p.spend.amountMinor, null),
    },
    {
      label: 'Blades put on',
      value: formatNumber(current.bladesUsed),
      change: p && changeOf(current.bladesUsed, p.bladesUsed, null),
    },
    {
      label: 'Cost per area',
      value: costPerAreaText(
        current.costPerAreaMinorPerMm2,
        current.spend.currency,
        units,
        current.costPerAreaComplete,
      ),
      change: p && changeOf(current.costPerAreaMinorPerMm2, p.costPerAreaMinorPerMm2, 'down'),
    },
    {
      label: 'Blade life (median)',
      value: lifeText(current.medianLifeMm2, units),
      change: p && changeOf(current.medianLifeMm2, p.medianLifeMm2, 'up'),
    },
    {
      label: 'Operational availability',
      value: percentText(current.operationalAvailability),
      change: p && pointsChangeOf(current.operationalAvailability, p.operationalAvailability, 'up'),
    },
    { label: 'MTBF', value: hoursText(current.mtbfHours), change: p && changeOf(current.mtbfHours, p.mtbfHours, 'up') },
    {
      label: 'MTTR',
      value: hoursText(current.mttrHours),
      change: p && changeOf(current.mttrHours, p.mttrHours, 'down'),
    },
  ];
  return (
    <Card className="p-4">
      <h2 className="text-sm font-bold tracking-wide text-ink-muted uppercase">{title}</h2>
      <dl className="mt-2 grid grid-cols-2 gap-4 sm:grid-cols-4 lg:grid-cols-7">
        {items.map((item) => (
          <div key={item.label}>
            <dt className="text-xs font-semibold text-ink-muted">{item.label}</dt>
            <dd className="tabular text-2xl font-extrabold text-ink">{item.value}</dd>
            {p ? (
              <dd>
                <ChangeNote change={item.change} against={previousLabel ?? 'the previous period'} />
              </dd>
            ) : null}
          </div>
        ))}
      </dl>
    </Card>
  );
}
