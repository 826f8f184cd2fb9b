import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { bladeRunListQuerySchema } from '@kerfline/domain/blade-runs/schema';
import { REMOVAL_REASONS, REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { sawListQuerySchema } from '@kerfline/domain/saws/schema';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { sawListQuery } from '../../../features/saws/api/queries';
import { bladeRunListQuery } from '../../../features/blade-runs/api/queries';
import { BladeRunsTable } from '../../../features/blade-runs/components/blade-runs-table';
import { offsetOf, parseListQuery, searchValue, TABLE_PAGE_SIZE } from '../../../lib/list-search';
import { FilterBar, FilterDate, FilterSelect } from '../../../lib/ui/filters';
import { Pager } from '../../../lib/ui/pager';
import { ExportButton } from '../../../lib/ui/export-button';
import { recordExportPath, useCanExportSite } from '../../../lib/record-export';
import { SiteRecordsNav } from './site-records-nav';
import { useTableUrl } from './table-url';

const DEFAULT_SORT = '-installedAt';

/** The API's query for the table's URL: `saw`, `reason`, `state` (on/off), `from`, `to`, `sort`, `offset`. */
export function bladeRunsQueryOf(siteId: string, search: URLSearchParams) {
  const state = searchValue(search, 'state');
  return parseListQuery(bladeRunListQuerySchema, {
    siteId,
    sawId: searchValue(search, 'saw'),
    reason: searchValue(search, 'reason'),
    open: state === 'on' ? 'true' : state === 'off' ? 'false' : undefined,
    from: searchValue(search, 'from'),
    to: searchValue(search, 'to'),
    sort: searchValue(search, 'sort') ?? DEFAULT_SORT,
    limit: TABLE_PAGE_SIZE,
    offset: offsetOf(search),
  });
}

/** Every saw of the site, retired ones too, for the saw filter. */
export const siteSawsForFilter = (siteId: string) =>
  sawListQuery(sawListQuerySchema.parse({ siteId, includeRetired: 'true', limit: 500 }));

export function siteBladeRunsPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteSawsForFilter(siteId)),
      queryClient.ensureQueryData(bladeRunListQuery(bladeRunsQueryOf(siteId, search))),
    ]);
    return null;
  };
}

/** A site's blade runs: `/sites/:siteId/blade-runs`, paged, sorted and filtered on the server. */
export function SiteBladeRunsPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: saws } = useSuspenseQuery(siteSawsForFilter(siteId));
  const { search, setFilters, sortingFor, busy } = useTableUrl(DEFAULT_SORT);
  const q = bladeRunsQueryOf(siteId, search);
  const { sorting, onSortingChange } = sortingFor(q.sort);
  const { data: runs } = useSuspenseQuery(bladeRunListQuery(q));
  const filtered = Boolean(q.sawId || q.reason || q.open !== undefined || q.from || q.to);
  const canExport = useCanExportSite(site);
  return (
    <div className="space-y-5">
      <title>{`Blade runs · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      <BladeRunsTable
        headingLevel={1}
        runs={runs.items}
        system={site.unitSystem}
        timeZone={site.timeZone}
        sorting={sorting}
        onSortingChange={onSortingChange}
        busy={busy}
        actions={canExport ? <ExportButton path={recordExportPath('/blade-runs/export', q)} /> : null}
        emptyMessage={filtered ? 'No blade runs match these filters.' : 'No blade runs are recorded at this site yet.'}
        toolbar={
          <FilterBar>
            <FilterSelect
              label="Saw"
              value={q.sawId ?? ''}
              options={saws.items.map((saw) => ({ value: saw.id, label: `${saw.assetTag} · ${saw.name}` }))}
              onChange={(value) => setFilters({ saw: value })}
              allLabel="All saws"
            />
            <FilterSelect
              label="Why it came off"
              value={q.reason ?? ''}
              options={REMOVAL_REASONS.map((reason) => ({ value: reason, label: REMOVAL_REASON_LABELS[reason] }))}
              onChange={(value) => setFilters({ reason: value })}
              allLabel="Any reason"
            />
            <FilterSelect
              label="Blade"
              value={q.open === true ? 'on' : q.open === false ? 'off' : ''}
              options={[
                { value: 'on', label: 'On a saw now' },
                { value: 'off', label: 'Taken off' },
              ]}
              onChange={(value) => setFilters({ state: value })}
              allLabel="On or off"
            />
            <FilterDate
              label="Put on from"
              value={search.get('from') ?? ''}
              onChange={(value) => setFilters({ from: value })}
            />
            <FilterDate
              label="Put on before"
              value={search.get('to') ?? ''}
              onChange={(value) => setFilters({ to: value })}
            />
          </FilterBar>
        }
        footer={<Pager total={runs.total} limit={runs.limit} offset={runs.offset} noun="blade runs" />}
      />
    </div>
  );
}
