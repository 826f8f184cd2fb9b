import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { subject } from '@casl/ability';
import { useAppAbility } from '../../../lib/ability';
import { SiteRecordsNav } from '../sites/site-records-nav';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { siteChecksQuery, siteOverdueQuery } from '../../../features/checks/api/queries';
import { overdueFiltersFromSearch, overdueQueryFromSearch } from '../../../features/checks/api/overdue-search';
import { OverdueChecksTable } from '../../../features/checks/components/overdue-checks-table';

export function siteOverdueChecksPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(siteChecksQuery(siteId)),
      queryClient.ensureQueryData(siteOverdueQuery(siteId, overdueQueryFromSearch(search))),
    ]);
    return null;
  };
}

/** A site's checks due and overdue across its saws, paged on the server, filters in the URL. */
export function SiteOverdueChecksPage() {
  const siteId = useParams().siteId ?? '';
  const [search] = useSearchParams();
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { data: checks } = useSuspenseQuery(siteChecksQuery(siteId));
  const { data: page } = useSuspenseQuery(siteOverdueQuery(siteId, overdueQueryFromSearch(search)));
  const ability = useAppAbility();
  const canRecord = ability.can('create', subject('CheckRecord', { id: '', siteId }));
  return (
    <div className="space-y-6">
      <title>{`Checks due · ${site.name} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm text-ink-muted">
        <Link to={`/sites/${site.id}`} className="inline-flex min-h-11 items-center underline-offset-4 hover:underline">
          {site.name}
        </Link>
        <span aria-hidden="true" className="px-2">
          /
        </span>
        <Link
          to={`/sites/${site.id}/checks`}
          className="inline-flex min-h-11 items-center underline-offset-4 hover:underline"
        >
          Checks
        </Link>
        <span aria-hidden="true" className="px-2">
          /
        </span>
        <span aria-current="page" className="text-ink">
          Due and overdue
        </span>
      </nav>
      <SiteRecordsNav siteId={site.id} />
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">Checks due and overdue</h1>
      <OverdueChecksTable
        page={page}
        checks={checks.items}
        filters={overdueFiltersFromSearch(search)}
        timeZone={site.timeZone}
        canRecord={canRecord}
      />
    </div>
  );
}
