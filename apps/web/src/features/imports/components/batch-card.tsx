import { useState } from 'react';
import { subject } from '@casl/ability';
import { IMPORT_KIND_LABELS } from '@kerfline/domain/imports/fields';
import type { ImportBatch } from '@kerfline/domain/imports/schema';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { formatDateTime, formatNumber } from '../../../lib/format';
import { useUndoImport } from '../api/mutations';
import { rejectedRowsHref } from '../api/queries';
import { RowCounts } from './rows-report';
import { StateBadge } from './verdict-badge';

/**
 * One import: what it brought in, who and when, the rejected rows to download, and taking it back out (site
 * admins; confirmed first, refused by the server while later records depend on it).
 */
export function BatchCard({ batch, timeZone }: { batch: ImportBatch; timeZone: string }) {
  const ability = useAppAbility();
  const undo = useUndoImport(batch.id);
  const [confirming, setConfirming] = useState(false);
  const canUndo =
    batch.state === 'committed' &&
    ability.can('update', subject('ImportBatch', { id: batch.id, siteId: batch.siteId }));

  return (
    <Card className="space-y-4 p-4 sm:p-6">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <h2 className="text-xl font-bold break-words text-ink">{batch.fileName}</h2>
          <p className="text-sm text-ink-muted">
            {IMPORT_KIND_LABELS[batch.kind].title}
            {batch.sheet ? `, sheet “${batch.sheet}”` : ''} · brought in by {batch.createdByName ?? 'someone'} on{' '}
            {formatDateTime(batch.createdAt, timeZone, true)}
          </p>
        </div>
        <StateBadge state={batch.state} />
      </div>
      <RowCounts
        done
        counts={{
          rowsTotal: batch.rowsTotal,
          rowsValid: batch.rowsAdded,
          rowsPresent: batch.rowsPresent,
          rowsRepeated: batch.rowsRepeated,
          rowsRejected: batch.rowsRejected,
        }}
      />
      {batch.state === 'failed' ? (
        <Notice tone="stop" title="This import stopped before it finished">
          {batch.error} Nothing from it was written; bring the same file in again to retry.
        </Notice>
      ) : null}
      {batch.state === 'undone' ? (
        <Notice tone="info" title="Taken back out">
          The {formatNumber(batch.rowsAdded)} records it added were removed by {batch.undoneByName ?? 'someone'} on{' '}
          {batch.undoneAt ? formatDateTime(batch.undoneAt, timeZone, true) : ''}. This record of the import stays.
        </Notice>
      ) : null}
      <div className="flex flex-wrap gap-3">
        {batch.rowsRejected > 0 && batch.state !== 'failed' ? (
          <a
            className="inline-flex min-h-11 items-center rounded-sheet border border-ink-muted bg-card px-4 text-sm font-semibold text-ink hover:bg-paper-deep"
            href={rejectedRowsHref(batch.id)}
            download
          >
            Download the {formatNumber(batch.rowsRejected)} rows not brought in (CSV)
          </a>
        ) : null}
        {canUndo && !confirming ? (
          <Button variant="danger" onClick={() => setConfirming(true)}>
            Take this import back out
          </Button>
        ) : null}
      </div>
      {confirming ? (
        <Notice tone="caution" title={`Remove the ${formatNumber(batch.rowsAdded)} records this import added?`}>
          <p>
            Everything else stays as it is, and this record of the import is kept. Kerfline refuses if later records
            depend on them.
          </p>
          <div className="mt-3 flex flex-wrap gap-3">
            <Button
              variant="danger"
              disabled={undo.isPending}
              onClick={() => undo.mutate(undefined, { onSettled: () => setConfirming(false) })}
            >
              {undo.isPending ? 'Taking it out…' : 'Yes, take it out'}
            </Button>
            <Button onClick={() => setConfirming(false)}>Keep it</Button>
          </div>
        </Notice>
      ) : null}
      {undo.isError ? (
        <Notice
          tone="stop"
          title={isApiError(undo.error, 409) ? 'The import was not taken out' : 'Taking the import out failed'}
        >
          {undo.error.message}
          {isApiError(undo.error) && undo.error.details.length > 3 ? (
            <ul className="mt-2 list-disc pl-5">
              {undo.error.details.map((d, i) => (
                <li key={i}>{d.message}</li>
              ))}
            </ul>
          ) : null}
        </Notice>
      ) : null}
    </Card>
  );
}
