import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import { REMOVAL_REASON_LABELS } from '@kerfline/domain/diagnosis/schema';
import { bladeRunDetailQuery } from '../../../features/blade-runs/api/queries';
import { RunDetail } from '../../../features/blade-runs/components/run-detail';
import { RunPhotos } from '../../../features/blade-runs/components/run-photos';
import { AddPhotos } from '../../../features/blade-runs/components/add-photos';
import { ConfirmCauseForm } from '../../../features/blade-runs/components/confirm-cause-form';
import { BreakInAnswer } from '../../../features/blade-runs/components/break-in-answer';
import { useRemoveRunEntry, useRemoveRunPhoto } from '../../../features/blade-runs/api/mutations';
import { RemoveEntry } from '../../../features/removed-records/components/remove-entry';
import { useRefreshRemovedRecords } from '../../../features/removed-records/api/mutations';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { useAppAbility } from '../../../lib/ability';
import { StatusMark } from '../../../lib/ui/status-mark';
import { RecordBreadcrumb, RecordHistoryCard, Section } from './record-frame';
import { refreshAfterSawRecord, type ReturnNotice } from './refresh';

export function bladeRunPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const run = await queryClient.ensureQueryData(bladeRunDetailQuery(params.runId ?? ''));
    await queryClient.ensureQueryData(siteDetailQuery(run.siteId));
    return null;
  };
}

/** One blade's life on its saw: `/blade-runs/:runId` — details, likely causes, photos and change history. */
export function BladeRunPage() {
  const runId = useParams().runId ?? '';
  const queryClient = useQueryClient();
  const { data: run } = useSuspenseQuery(bladeRunDetailQuery(runId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(run.siteId));
  const ability = useAppAbility();
  const canUpdate = ability.can('update', subject('BladeRun', { id: run.id, siteId: run.siteId }));
  const canAddPhoto = ability.can('create', subject('Photo', { id: '', siteId: run.siteId }));
  const canRemove = ability.can('delete', subject('BladeRun', { id: run.id, siteId: run.siteId }));
  const canRemovePhoto = ability.can('delete', subject('Photo', { id: '', siteId: run.siteId }));
  const removeRun = useRemoveRunEntry();
  const removePhoto = useRemoveRunPhoto();
  const refreshRemoved = useRefreshRemovedRecords();
  const navigate = useNavigate();
  const saw = { id: run.sawId, siteId: run.siteId };
  return (
    <div className="space-y-6">
      <title>{`${run.bladeSpecName} on ${run.sawAssetTag} · Kerfline`}</title>
      <RecordBreadcrumb site={site} saw={{ id: run.sawId, assetTag: run.sawAssetTag }} />
      <header className="space-y-2">
        {run.removedAt ? (
          <StatusMark shape={run.removalReason === 'worn_out' ? 'dash' : 'triangle'}>
            Off: {run.removalReason ? REMOVAL_REASON_LABELS[run.removalReason] : 'reason not recorded'}
          </StatusMark>
        ) : (
          <StatusMark shape="circle">On the saw</StatusMark>
        )}
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">{run.bladeSpecName}</h1>
        <p className="text-ink-muted">Blade run on {run.sawAssetTag}</p>
      </header>
      {canUpdate ? <BreakInAnswer run={run} onSaved={() => void refreshAfterSawRecord(queryClient, saw)} /> : null}
      <RunDetail run={run} system={site.unitSystem} timeZone={site.timeZone} />
      {run.removedAt && run.removalReason && run.removalReason !== 'other' && canUpdate ? (
        <Section title="Likely causes">
          <ConfirmCauseForm
            runId={run.id}
            reason={run.removalReason}
            current={run.confirmedCause}
            onSaved={() => void refreshAfterSawRecord(queryClient, saw)}
          />
        </Section>
      ) : null}
      <Section title="Photos">
        <RunPhotos
          runId={run.id}
          actions={
            canRemovePhoto
              ? (photo) => (
                  <RemoveEntry
                    compact
                    noun="photo"
                    onRemove={async ({ reason }) => {
                      await removePhoto.mutateAsync({ runId: run.id, photoId: photo.id, reason });
                      await refreshRemoved();
                    }}
                  />
                )
              : undefined
          }
        />
        {canAddPhoto ? <AddPhotos runId={run.id} /> : null}
      </Section>
      <RecordHistoryCard siteId={run.siteId} entity="BladeRun" entityId={run.id} timeZone={site.timeZone} />
      {canRemove ? (
        <RemoveEntry
          noun="blade run"
          goesWith={
            run.photoCount > 0
              ? `Its ${run.photoCount === 1 ? 'photo goes' : `${run.photoCount} photos go`} with it; its cut logs stay.`
              : 'Its cut logs stay.'
          }
          onRemove={async ({ reason }) => {
            await removeRun.mutateAsync({ runId: run.id, reason });
            await Promise.all([refreshAfterSawRecord(queryClient, saw), refreshRemoved()]);
            const notice: ReturnNotice = {
              tone: 'info',
              title: `The blade run of ${run.bladeSpecName} was removed.`,
              lines: ['It is kept: the site’s admin or an administrator can put it back from Removed entries.'],
            };
            await navigate(`/saws/${run.sawId}`, { state: { notice } });
          }}
        />
      ) : null}
    </div>
  );
}
