import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { Saw } from '@kerfline/domain/saws/schema';
import type { Site } from '@kerfline/domain/sites/schema';
import { SawStatusBadge } from '../../../features/saws/components/saw-status-badge';

/**
 * The frame of a form for work at one saw: the way back to the saw, its state on top (so the technician knows
 * which machine they are at), one task per screen.
 */
export function SawFormFrame({
  saw,
  site,
  title,
  children,
}: {
  saw: Saw;
  site: Site;
  title: string;
  children: ReactNode;
}) {
  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <title>{`${title} · ${saw.assetTag} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link to={`/sites/${site.id}`} className="inline-flex min-h-11 items-center underline-offset-4 hover:underline">
          {site.name}
        </Link>
        <span aria-hidden="true" className="px-2">
          /
        </span>
        <Link to={`/saws/${saw.id}`} className="inline-flex min-h-11 items-center underline-offset-4 hover:underline">
          {saw.assetTag}
        </Link>
      </nav>
      <header className="space-y-2">
        <SawStatusBadge status={saw.status} down={saw.down} />
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">{title}</h1>
        <p className="text-ink-muted">
          <span className="tabular font-semibold text-ink">{saw.assetTag}</span> · {saw.name}
        </p>
      </header>
      {children}
    </div>
  );
}
