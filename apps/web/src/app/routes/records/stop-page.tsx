import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { STOP_CATEGORY_LABELS } from '@kerfline/domain/stops/schema';
import { stopDetailQuery } from '../../../features/stops/api/queries';
import { durationText } from '../../../features/stops/components/stops-table';
import { useRemoveStopEntry } from '../../../features/stops/api/mutations';
import { RemoveEntry } from '../../../features/removed-records/components/remove-entry';
import { useRefreshRemovedRecords } from '../../../features/removed-records/api/mutations';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { useAppAbility } from '../../../lib/ability';
import { formatDateTime } from '../../../lib/format';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { StatusMark } from '../../../lib/ui/status-mark';
import { RecordBreadcrumb, RecordHistoryCard } from './record-frame';
import { refreshAfterSawRecord, type ReturnNotice } from './refresh';

export function stopPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const stop = await queryClient.ensureQueryData(stopDetailQuery(params.stopId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(stop.siteId));
    return null;
  };
}

/** One stop of a saw: `/stops/:stopId` — what, when, how long, who, and its change history. */
export function StopPage() {
  const stopId = useParams().stopId ?? '';
  const { data: stop } = useSuspenseQuery(stopDetailQuery(stopId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(stop.siteId));
  const ability = useAppAbility();
  const canEnd = !stop.endedAt && ability.can('update', subject('Stop', { id: stop.id, siteId: stop.siteId }));
  const canRemove = ability.can('delete', subject('Stop', { id: stop.id, siteId: stop.siteId }));
  const removeStop = useRemoveStopEntry();
  const refreshRemoved = useRefreshRemovedRecords();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  return (
    <div className="space-y-6">
      <title>{`Stop on ${stop.sawAssetTag} · Kerfline`}</title>
      <RecordBreadcrumb site={site} saw={{ id: stop.sawId, assetTag: stop.sawAssetTag }} />
      <header className="space-y-2">
        {stop.endedAt ? <StatusMark shape="dash">Ended</StatusMark> : <StatusMark shape="block">Still down</StatusMark>}
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">
          Stopped: {STOP_CATEGORY_LABELS[stop.category].toLowerCase()}
        </h1>
        <p className="text-ink-muted">
          {stop.sawAssetTag} · {stop.planned ? 'planned' : 'unplanned'}
        </p>
      </header>
      {canEnd ? (
        <LinkButton to={`/saws/${stop.sawId}/stop-end`} variant="primary" className="min-h-12 text-base">
          End the stop
        </LinkButton>
      ) : null}
      <Card aria-label="The stop" className="px-4 py-3 sm:px-5">
        <dl className="divide-y divide-rule">
          {[
            ['Stopped', formatDateTime(stop.startedAt, site.timeZone, true)],
            ['Running again', stop.endedAt ? formatDateTime(stop.endedAt, site.timeZone, true) : 'Not yet'],
            ['Down for', durationText(stop.durationMin)],
            ['Logged by', stop.createdByName ?? 'Not recorded'],
            ['Notes', stop.notes ?? 'None'],
          ].map(([label, value]) => (
            <div key={label} className="py-2.5 sm:grid sm:grid-cols-[11rem_1fr] sm:gap-4">
              <dt className="text-sm text-ink-muted">{label}</dt>
              <dd className="tabular font-semibold break-words text-ink">{value}</dd>
            </div>
          ))}
        </dl>
      </Card>
      <RecordHistoryCard siteId={stop.siteId} entity="Stop" entityId={stop.id} timeZone={site.timeZone} />
      {canRemove ? (
        <RemoveEntry
          noun="stop"
          onRemove={async ({ reason }) => {
            await removeStop.mutateAsync({ stopId: stop.id, reason });
            await Promise.all([
              refreshAfterSawRecord(queryClient, { id: stop.sawId, siteId: stop.siteId }),
              refreshRemoved(),
            ]);
            const notice: ReturnNotice = {
              tone: 'info',
              title: 'The stop was removed.',
              lines: ['It is kept: the site’s admin or an administrator can put it back from Removed entries.'],
            };
            await navigate(`/saws/${stop.sawId}`, { state: { notice } });
          }}
        />
      ) : null}
    </div>
  );
}
