import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { Site } from '@kerfline/domain/sites/schema';
import { UNIT_SYSTEM_LABELS } from './site-tiles';

/** The site's name and the facts that change how its figures read: time zone, units and currency. */
export function SiteHeader({
  site,
  regionName,
  actions,
}: {
  site: Site;
  regionName: string | undefined;
  actions?: ReactNode;
}) {
  return (
    <header className="space-y-4">
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link
          to="/sites"
          className="inline-flex min-h-11 items-center text-ink-muted underline-offset-4 hover:text-ink hover:underline"
        >
          Sites
        </Link>
        <span aria-hidden="true" className="px-2 text-ink-muted">
          /
        </span>
        <span aria-current="page" className="text-ink">
          {site.code}
        </span>
      </nav>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">{site.name}</h1>
          <p className="mt-1 text-ink-muted">{[site.code, site.city, regionName].filter(Boolean).join(' · ')}</p>
        </div>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      <dl className="flex flex-wrap gap-x-8 gap-y-2 border-y border-rule py-3 text-sm">
        <div>
          <dt className="text-ink-muted">Time zone</dt>
          <dd className="font-semibold text-ink">{site.timeZone}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Units</dt>
          <dd className="font-semibold text-ink">{UNIT_SYSTEM_LABELS[site.unitSystem]}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Currency</dt>
          <dd className="font-semibold text-ink">{site.currency}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Saws in use</dt>
          <dd className="tabular font-semibold text-ink">{site.activeSawCount}</dd>
        </div>
      </dl>
    </header>
  );
}
