import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { Site } from '@kerfline/domain/sites/schema';
import { formatNumber } from '../../../lib/format';

export const UNIT_SYSTEM_LABELS = { metric: 'Metric (mm, m/min)', imperial: 'Imperial (in, ft/min)' } as const;

/** One tile per site: what its people act on, at a glance; the whole tile a link to the site. */
export function SiteTiles({
  sites,
  regionNameOf,
  figuresOf,
}: {
  sites: Site[];
  regionNameOf: (regionId: string) => string | undefined;
  /** What the site's people act on (saws down, stock left…), composed by the page; in their place, the basics. */
  figuresOf?: (site: Site) => ReactNode;
}) {
  if (sites.length === 0) {
    return (
      <p className="text-ink-muted">No sites are assigned to you yet. Ask an administrator to add you to a site.</p>
    );
  }
  return (
    <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3 2xl:grid-cols-4">
      {sites.map((site) => (
        <li key={site.id}>
          <Link
            to={`/sites/${site.id}`}
            className="group flex h-full flex-col rounded-sheet border border-rule bg-card p-5 transition-colors hover:border-accent"
          >
            <div className="flex items-baseline justify-between gap-3 text-sm text-ink-muted">
              <span className="rounded border border-rule px-1.5 py-0.5 font-bold tracking-wider text-ink">
                {site.code}
              </span>
              <span className="truncate">{regionNameOf(site.regionId) ?? 'Region not shown'}</span>
            </div>
            <h2 className="mt-3 text-xl font-bold text-ink group-hover:text-accent-dark group-hover:underline">
              {site.name}
            </h2>
            <p className="text-sm text-ink-muted">{site.city ?? 'City not recorded'}</p>
            {site.retiredAt ? (
              <p className="mt-2 w-fit rounded border border-ink-muted px-1.5 py-0.5 text-xs font-bold tracking-wider text-ink-muted uppercase">
                <span aria-hidden="true">■ </span>Retired
              </p>
            ) : null}
            {figuresOf ? (
              <div className="mt-4 border-t border-rule pt-3">{figuresOf(site)}</div>
            ) : (
              <p className="mt-4 flex items-baseline gap-2">
                <span className="tabular text-4xl font-extrabold text-ink">{formatNumber(site.activeSawCount)}</span>
                <span className="text-sm text-ink-muted">
                  {site.activeSawCount === 1 ? 'saw in use' : 'saws in use'}
                </span>
              </p>
            )}
          </Link>
        </li>
      ))}
    </ul>
  );
}
