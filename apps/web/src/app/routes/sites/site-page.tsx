import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { SiteHeader } from '../../../features/sites/components/site-header';
import { regionListQuery } from '../../../features/regions/api/queries';
import { checkCountsQuery } from '../../../features/checks/api/queries';
import { sawListQuery } from '../../../features/saws/api/queries';
import { sawFilterValuesFromSearch, sawListQueryFromSearch } from '../../../features/saws/api/list-search';
import { SawFilters } from '../../../features/saws/components/saw-filters';
import { SawsTable } from '../../../features/saws/components/saws-table';
import { Pager } from '../../../lib/ui/pager';
import { LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { useAppAbility } from '../../../lib/ability';
import { subject } from '@casl/ability';
import { SiteRecordsNav } from './site-records-nav';

export function sitePageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(sawListQuery(sawListQueryFromSearch(search, siteId))),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
      queryClient.ensureQueryData(checkCountsQuery(siteId)).catch(() => undefined),
    ]);
    return null;
  };
}

/** One site: its header and its saws, filtered by status, kind and text from the URL. */
export function SitePage() {
  const siteId = useParams().siteId ?? '';
  const [search] = useSearchParams();
  const q = sawListQueryFromSearch(search, siteId);
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: saws } = useSuspenseQuery(sawListQuery(q));
  const { data: regions } = useQuery(regionListQuery());
  const { data: counts } = useQuery(checkCountsQuery(siteId));
  const overdue = counts?.items[0]?.overdue ?? 0;
  const filters = sawFilterValuesFromSearch(search);
  const ability = useAppAbility();
  const filtered = filters.status !== '' || filters.kind !== '' || filters.q !== '';

  return (
    <div className="space-y-6">
      <title>{`${site.name} · Kerfline`}</title>
      <SiteHeader
        site={site}
        regionName={regions?.items.find((region) => region.id === site.regionId)?.name}
        actions={
          <>
            {overdue > 0 ? (
              <LinkButton to={`/sites/${site.id}/checks/overdue`} variant="primary">
                {overdue} {overdue === 1 ? 'check' : 'checks'} overdue
              </LinkButton>
            ) : null}
            <LinkButton to={`/sites/${site.id}/settings`}>Site settings</LinkButton>
            {ability.can('update', subject('Site', { id: site.id, regionId: site.regionId })) ? (
              <LinkButton to={`/sites/${site.id}/edit`}>Change site</LinkButton>
            ) : null}
          </>
        }
      />
      <SiteRecordsNav siteId={site.id} />
      {site.retiredAt ? (
        <Notice tone="info" title="Retired site">
          Kept for its history: it is left out of lists and pickers.
        </Notice>
      ) : null}
      <SawsTable
        heading="Saws"
        saws={saws.items}
        unitSystemOf={() => site.unitSystem}
        addForSiteId={site.id}
        emptyMessage={filtered ? 'No saws match these filters.' : 'No saws are recorded at this site yet.'}
        toolbar={<SawFilters values={filters} />}
        footer={<Pager total={saws.total} limit={saws.limit} offset={saws.offset} noun="saws" />}
      />
    </div>
  );
}
