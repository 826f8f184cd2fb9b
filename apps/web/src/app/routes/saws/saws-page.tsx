import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import type { Saw } from '@kerfline/domain/saws/schema';
import { siteListQuery } from '../../../features/sites/api/queries';
import { sawListQuery } from '../../../features/saws/api/queries';
import { sawFilterValuesFromSearch, sawListQueryFromSearch } from '../../../features/saws/api/list-search';
import { SawFilters } from '../../../features/saws/components/saw-filters';
import { SawsTable } from '../../../features/saws/components/saws-table';
import { Pager } from '../../../lib/ui/pager';

export function sawsPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteListQuery()),
      queryClient.ensureQueryData(sawListQuery(sawListQueryFromSearch(search))),
    ]);
    return null;
  };
}

/** Every saw the user may see, across their sites; each row in its own site's units. */
export function SawsPage() {
  const [search] = useSearchParams();
  const { data: sites } = useSuspenseQuery(siteListQuery());
  const { data: saws } = useSuspenseQuery(sawListQuery(sawListQueryFromSearch(search)));
  const filters = sawFilterValuesFromSearch(search);
  const siteById = new Map(sites.items.map((site) => [site.id, site]));
  const filtered = filters.status !== '' || filters.kind !== '' || filters.q !== '' || filters.siteId !== '';
  const siteOptions = sites.items.map((site) => ({ id: site.id, name: `${site.name} (${site.code})` }));

  return (
    <div className="space-y-6">
      <title>Saws · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Saws</h1>
        <p className="mt-1 text-ink-muted">Every saw at your sites. Open a site to add one.</p>
      </div>
      <SawsTable
        heading="All saws"
        saws={saws.items}
        unitSystemOf={(saw: Saw) => siteById.get(saw.siteId)?.unitSystem ?? 'metric'}
        siteNameOf={(saw: Saw) => siteById.get(saw.siteId)?.code ?? '—'}
        emptyMessage={filtered ? 'No saws match these filters.' : 'No saws are recorded at your sites yet.'}
        toolbar={<SawFilters values={filters} siteOptions={siteOptions.length > 1 ? siteOptions : undefined} />}
        footer={<Pager total={saws.total} limit={saws.limit} offset={saws.offset} noun="saws" />}
      />
    </div>
  );
}
