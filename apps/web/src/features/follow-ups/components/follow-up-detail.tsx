import { useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import {
  FOLLOW_UP_STATES,
  FOLLOW_UP_STATE_LABELS,
  type FollowUp,
  type FollowUpState,
  type FollowUpUpdate,
} from '@kerfline/domain/follow-ups/schema';
import { PEER_METRIC_INFO } from '@kerfline/domain/outliers/peer-review';
import { periodLabel } from '@kerfline/domain/fleet/period';
import { useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { followUpAssigneesQuery } from '../api/queries';
import { useUpdateFollowUp } from '../api/mutations';
import { FollowUpStateBadge } from './follow-up-state';

/** A follow-up in full: what the flag said, who and when, every change and note, and the controls the reader may use. */
export function FollowUpDetail({
  followUp,
  timeZone,
  flagValue,
}: {
  followUp: FollowUp;
  timeZone: string;
  flagValue?: (f: NonNullable<FollowUp['flag']>) => string;
}) {
  const ability = useAppAbility();
  const asSubject = subject('FollowUp', { id: followUp.id, siteId: followUp.siteId });
  const can = (field: string) => ability.can('update', asSubject, field);
  const update = useUpdateFollowUp(followUp.id);
  const assignees = useQuery({ ...followUpAssigneesQuery(followUp.siteId), enabled: can('assigneeId') });
  const [state, setState] = useState<FollowUpState>(followUp.state);
  const [assigneeId, setAssigneeId] = useState(followUp.assignee?.id ?? '');
  const [dueOn, setDueOn] = useState(followUp.dueOn);
  const [note, setNote] = useState('');

  const patch: FollowUpUpdate = {
    ...(state !== followUp.state ? { state } : {}),
    ...(assigneeId && assigneeId !== followUp.assignee?.id ? { assigneeId } : {}),
    ...(dueOn !== followUp.dueOn ? { dueOn } : {}),
    ...(note.trim() ? { note } : {}),
  };
  const changed = Object.keys(patch).length > 0;

  return (
    <div className="grid gap-6 lg:grid-cols-3">
      <div className="space-y-6 lg:col-span-2">
        <Card className="p-4">
          <div className="flex flex-wrap items-start justify-between gap-2">
            <p className="text-ink-muted">
              <Link
                to={`/saws/${followUp.sawId}`}
                className="font-semibold text-ink underline decoration-accent underline-offset-4"
              >
                {followUp.sawAssetTag} {followUp.sawName}
              </Link>{' '}
              at {followUp.siteName}
            </p>
            <FollowUpStateBadge state={followUp.state} overdue={followUp.overdue} />
          </div>
          <dl className="mt-3 grid gap-3 sm:grid-cols-3">
            <div>
              <dt className="text-sm font-semibold text-ink-muted">For</dt>
              <dd>{followUp.assignee?.name ?? '—'}</dd>
            </div>
            <div>
              <dt className="text-sm font-semibold text-ink-muted">Due</dt>
              <dd className="tabular">{followUp.dueOn}</dd>
            </div>
            <div>
              <dt className="text-sm font-semibold text-ink-muted">Opened by</dt>
              <dd>
                {followUp.createdBy?.name ?? '—'}, {formatDateTime(followUp.createdAt, timeZone)}
              </dd>
            </div>
          </dl>
          {followUp.flag ? (
            <div className="mt-4 rounded-sheet border-l-4 border-signal-caution-bg bg-signal-caution-soft p-3 text-sm">
              <p className="font-bold">
                <span aria-hidden="true">▲ </span>
                From the flag on {PEER_METRIC_INFO[followUp.flag.metric].label.toLowerCase()},{' '}
                {periodLabel(followUp.flag.period)}
              </p>
              {flagValue ? <p className="mt-1">{flagValue(followUp.flag)}</p> : null}
              <p className="mt-1 text-ink-muted">{followUp.flag.method}</p>
            </div>
          ) : null}
        </Card>
        <Card className="p-4">
          <h2 className="text-lg font-bold text-ink">History</h2>
          <ol className="mt-3 space-y-3 border-l-2 border-rule pl-4">
            {followUp.entries.map((e) => (
              <li key={e.id}>
                <p className="text-sm text-ink-muted">
                  {formatDateTime(e.at, timeZone)} · {e.by?.name ?? 'someone'}
                </p>
                <p className={e.kind === 'note' ? 'whitespace-pre-line text-ink' : 'font-semibold text-ink'}>
                  {e.text}
                </p>
              </li>
            ))}
          </ol>
        </Card>
      </div>
      {can('state') || can('note') ? (
        <Card className="h-fit space-y-4 p-4">
          <h2 className="text-lg font-bold text-ink">Move it along</h2>
          {can('state') ? (
            <Field label="State">
              {(props) => (
                <select
                  {...props}
                  value={state}
                  onChange={(e) => setState(e.target.value as FollowUpState)}
                  className={inputClass}
                >
                  {FOLLOW_UP_STATES.map((s) => (
                    <option key={s} value={s}>
                      {FOLLOW_UP_STATE_LABELS[s]}
                    </option>
                  ))}
                </select>
              )}
            </Field>
          ) : null}
          {can('assigneeId') ? (
            <Field label="For">
              {(props) => (
                <select
                  {...props}
                  value={assigneeId}
                  onChange={(e) => setAssigneeId(e.target.value)}
                  className={inputClass}
                >
                  {(assignees.data ?? (followUp.assignee ? [{ ...followUp.assignee, role: '' }] : [])).map((p) => (
                    <option key={p.id} value={p.id}>
                      {p.name}
                    </option>
                  ))}
                </select>
              )}
            </Field>
          ) : null}
          {can('dueOn') ? (
            <Field label="Due by">
              {(props) => (
                <input
                  {...props}
                  type="date"
                  value={dueOn}
                  onChange={(e) => setDueOn(e.target.value)}
                  className={inputClass}
                />
              )}
            </Field>
          ) : null}
          {can('note') ? (
            <Field label="Add a note">
              {(props) => (
                <textarea
                  {...props}
                  value={note}
                  onChange={(e) => setNote(e.target.value)}
                  rows={3}
                  className="w-full rounded-sheet border border-ink-muted bg-card px-3 py-2 text-base"
                />
              )}
            </Field>
          ) : null}
          {update.isError ? (
            <Notice title="Not saved">{isApiError(update.error) ? update.error.message : 'Try again.'}</Notice>
          ) : null}
          <Button
            variant="primary"
            disabled={!changed || update.isPending}
            onClick={() => update.mutate(patch, { onSuccess: () => setNote('') })}
          >
            {update.isPending ? 'Saving…' : 'Save'}
          </Button>
        </Card>
      ) : null}
    </div>
  );
}
