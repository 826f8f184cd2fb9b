import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { STOP_CATEGORIES, STOP_CATEGORY_LABELS, stopListQuerySchema } from '@kerfline/domain/stops/schema';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { stopListQuery } from '../../../features/stops/api/queries';
import { StopsTable } from '../../../features/stops/components/stops-table';
import { offsetOf, parseListQuery, searchValue, TABLE_PAGE_SIZE } from '../../../lib/list-search';
import { FilterBar, FilterDate, FilterSelect } from '../../../lib/ui/filters';
import { Pager } from '../../../lib/ui/pager';
import { ExportButton } from '../../../lib/ui/export-button';
import { recordExportPath, useCanExportSite } from '../../../lib/record-export';
import { siteSawsForFilter } from './site-blade-runs-page';
import { SiteRecordsNav } from './site-records-nav';
import { useTableUrl } from './table-url';

const DEFAULT_SORT = '-startedAt';

/** The API's query for the table's URL: `saw`, `category`, `planned`, `state` (open/ended), `from`, `to`, `sort`. */
export function stopsQueryOf(siteId: string, search: URLSearchParams) {
  const state = searchValue(search, 'state');
  return parseListQuery(stopListQuerySchema, {
    siteId,
    sawId: searchValue(search, 'saw'),
    category: searchValue(search, 'category'),
    planned: searchValue(search, 'planned'),
    open: state === 'open' ? 'true' : state === 'ended' ? 'false' : undefined,
    from: searchValue(search, 'from'),
    to: searchValue(search, 'to'),
    sort: searchValue(search, 'sort') ?? DEFAULT_SORT,
    limit: TABLE_PAGE_SIZE,
    offset: offsetOf(search),
  });
}

export function siteStopsPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteSawsForFilter(siteId)),
      queryClient.ensureQueryData(stopListQuery(stopsQueryOf(siteId, search))),
    ]);
    return null;
  };
}

/** A site's stops: `/sites/:siteId/stops`, paged, sorted and filtered on the server. */
export function SiteStopsPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: saws } = useSuspenseQuery(siteSawsForFilter(siteId));
  const { search, setFilters, sortingFor, busy } = useTableUrl(DEFAULT_SORT);
  const q = stopsQueryOf(siteId, search);
  const { sorting, onSortingChange } = sortingFor(q.sort);
  const { data: stops } = useSuspenseQuery(stopListQuery(q));
  const canExport = useCanExportSite(site);
  const filtered = Boolean(q.sawId || q.category || q.planned !== undefined || q.open !== undefined || q.from || q.to);
  return (
    <div className="space-y-5">
      <title>{`Stops · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      <StopsTable
        headingLevel={1}
        stops={stops.items}
        timeZone={site.timeZone}
        sorting={sorting}
        onSortingChange={onSortingChange}
        busy={busy}
        actions={canExport ? <ExportButton path={recordExportPath('/stops/export', q)} /> : null}
        emptyMessage={filtered ? 'No stops match these filters.' : 'No stops are recorded at this site yet.'}
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
              label="Why it stopped"
              value={q.category ?? ''}
              options={STOP_CATEGORIES.map((c) => ({ value: c, label: STOP_CATEGORY_LABELS[c] }))}
              onChange={(value) => setFilters({ category: value })}
              allLabel="Any reason"
            />
            <FilterSelect
              label="Planned"
              value={q.planned === true ? 'true' : q.planned === false ? 'false' : ''}
              options={[
                { value: 'false', label: 'Unplanned' },
                { value: 'true', label: 'Planned' },
              ]}
              onChange={(value) => setFilters({ planned: value })}
              allLabel="Planned or not"
            />
            <FilterSelect
              label="State"
              value={q.open === true ? 'open' : q.open === false ? 'ended' : ''}
              options={[
                { value: 'open', label: 'Still down' },
                { value: 'ended', label: 'Ended' },
              ]}
              onChange={(value) => setFilters({ state: value })}
              allLabel="Open or ended"
            />
            <FilterDate
              label="Stopped from"
              value={search.get('from') ?? ''}
              onChange={(value) => setFilters({ from: value })}
            />
          </FilterBar>
        }
        footer={<Pager total={stops.total} limit={stops.limit} offset={stops.offset} noun="stops" />}
      />
    </div>
  );
}
