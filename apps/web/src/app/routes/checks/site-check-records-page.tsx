import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { checkRecordListQuerySchema } from '@kerfline/domain/site-checks/schema';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { checkRecordListQuery, siteChecksQuery } from '../../../features/checks/api/queries';
import { CheckRecordsTable } from '../../../features/checks/components/check-records-table';
import { offsetOf, parseListQuery, searchValue, TABLE_PAGE_SIZE } from '../../../lib/list-search';
import { FilterBar, FilterDate, FilterSelect } from '../../../lib/ui/filters';
import { Pager } from '../../../lib/ui/pager';
import { siteSawsForFilter } from '../sites/site-blade-runs-page';
import { SiteRecordsNav } from '../sites/site-records-nav';
import { useTableUrl } from '../sites/table-url';

const DEFAULT_SORT = '-checkedAt';

/** The API's query for the table's URL: `saw`, `check`, `verdict` (passed/failed), `from`, `to`, `sort`. */
export function checkRecordsQueryOf(siteId: string, search: URLSearchParams) {
  const verdict = searchValue(search, 'verdict');
  return parseListQuery(checkRecordListQuerySchema, {
    siteId,
    sawId: searchValue(search, 'saw'),
    siteCheckId: searchValue(search, 'check'),
    passed: verdict === 'passed' ? 'true' : verdict === 'failed' ? 'false' : undefined,
    from: searchValue(search, 'from'),
    to: searchValue(search, 'to'),
    sort: searchValue(search, 'sort') ?? DEFAULT_SORT,
    limit: TABLE_PAGE_SIZE,
    offset: offsetOf(search),
  });
}

export function siteCheckRecordsPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteSawsForFilter(siteId)),
      queryClient.ensureQueryData(siteChecksQuery(siteId, true)),
      queryClient.ensureQueryData(checkRecordListQuery(checkRecordsQueryOf(siteId, search))),
    ]);
    return null;
  };
}

/** A site's recorded checks: `/sites/:siteId/check-records`, paged, sorted and filtered on the server. */
export function SiteCheckRecordsPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: saws } = useSuspenseQuery(siteSawsForFilter(siteId));
  // Retired checks too: their records stay, and a filter on one should still work.
  const { data: checks } = useSuspenseQuery(siteChecksQuery(siteId, true));
  const { search, setFilters, sortingFor, busy } = useTableUrl(DEFAULT_SORT);
  const q = checkRecordsQueryOf(siteId, search);
  const { sorting, onSortingChange } = sortingFor(q.sort);
  const { data: records } = useSuspenseQuery(checkRecordListQuery(q));
  const filtered = Boolean(q.sawId || q.siteCheckId || q.passed !== undefined || q.from || q.to);
  return (
    <div className="space-y-5">
      <title>{`Checks recorded · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      <CheckRecordsTable
        headingLevel={1}
        records={records.items}
        unitSystem={site.unitSystem}
        timeZone={site.timeZone}
        sorting={sorting}
        onSortingChange={onSortingChange}
        busy={busy}
        emptyMessage={filtered ? 'No recorded checks match these filters.' : 'No checks are recorded at this site yet.'}
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
              label="Check"
              value={q.siteCheckId ?? ''}
              options={checks.items.map((check) => ({ value: check.id, label: check.name }))}
              onChange={(value) => setFilters({ check: value })}
              allLabel="Every check"
            />
            <FilterSelect
              label="Verdict"
              value={q.passed === true ? 'passed' : q.passed === false ? 'failed' : ''}
              options={[
                { value: 'failed', label: 'Failed' },
                { value: 'passed', label: 'Passed' },
              ]}
              onChange={(value) => setFilters({ verdict: value })}
              allLabel="Passed or failed"
            />
            <FilterDate
              label="Checked from"
              value={search.get('from') ?? ''}
              onChange={(value) => setFilters({ from: value })}
            />
            <FilterDate
              label="Checked before"
              value={search.get('to') ?? ''}
              onChange={(value) => setFilters({ to: value })}
            />
          </FilterBar>
        }
        footer={<Pager total={records.total} limit={records.limit} offset={records.offset} noun="recorded checks" />}
      />
    </div>
  );
}
