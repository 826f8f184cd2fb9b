import { useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import {
  REMOVABLE_SUBJECT_LABELS,
  REMOVABLE_SUBJECTS,
  type RemovableSubject,
  type RemovedRecord,
  type RestoredRecord,
} from '@kerfline/domain/removed-records/schema';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { parseRemovedRecordListQuery, removedRecordListQuery } from '../../../features/removed-records/api/queries';
import { usePutBack } from '../../../features/removed-records/api/mutations';
import { offsetOf, searchValue, TABLE_PAGE_SIZE } from '../../../lib/list-search';
import { formatDateTime } from '../../../lib/format';
import { forPeople } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { FilterBar, FilterSelect } from '../../../lib/ui/filters';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { refreshAfterSawRecord } from '../records/refresh';
import { SiteRecordsNav } from './site-records-nav';
import { useTableUrl } from './table-url';

function removedQueryOf(siteId: string, search: URLSearchParams) {
  const kind = searchValue(search, 'kind');
  return parseRemovedRecordListQuery({
    siteId,
    subject: kind && (REMOVABLE_SUBJECTS as readonly string[]).includes(kind) ? kind : undefined,
    limit: TABLE_PAGE_SIZE,
    offset: offsetOf(search),
  });
}

export function siteRemovedPageLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const siteId = params.siteId ?? '';
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(siteId)),
      queryClient.ensureQueryData(removedRecordListQuery(removedQueryOf(siteId, search))),
    ]);
    return null;
  };
}

/** Where a record put back can be seen again: runs and stops have their own page; the rest show on the saw. */
function hrefOf(restored: { subject: RemovableSubject; recordId: string; sawId: string | null }): string | null {
  if (restored.subject === 'BladeRun') return `/blade-runs/${restored.recordId}`;
  if (restored.subject === 'Stop') return `/stops/${restored.recordId}`;
  return restored.sawId ? `/saws/${restored.sawId}` : null;
}

function RemovedItem({
  record,
  timeZone,
  onPutBack,
}: {
  record: RemovedRecord;
  timeZone: string;
  onPutBack: (record: RemovedRecord) => Promise<string | null>;
}) {
  const [refusal, setRefusal] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const happened = record.endedAt
    ? `${formatDateTime(record.occurredAt, timeZone)} to ${formatDateTime(record.endedAt, timeZone)}`
    : formatDateTime(record.occurredAt, timeZone);
  const rows: [string, React.ReactNode][] = [
    [
      'Saw',
      record.sawId ? (
        <Link to={`/saws/${record.sawId}`} className="underline decoration-accent decoration-2 underline-offset-4">
          {record.sawAssetTag}
        </Link>
      ) : (
        'None'
      ),
    ],
    [record.subject === 'Photo' ? 'Added' : 'Happened', happened],
    [
      'Removed',
      `${formatDateTime(record.removedAt, timeZone)} by ${record.removedByName ?? 'someone no longer named'}`,
    ],
    ['Why', record.reason],
  ];
  if (record.photoCount > 0)
    rows.push(['Photos', `${record.photoCount} ${record.photoCount === 1 ? 'comes' : 'come'} back with it`]);
  return (
    <li className="space-y-3 px-4 py-4 sm:px-5">
      <div>
        <p className="text-sm font-semibold text-ink-muted">{REMOVABLE_SUBJECT_LABELS[record.subject]}</p>
        <h2 className="text-lg font-bold break-words text-ink">{record.what}</h2>
      </div>
      <dl className="grid gap-x-4 gap-y-1 sm:grid-cols-[8rem_1fr]">
        {rows.map(([label, value]) => (
          <div key={label} className="contents">
            <dt className="text-sm text-ink-muted">{label}</dt>
            <dd className="tabular mb-1 font-semibold break-words text-ink sm:mb-0">{value}</dd>
          </div>
        ))}
      </dl>
      {refusal ? <Notice title="It cannot go back yet">{refusal}</Notice> : null}
      <Button
        disabled={busy}
        onClick={() => {
          setBusy(true);
          setRefusal(null);
          void onPutBack(record).then((message) => {
            setRefusal(message);
            setBusy(false);
          });
        }}
        aria-label={`Put back: ${REMOVABLE_SUBJECT_LABELS[record.subject]}, ${record.what}`}
      >
        {busy ? 'Putting back…' : 'Put back'}
      </Button>
    </li>
  );
}

