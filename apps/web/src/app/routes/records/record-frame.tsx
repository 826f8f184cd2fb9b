import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { auditListQuery, parseAuditListQuery } from '../../../features/audit/api/queries';
import { RecordHistory } from '../../../features/audit/components/record-history';
import { useAppAbility } from '../../../lib/ability';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';

/** Breadcrumb of a record: its site and its saw. */
export function RecordBreadcrumb({
  site,
  saw,
}: {
  site: { id: string; name: string };
  saw: { id: string; assetTag: string };
}) {
  return (
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
  );
}

/**
 * A record's change history (who, when, what changed), for those who may read the site's audit trail:
 * administrators and that site's admins. Nothing is shown to anyone else (the server would refuse anyway).
 */
export function RecordHistoryCard({
  siteId,
  entity,
  entityId,
  timeZone,
}: {
  siteId: string;
  entity: string;
  entityId: string;
  timeZone: string;
}) {
  const ability = useAppAbility();
  const canRead = ability.can('read', subject('AuditEntry', { id: '', siteId }));
  const history = useQuery({
    ...auditListQuery(parseAuditListQuery({ entity, entityId, limit: 50 })),
    enabled: canRead,
  });
  if (!canRead) return null;
  return (
    <Card aria-labelledby="history-heading" className="p-4 sm:p-5">
      <h2 id="history-heading" className="mb-3 text-lg font-bold text-ink">
        Change history
      </h2>
      {history.isPending ? (
        <p role="status" className="text-ink-muted">
          Loading the history…
        </p>
      ) : history.isError ? (
        <Notice title="The history could not be loaded">{history.error.message}</Notice>
      ) : (
        <RecordHistory entries={history.data.items} timeZone={timeZone} />
      )}
    </Card>
  );
}

export function Section({ title, children }: { title: string; children: ReactNode }) {
  const id = `${title.replace(/\W+/g, '-').toLowerCase()}-heading`;
  return (
    <Card aria-labelledby={id} className="space-y-3 p-4 sm:p-5">
      <h2 id={id} className="text-lg font-bold text-ink">
        {title}
      </h2>
      {children}
    </Card>
  );
}
