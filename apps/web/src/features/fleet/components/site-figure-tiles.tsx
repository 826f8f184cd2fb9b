import { Link } from 'react-router-dom';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { Figures, FleetSite } from '@kerfline/domain/fleet/schema';
import { formatNumber } from '../../../lib/format';
import { ChangeNote } from './change-note';
import { changeOf, pointsChangeOf, costPerAreaText, hoursText, lifeText, percentText, spendText } from './figure-text';
import { SiteMark } from './site-mark';
import { siteColour } from '../../../lib/palette';

type Entry = { site: FleetSite; current: Figures; previous: Figures };

/** One figure of a tile: what it is, its value, and its change against the previous period. */
function Figure({
  label,
  value,
  change,
  against,
}: {
  label: string;
  value: string;
  change: ReturnType<typeof changeOf>;
  against: string;
}) {
  return (
    <div>
      <dt className="text-xs font-semibold tracking-wide text-ink-muted uppercase">{label}</dt>
      <dd className="tabular text-lg font-bold text-ink">{value}</dd>
      <dd>
        <ChangeNote change={change} against={against} />
      </dd>
    </div>
  );
}

/** A tile per site with its headline figures for the period and how each moved against the period before. */
export function SiteFigureTiles({
  entries,
  units,
  previousLabel,
  hrefFor,
}: {
  entries: Entry[];
  units: UnitSystem;
  previousLabel: string;
  hrefFor: (siteId: string) => string;
}) {
  if (entries.length === 0) return <p className="text-ink-muted">No sites match these filters.</p>;
  return (
    <ul className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
      {entries.map(({ site, current, previous }) => (
        <li key={site.id}>
          <Link
            to={hrefFor(site.id)}
            className="group block h-full rounded-sheet border border-rule bg-card p-4 transition-colors hover:border-accent"
            style={{ borderTopColor: siteColour(site.colourIndex), borderTopWidth: 4 }}
          >
            <div className="flex items-center gap-2">
              <SiteMark slot={site.colourIndex} size={14} />
              <span className="rounded border border-rule px-1.5 py-0.5 text-xs font-bold tracking-wider">
                {site.code}
              </span>
              <h3 className="truncate font-bold text-ink group-hover:text-accent-dark group-hover:underline">
                {site.name}
              </h3>
            </div>
            <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-3">
              <Figure
                label="Blade spend"
                value={spendText(current.spend)}
                change={changeOf(current.spend.amountMinor, previous.spend.amountMinor, null)}
                against={previousLabel}
              />
              <Figure
                label="Cost per area"
                value={costPerAreaText(
                  current.costPerAreaMinorPerMm2,
                  current.spend.currency,
                  units,
                  current.costPerAreaComplete,
                )}
                change={changeOf(current.costPerAreaMinorPerMm2, previous.costPerAreaMinorPerMm2, 'down')}
                against={previousLabel}
              />
              <Figure
                label="Blade life (median)"
                value={lifeText(current.medianLifeMm2, units)}
                change={changeOf(current.medianLifeMm2, previous.medianLifeMm2, 'up')}
                against={previousLabel}
              />
              <Figure
                label="Operational availability"
                value={percentText(current.operationalAvailability)}
                change={pointsChangeOf(current.operationalAvailability, previous.operationalAvailability, 'up')}
                against={previousLabel}
              />
              <Figure
                label="Stop hours"
                value={hoursText(current.downtimeHours)}
                change={changeOf(current.downtimeHours, previous.downtimeHours, 'down')}
                against={previousLabel}
              />
              <Figure
                label="Failures · MTBF"
                value={`${formatNumber(current.failures)} · ${hoursText(current.mtbfHours)}`}
                change={changeOf(current.mtbfHours, previous.mtbfHours, 'up')}
                against={previousLabel}
              />
            </dl>
            <p className="mt-3 text-sm font-semibold text-accent-dark">
              {formatNumber(current.bladesUsed)} blades put on · open the site’s saws →
            </p>
          </Link>
        </li>
      ))}
    </ul>
  );
}
