import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { parseSiteListQuery, siteListQuery } from '../../../features/sites/api/queries';
import { SiteTiles } from '../../../features/sites/components/site-tiles';
import { regionListQuery } from '../../../features/regions/api/queries';
import { parseSiteSummaryQuery, siteSummaryListQuery } from '../../../features/site-summaries/api/queries';
import { SiteSummaryFigures } from '../../../features/site-summaries/components/site-summary-figures';
import { useAppAbility } from '../../../lib/ability';
import { checkCountsQuery } from '../../../features/checks/api/queries';
import { CheckCountsFigure } from '../../../features/checks/components/check-counts-figure';
import { LinkButton } from '../../../lib/ui/button';

/** `?retired=shown` lists retired sites too (they keep their history). */
const listOf = (search: URLSearchParams) =>
  siteListQuery(parseSiteListQuery({ includeRetired: search.get('retired') === 'shown' }));
/** What each tile shows people to act on, for the same sites. */
const summariesOf = (search: URLSearchParams) =>
  siteSummaryListQuery(parseSiteSummaryQuery({ includeRetired: search.get('retired') === 'shown' ? 'true' : 'false' }));

export function sitesLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    // Region names only label the tiles: a failure there must not stop the page.
    await Promise.all([
      queryClient.ensureQueryData(listOf(new URL(request.url).searchParams)),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
      // The tiles' figures come with the page; without them the tiles still lead to each site.
      queryClient.ensureQueryData(summariesOf(new URL(request.url).searchParams)).catch(() => undefined),
      queryClient.ensureQueryData(checkCountsQuery()).catch(() => undefined),
    ]);
    return null;
  };
}

export function SitesPage() {
  const [search, setSearch] = useSearchParams();
  const showRetired = search.get('retired') === 'shown';
  const { data: sites } = useSuspenseQuery(listOf(search));
  const { data: regions } = useQuery(regionListQuery());
  const summaries = useQuery(summariesOf(search));
  const checkCounts = useQuery(checkCountsQuery());
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
      {summaries.isError ? (
        <p role="alert" className="text-sm font-semibold text-signal-stop">
          The figures on the tiles could not be loaded: {summaries.error.message}
        </p>
      ) : null}
      <SiteTiles
        sites={sites.items}
        regionNameOf={regionNameOf}
        figuresOf={(site) =>
          summaries.isPending ? (
            <p className="text-sm text-ink-muted">Loading figures…</p>
          ) : (
            <SiteSummaryFigures
              summary={summaries.data?.items.find((summary) => summary.siteId === site.id)}
              timeZone={site.timeZone}
              extra={<CheckCountsFigure counts={checkCounts.data?.items.find((c) => c.siteId === site.id)} />}
            />
          )
        }
      />
      {ability.can('create', 'Site') ? (
        <label className="flex min-h-11 w-fit cursor-pointer items-center gap-3 text-sm text-ink">
          <input
            type="checkbox"
            className="size-5 accent-accent"
            checked={showRetired}
            onChange={(event) => setSearch(event.target.checked ? { retired: 'shown' } : {})}
          />
          Show retired sites too
        </label>
      ) : null}
    </div>
  );
}