/**
 * The entries removed at a site: `/sites/:siteId/removed` (its admins and administrators) — what each was, on which
 * saw, when it was removed, by whom and why, and "Put back". A record that no longer fits (a newer entry overlaps
 * it, its saw is retired…) stays here, and the server's words say what is in the way.
 */
export function SiteRemovedPage() {
  const siteId = useParams().siteId ?? '';
  const { data: site } = useSuspenseQuery(siteDetailQuery(siteId));
  const { search, setFilters, busy } = useTableUrl('');
  const q = removedQueryOf(siteId, search);
  const { data: removed } = useSuspenseQuery(removedRecordListQuery(q));
  const putBack = usePutBack();
  const queryClient = useQueryClient();
  const [restored, setRestored] = useState<(RestoredRecord & { what: string }) | null>(null);

  const onPutBack = async (record: RemovedRecord): Promise<string | null> => {
    try {
      const back = await putBack.mutateAsync(record.id);
      if (back.sawId) await refreshAfterSawRecord(queryClient, { id: back.sawId, siteId: back.siteId });
      setRestored({ ...back, what: `${REMOVABLE_SUBJECT_LABELS[record.subject]}: ${record.what}` });
      return null;
    } catch (error) {
      return error instanceof Error ? forPeople(error.message) : 'It could not be put back; try again.';
    }
  };
  const restoredHref = restored ? hrefOf(restored) : null;

  return (
    <div className="space-y-5">
      <title>{`Removed entries · ${site.name} · Kerfline`}</title>
      <p className="text-sm text-ink-muted">{site.name}</p>
      <SiteRecordsNav siteId={site.id} />
      {restored ? (
        <Notice tone="info" title="Put back.">
          {restored.what} is in the records again.{' '}
          {restoredHref ? (
            <Link to={restoredHref} className="font-semibold underline underline-offset-4">
              See it
            </Link>
          ) : null}
        </Notice>
      ) : null}
      <Card aria-labelledby="removed-heading" aria-busy={busy}>
        <div className="border-b border-rule px-4 py-3 sm:px-5">
          <h1 id="removed-heading" className="text-2xl font-extrabold tracking-tight text-ink">
            Removed entries
          </h1>
          <p className="text-sm text-ink-muted">
            Entries taken out to correct a mistake, kept with who removed them and why. Put one back and it returns as
            it was, with its photos. Times on the site’s clock.
          </p>
        </div>
        <div className="border-b border-rule px-4 py-3 sm:px-5">
          <FilterBar>
            <FilterSelect
              label="Kind of entry"
              value={q.subject ?? ''}
              options={REMOVABLE_SUBJECTS.map((value) => ({ value, label: REMOVABLE_SUBJECT_LABELS[value] }))}
              onChange={(value) => setFilters({ kind: value })}
              allLabel="Every kind"
            />
          </FilterBar>
        </div>
        {removed.items.length === 0 ? (
          <p className="px-4 py-6 text-ink-muted sm:px-5">Nothing removed{q.subject ? ' of this kind' : ''}.</p>
        ) : (
          <ul className={`divide-y divide-rule ${busy ? 'opacity-60' : ''}`}>
            {removed.items.map((record) => (
              <RemovedItem key={record.id} record={record} timeZone={site.timeZone} onPutBack={onPutBack} />
            ))}
          </ul>
        )}
        <div className="border-t border-rule px-4 py-3 sm:px-5">
          <Pager total={removed.total} limit={removed.limit} offset={removed.offset} noun="entries" />
        </div>
      </Card>
    </div>
  );
}
