import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { siteListQuery } from '../../../features/sites/api/queries';
import { SiteTiles } from '../../../features/sites/components/site-tiles';
import { regionListQuery } from '../../../features/regions/api/queries';
import { useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';

export function sitesLoader(queryClient: QueryClient) {
  return async () => {
    // Region names only label the tiles: a failure there must not stop the page.
    await Promise.all([
      queryClient.ensureQueryData(siteListQuery()),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
    ]);
    return null;
  };
}

export function SitesPage() {
  const { data: sites } = useSuspenseQuery(siteListQuery());
  const { data: regions } = useQuery(regionListQuery());
  const ability = useAppAbility();
  const regionNameOf = (regionId: string) => regions?.items.find((region) => region.id === regionId)?.name;

  return (
    <div className="space-y-6">
      <title>Sites · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Sites</h1>
          <p className="mt-1 text-ink-muted">
            {sites.total === 1
              ? 'The plant you work with.'
              : `The ${sites.total} plants you can see. Choose one for its saws.`}
          </p>
        </div>
        {ability.can('create', 'Site') ? (
          <LinkButton to="/sites/new" variant="primary">
            Add site
          </LinkButton>
        ) : null}
      </div>
      <SiteTiles sites={sites.items} regionNameOf={regionNameOf} />
    </div>
  );
}
