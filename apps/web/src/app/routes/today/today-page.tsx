import { FollowUpsPanel } from '../../../features/follow-ups/components/follow-ups-panel';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { sawListQuerySchema, type Saw } from '@kerfline/domain/saws/schema';
import { meQuery } from '../../../features/auth/api/queries';
import { parseSiteListQuery, siteDetailQuery, siteListQuery } from '../../../features/sites/api/queries';
import { sawListQuery } from '../../../features/saws/api/queries';
import { SawStatePanel } from '../../../features/saws/components/saw-state-panel';
import { useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { SawActionButtons, sawActionsFor } from '../saws/saw-actions';
import { subject } from '@casl/ability';
import { dueCheckListQuerySchema } from '@kerfline/domain/site-checks/schema';
import { siteOverdueQuery } from '../../../features/checks/api/queries';
import { DueChecksPanel } from '../../../features/checks/components/due-checks-panel';

/** The site the start screen is for: `?site=`, else the person's only site. */
function siteIdFor(search: URLSearchParams, siteIds: string[]): string | null {
  const asked = search.get('site');
  if (asked && /^[0-9a-f-]{36}$/i.test(asked)) return asked;
  return siteIds.length === 1 ? siteIds[0]! : null;
}

/** Every saw in use at the site: a site has tens of saws, well within a page. */
const sawsAt = (siteId: string) => sawListQuery(sawListQuerySchema.parse({ siteId, limit: 500 }));
/** The site's checks due and overdue, the longest overdue first. */
const CHECKS_SHOWN = 20;
const checksDueAt = (siteId: string) =>
  siteOverdueQuery(siteId, dueCheckListQuerySchema.parse({ state: 'pending', limit: CHECKS_SHOWN }));

export function todayPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQuery());
    const siteId = siteIdFor(new URL(request.url).searchParams, me.siteIds);
    if (!siteId) {
      await queryClient.ensureQueryData(siteListQuery(parseSiteListQuery()));
      return null;
    }
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(sawsAt(siteId)),
      queryClient.ensureQueryData(checksDueAt(siteId)).catch(() => undefined),
    ]);
    return null;
  };
}

/** The start screen's actions: the two that start the day's work at this saw; the rest are on its page. */
const TODAY_ACTIONS = ['end-stop', 'change-blade', 'blade-on', 'log-stop'];

function SawCard({ saw, timeZone }: { saw: Saw; timeZone: string }) {
  const ability = useAppAbility();
  const actions = sawActionsFor(saw, ability)
    .filter((action) => TODAY_ACTIONS.includes(action.key))
    .slice(0, 2)
    // Copper only where a saw is down: ending its stop is the work that cannot wait.
    .map((action) => ({
      ...action,
      variant: action.key === 'end-stop' ? ('primary' as const) : ('secondary' as const),
    }));
  return (
    <li>
      <SawStatePanel
        saw={saw}
        timeZone={timeZone}
        lastStopEndedAt={undefined}
        heading={
          <h3 className="-my-2">
            <Link
              to={`/saws/${saw.id}`}
              className="inline-flex min-h-11 items-center text-lg font-extrabold text-ink underline decoration-accent decoration-2 underline-offset-4"
            >
              <span className="tabular">{saw.assetTag}</span>&nbsp;· {saw.name}
            </Link>
          </h3>
        }
        actions={
          actions.length > 0 ? (
            <div className="grid w-full grid-cols-2 gap-2">
              <SawActionButtons actions={actions} />
            </div>
          ) : undefined
        }
      />
    </li>
  );
}

/** With no site chosen (someone who works at several): the sites to start from. */
function ChooseSite() {
  const { data: sites } = useSuspenseQuery(siteListQuery(parseSiteListQuery()));
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">Today</h1>
      <p className="text-ink-muted">Choose the site whose work you want to see.</p>
      <ul className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
        {sites.items.map((site) => (
          <li key={site.id}>
            <LinkButton to={`/today?site=${site.id}`} className="w-full min-h-12 justify-start text-base">
              {site.name}
            </LinkButton>
          </li>
        ))}
      </ul>
    </div>
  );
}

/**
 * A technician's start screen, `/today`: their site's saws that are down (longest first), the checks due today
 * (when checks are recorded), then the saws running with the blade on each; every saw with its next actions.
 */
export function TodayPage() {
  const [search] = useSearchParams();
  const { data: me } = useSuspenseQuery(meQuery());
  const siteId = siteIdFor(search, me.siteIds);
  if (!siteId) return <ChooseSite />;
  return <SiteToday siteId={siteId} />;
}

function SiteToday({ siteId }: { siteId: string }) {
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const saws = useQuery(sawsAt(siteId));
  const list = saws.data?.items ?? [];
  const down = list
    .filter((saw) => saw.status === 'down')
    .sort((a, b) => Date.parse(a.down?.since ?? '') - Date.parse(b.down?.since ?? ''));
  const running = list.filter((saw) => saw.status === 'in_service');
  const checks = useQuery(checksDueAt(siteId));
  const ability = useAppAbility();
  const canRecord = ability.can('create', subject('CheckRecord', { id: '', siteId }));
  return (
    <div className="space-y-6">
      <title>{`Today · ${site.name} · Kerfline`}</title>
      <header>
        <p className="text-sm text-ink-muted">{site.name}</p>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Today</h1>
        <p className="mt-1 text-ink-muted">
          {saws.isPending
            ? 'Loading the saws…'
            : down.length === 0
              ? `All ${running.length} saws are running.`
              : `${down.length} of ${list.length} saws ${down.length === 1 ? 'is' : 'are'} down.`}
        </p>
      </header>
      {saws.isError ? <p role="alert">{saws.error.message}</p> : null}

      {down.length > 0 ? (
        <section aria-labelledby="down-heading" className="space-y-3">
          <h2 id="down-heading" className="text-lg font-bold text-ink">
            Down now
          </h2>
          <ul className="grid gap-3 lg:grid-cols-2">
            {down.map((saw) => (
              <SawCard key={saw.id} saw={saw} timeZone={site.timeZone} />
            ))}
          </ul>
        </section>
      ) : null}

      {checks.data ? (
        <DueChecksPanel
          heading="Checks due today"
          items={checks.data.items}
          timeZone={site.timeZone}
          showSaw
          canRecord={canRecord}
          emptyText="No check is due at this site."
          footer={
            <Link
              to={`/sites/${site.id}/checks/overdue?state=pending`}
              className="font-semibold underline underline-offset-4"
            >
              {checks.data.total > checks.data.items.length
                ? `All ${checks.data.total} checks due and overdue`
                : 'Checks due and overdue at the site'}
            </Link>
          }
        />
      ) : checks.isError ? (
        <p role="alert">{checks.error.message}</p>
      ) : null}

      <FollowUpsPanel siteId={site.id} heading="Follow-ups at this site" hideWhenEmpty />

      <section aria-labelledby="running-heading" className="space-y-3">
        <h2 id="running-heading" className="text-lg font-bold text-ink">
          Running, with the blade on each
        </h2>
        {running.length === 0 && !saws.isPending ? (
          <p className="text-ink-muted">No saw is running.</p>
        ) : (
          <ul className="grid gap-3 lg:grid-cols-2">
            {running.map((saw) => (
              <SawCard key={saw.id} saw={saw} timeZone={site.timeZone} />
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
