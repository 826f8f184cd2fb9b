import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { FOLLOW_UP_FILTERS, type FollowUpListQuery } from '@kerfline/domain/follow-ups/schema';
import { followUpListQuery, parseFollowUpListQuery } from '../../../features/follow-ups/api/queries';
import { FollowUpStateBadge } from '../../../features/follow-ups/components/follow-up-state';
import { useAppAbility } from '../../../lib/ability';
import { Card } from '../../../lib/ui/card';
import { ExportButton } from '../../../lib/ui/export-button';
import { Pager } from '../../../lib/ui/pager';

const FILTER_LABELS: Record<(typeof FOLLOW_UP_FILTERS)[number], string> = {
  active: 'Not done',
  open: 'Open',
  in_progress: 'In progress',
  done: 'Done',
};

function listOf(search: URLSearchParams): FollowUpListQuery {
  const state = search.get('state');
  return parseFollowUpListQuery({
    state: state && (FOLLOW_UP_FILTERS as readonly string[]).includes(state) ? state : 'active',
    siteId: search.get('siteId') ?? undefined,
    sawId: search.get('sawId') ?? undefined,
    limit: 50,
    offset: search.get('offset') ?? 0,
  });
}

export function followUpsLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    await queryClient.ensureQueryData(followUpListQuery(listOf(new URL(request.url).searchParams)));
    return null;
  };
}

/** Every follow-up the reader may see, not-done ones first; done ones stay as the history. */
export function FollowUpsPage() {
  const [search, setSearch] = useSearchParams();
  const q = listOf(search);
  const { data } = useSuspenseQuery(followUpListQuery(q));
  const ability = useAppAbility();
  const exportParams = new URLSearchParams({
    ...(q.state ? { state: q.state } : {}),
    ...(q.siteId ? { siteId: q.siteId } : {}),
    ...(q.sawId ? { sawId: q.sawId } : {}),
  });
  return (
    <div className="space-y-6">
      <title>Follow-ups · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">Follow-ups</h1>
          <p className="mt-1 text-ink-muted">
            Work a regional lead asked a site to do about a saw, and what became of it.
          </p>
        </div>
        {ability.can('export', 'Site') ? <ExportButton path={`/follow-ups/export?${exportParams.toString()}`} /> : null}
      </div>
      <div role="group" aria-label="Show" className="flex flex-wrap gap-2">
        {FOLLOW_UP_FILTERS.map((f) => (
          <button
            key={f}
            type="button"
            aria-pressed={q.state === f}
            onClick={() => {
              const next = new URLSearchParams(search);
              next.set('state', f);
              next.delete('offset');
              setSearch(next);
            }}
            className={`min-h-11 rounded-sheet border px-3 text-sm font-semibold ${
              q.state === f
                ? 'border-accent bg-accent-soft text-accent-dark'
                : 'border-ink-muted bg-card text-ink hover:bg-paper-deep'
            }`}
          >
            {FILTER_LABELS[f]}
          </button>
        ))}
      </div>
      <Card className="p-4">
        {data.items.length === 0 ? (
          <p className="text-ink-muted">No follow-ups here.</p>
        ) : (
          <ul className="divide-y divide-rule">
            {data.items.map((f) => (
              <li key={f.id} className="flex flex-wrap items-center justify-between gap-3 py-3">
                <div className="min-w-0">
                  <Link
                    to={`/follow-ups/${f.id}`}
                    className="inline-flex min-h-11 items-center font-bold text-ink underline decoration-accent underline-offset-4 hover:text-accent-dark"
                  >
                    {f.title}
                  </Link>
                  <p className="text-sm text-ink-muted">
                    {f.sawAssetTag} {f.sawName} · {f.siteName} · for {f.assignee?.name ?? '—'} · due {f.dueOn}
                    {f.doneAt ? ` · done ${f.doneAt.slice(0, 10)}` : ''}
                  </p>
                </div>
                <FollowUpStateBadge state={f.state} overdue={f.overdue} />
              </li>
            ))}
          </ul>
        )}
        <div className="mt-3">
          <Pager total={data.total} limit={data.limit} offset={data.offset} noun="follow-ups" />
        </div>
      </Card>
    </div>
  );
}
