import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { stockMovementListQuerySchema } from '@kerfline/domain/blade-stock/schema';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { bladeSpecListQuery, parseBladeSpecListQuery } from '../../../features/blade-specs/api/queries';
import { stockMovementsQuery } from '../../../features/blade-stock/api/queries';
import { MovementsTable } from '../../../features/blade-stock/components/movements-table';
import { offsetOf, parseListQuery, searchValue, TABLE_PAGE_SIZE } from '../../../lib/list-search';
import { FilterBar, FilterDate, FilterSelect } from '../../../lib/ui/filters';
import { Pager } from '../../../lib/ui/pager';
import { ExportButton } from '../../../lib/ui/export-button';
import { recordExportPath, useCanExportSite } from '../../../lib/record-export';
import { SiteRecordsNav } from './site-records-nav';
import { useTableUrl } from './table-url';

export function movementsQueryOf(search: URLSearchParams) {
  return parseListQuery(stockMovementListQuerySchema, {
    bladeSpecId: searchValue(search, 'spec'),
    from: searchValue(search, 'from'),
    to: searchValue(search, 'to'),
    limit: TABLE_PAGE_SIZE,
    offset: offsetOf(search),
  });
}

const specsFor = (siteId: string) => bladeSpecListQuery(parseBladeSpecListQuery({ siteId, includeArchived: 'true' }));

export function stockMovementsPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(specsFor(siteId)),
      queryClient.ensureQueryData(stockMovementsQuery(siteId, movementsQueryOf(search))),
    ]);
    return null;
  };
}

/** Blades in and out of a site's stock: `/sites/:siteId/stock/movements`, paged on the server. */
export function StockMovementsPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: specs } = useSuspenseQuery(specsFor(siteId));
  const { search, setFilters, busy } = useTableUrl('');
  const q = movementsQueryOf(search);
  const { data: movements } = useSuspenseQuery(stockMovementsQuery(siteId, q));
  const canExport = useCanExportSite(site);
  return (
    <div className="space-y-5">
      <title>{`Stock movements · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      <MovementsTable
        movements={movements.items}
        timeZone={site.timeZone}
        busy={busy}
        actions={
          canExport ? (
            <ExportButton path={recordExportPath(`/sites/${encodeURIComponent(site.id)}/stock/movements/export`, q)} />
          ) : null
        }
        emptyMessage={
          q.bladeSpecId || q.from || q.to
            ? 'No movements match these filters.'
            : 'No blades have come in or gone out yet.'
        }
        toolbar={
          <FilterBar>
            <FilterSelect
              label="Blade spec"
              value={q.bladeSpecId ?? ''}
              options={specs.items.map((spec) => ({ value: spec.id, label: spec.name }))}
              onChange={(value) => setFilters({ spec: value })}
              allLabel="All specs"
            />
            <FilterDate
              label="From"
              value={search.get('from') ?? ''}
              onChange={(value) => setFilters({ from: value })}
            />
            <FilterDate label="Before" value={search.get('to') ?? ''} onChange={(value) => setFilters({ to: value })} />
          </FilterBar>
        }
        footer={<Pager total={movements.total} limit={movements.limit} offset={movements.offset} noun="movements" />}
      />
    </div>
  );
}
