import { useState } from 'react';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { subject } from '@casl/ability';
import type { CheckRecord } from '@kerfline/domain/site-checks/schema';
import { useAppAbility } from '../../../lib/ability';
import { Button, LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { sawChecksQuery } from '../../../features/checks/api/queries';
import { useRecordCheck, useRemoveCheckRecord } from '../../../features/checks/api/mutations';
import { RemoveEntry } from '../../../features/removed-records/components/remove-entry';
import { useRefreshRemovedRecords } from '../../../features/removed-records/api/mutations';
import { RecordCheckForm, RecordedResult } from '../../../features/checks/components/record-check-form';

export function recordCheckPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(saw.siteId)),
      queryClient.ensureQueryData(sawChecksQuery(saw.id)),
    ]);
    return null;
  };
}

/** Recording a check on one saw, phone first: one task on the screen, the saw on top. */
export function RecordCheckPage() {
  const sawId = useParams().sawId ?? '';
  const [search] = useSearchParams();
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const { data: checks } = useSuspenseQuery(sawChecksQuery(saw.id));
  const ability = useAppAbility();
  const record = useRecordCheck(saw.id, saw.siteId);
  const [saved, setSaved] = useState<{ record: CheckRecord; photoError: string | null } | null>(null);
  const [round, setRound] = useState(0);
  const removeRecord = useRemoveCheckRecord(saw.id, saw.siteId);
  const [removedNote, setRemovedNote] = useState(false);
  const refreshRemoved = useRefreshRemovedRecords();
  const canRemove = ability.can('delete', subject('CheckRecord', { id: '', siteId: saw.siteId }));
  const canRecord =
    saw.status !== 'retired' && ability.can('create', subject('CheckRecord', { id: '', siteId: saw.siteId }));

  return (
    <div className="mx-auto max-w-3xl space-y-5">
      <title>{`Record a check · ${saw.assetTag} · Kerfline`}</title>
      <header className="space-y-1">
        <Link
          to={`/saws/${saw.id}`}
          className="inline-flex min-h-11 items-center text-sm text-ink-muted underline-offset-4 hover:underline"
        >
          ← {saw.assetTag} · {saw.name}
        </Link>
        <h1 className="text-2xl font-extrabold tracking-tight text-ink sm:text-3xl">Record a check</h1>
        <p className="text-sm text-ink-muted">
          {checks.bladeSpecName ? `Blade on the saw: ${checks.bladeSpecName}.` : 'No blade is recorded on this saw.'}
        </p>
      </header>
      {!canRecord ? (
        <Notice tone="info" title="You can read this saw’s checks but not record them">
          Technicians and site admins of {site.name} record checks here.
        </Notice>
      ) : saved ? (
        <div className="space-y-4">
          <RecordedResult
            record={saved.record}
            system={site.unitSystem}
            timeZone={site.timeZone}
            photoError={saved.photoError}
          />
          <div className="flex flex-wrap gap-2">
            <Button
              variant="primary"
              className="min-h-14 max-sm:w-full"
              onClick={() => {
                setSaved(null);
                setRound((n) => n + 1);
              }}
            >
              Record another check
            </Button>
            <LinkButton to={`/saws/${saw.id}`} className="min-h-14 max-sm:w-full">
              Back to {saw.assetTag}
            </LinkButton>
          </div>
          {canRemove ? (
            <RemoveEntry
              noun="recorded check"
              goesWith="Its photo goes with it, and the check is due again if it was due before."
              onRemove={async ({ reason }) => {
                await removeRecord.mutateAsync({ recordId: saved.record.id, reason });
                await refreshRemoved();
                setSaved(null);
                setRemovedNote(true);
                setRound((n) => n + 1);
              }}
            />
          ) : null}
        </div>
      ) : (
        <>
          {removedNote ? (
            <Notice tone="info" title="The recorded check was removed.">
              It is kept: the site’s admin or an administrator can put it back from Removed entries.
            </Notice>
          ) : null}
          <RecordCheckForm
            key={round}
            sawId={saw.id}
            checks={checks.items}
            system={site.unitSystem}
            timeZone={site.timeZone}
            askedCheckId={round === 0 ? search.get('check') : null}
            onSave={async (input, photo) => {
              setRemovedNote(false);
              setSaved(await record.mutateAsync({ input, photo }));
            }}
          />
        </>
      )}
    </div>
  );
}
