import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import type { AuditEntry } from '@kerfline/domain/audit/schema';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { auditListQuery, parseAuditListQuery } from '../../../features/audit/api/queries';
import { RecordHistory } from '../../../features/audit/components/record-history';
import { offsetOf, searchValue, TABLE_PAGE_SIZE } from '../../../lib/list-search';
import { Card } from '../../../lib/ui/card';
import { FilterBar, FilterSelect } from '../../../lib/ui/filters';
import { Pager } from '../../../lib/ui/pager';
import { SiteRecordsNav } from './site-records-nav';
import { useTableUrl } from './table-url';

/** The records whose history a site keeps, as people name them. */
export const HISTORY_ENTITIES: Record<string, string> = {
  BladeRun: 'Blade run',
  Stop: 'Stop',
  StockReceipt: 'Blades received',
  StockLevel: 'Stock levels',
  CutLog: 'Cut log',
  Photo: 'Photo',
  SiteCheck: 'Check on the list',
  CheckRecord: 'Check recorded',
  RemovedRecord: 'Removed entry',
  SiteSetting: 'Site setting',
  Saw: 'Saw',
  Site: 'Site',
  User: 'Person',
  Invitation: 'Invitation',
};

function historyQueryOf(siteId: string, search: URLSearchParams) {
  const entity = searchValue(search, 'record');
  return parseAuditListQuery({
    siteId,
    entity: entity && entity in HISTORY_ENTITIES ? entity : undefined,
    limit: TABLE_PAGE_SIZE,
    offset: offsetOf(search),
  });
}

export function siteHistoryPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(auditListQuery(historyQueryOf(siteId, search))),
    ]);
    return null;
  };
}

/** Where an entry leads: a run or a stop has its own page; the rest name what they are. */
function entityLabel(entry: AuditEntry) {
  const name = HISTORY_ENTITIES[entry.entity] ?? entry.entity;
  const href =
    entry.entity === 'RemovedRecord' && entry.action === 'create'
      ? `/sites/${entry.siteId}/removed`
      : entry.action === 'delete'
        ? null
        : entry.entity === 'BladeRun'
          ? `/blade-runs/${entry.entityId}`
          : entry.entity === 'Stop'
            ? `/stops/${entry.entityId}`
            : entry.entity === 'Saw'
              ? `/saws/${entry.entityId}`
              : null;
  return href ? (
    <Link to={href} className="underline decoration-accent decoration-2 underline-offset-4">
      {name}
    </Link>
  ) : (
    name
  );
}

/** A site's records history: `/sites/:siteId/history` — every change, newest first (admins and the site's admins). */
export function SiteHistoryPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { search, setFilters, busy } = useTableUrl('');
  const q = historyQueryOf(siteId, search);
  const { data: history } = useSuspenseQuery(auditListQuery(q));
  return (
    <div className="space-y-5">
      <title>{`History · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      <Card aria-labelledby="history-heading" aria-busy={busy}>
        <div className="border-b border-rule px-4 py-3 sm:px-5">
          <h1 id="history-heading" className="text-2xl font-extrabold tracking-tight text-ink">
            History of changes
          </h1>
          <p className="text-sm text-ink-muted">Who recorded or changed what, and when, on the site’s clock.</p>
        </div>
        <div className="border-b border-rule px-4 py-3 sm:px-5">
          <FilterBar>
            <FilterSelect
              label="Record"
              value={q.entity ?? ''}
              options={Object.entries(HISTORY_ENTITIES).map(([value, label]) => ({ value, label }))}
              onChange={(value) => setFilters({ record: value })}
              allLabel="Every record"
            />
          </FilterBar>
        </div>
        <div className={`px-4 py-4 sm:px-5 ${busy ? 'opacity-60' : ''}`}>
          <RecordHistory
            entries={history.items}
            timeZone={site.timeZone}
            entityLabel={entityLabel}
            emptyMessage="No changes match."
          />
        </div>
        <div className="border-t border-rule px-4 py-3 sm:px-5">
          <Pager total={history.total} limit={history.limit} offset={history.offset} noun="changes" />
        </div>
      </Card>
    </div>
  );
}
