import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { subject } from '@casl/ability';
import type { FollowUp, FollowUpUpdate } from '@kerfline/domain/follow-ups/schema';
import { useAppAbility } from '../../../lib/ability';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { followUpListQuery, parseFollowUpListQuery } from '../api/queries';
import { useUpdateFollowUp } from '../api/mutations';
import { FollowUpStateBadge } from './follow-up-state';

/** One follow-up with the next step as a big button, and a note field, for whoever may move it along. */
function FollowUpItem({ followUp, showSaw }: { followUp: FollowUp; showSaw: boolean }) {
  const ability = useAppAbility();
  const update = useUpdateFollowUp(followUp.id);
  const [noting, setNoting] = useState(false);
  const [note, setNote] = useState('');
  const noteId = useId();
  const asSubject = subject('FollowUp', { id: followUp.id, siteId: followUp.siteId });
  const canMove = ability.can('update', asSubject, 'state');
  const canNote = ability.can('update', asSubject, 'note');
  const send = (patch: FollowUpUpdate) =>
    update.mutate(patch, {
      onSuccess: () => {
        setNote('');
        setNoting(false);
      },
    });
  const next =
    followUp.state === 'open'
      ? { state: 'in_progress' as const, label: 'Start' }
      : { state: 'done' as const, label: 'Mark done' };

  return (
    <li className="rounded-sheet border border-rule bg-card p-3">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <p className="font-bold text-ink">
            {showSaw ? (
              <span className="mr-1 rounded border border-rule px-1 text-xs tracking-wider">
                {followUp.sawAssetTag}
              </span>
            ) : null}
            {followUp.title}
          </p>
          <p className="mt-0.5 text-sm text-ink-muted">
            For {followUp.assignee?.name ?? 'someone no longer listed'} · due {followUp.dueOn} · from{' '}
            {followUp.createdBy?.name ?? 'someone'}
          </p>
        </div>
        <FollowUpStateBadge state={followUp.state} overdue={followUp.overdue} />
      </div>
      {canMove || canNote ? (
        <div className="mt-3 flex flex-wrap gap-2">
          {canMove ? (
            <Button variant="primary" disabled={update.isPending} onClick={() => send({ state: next.state })}>
              {next.label}
            </Button>
          ) : null}
          {canMove && followUp.state === 'open' ? (
            <Button disabled={update.isPending} onClick={() => send({ state: 'done' })}>
              Mark done
            </Button>
          ) : null}
          {canNote ? (
            <Button variant="quiet" aria-expanded={noting} onClick={() => setNoting((v) => !v)}>
              Add a note
            </Button>
          ) : null}
          <Link
            to={`/follow-ups/${followUp.id}`}
            className="inline-flex min-h-11 items-center px-2 text-sm font-semibold underline decoration-accent underline-offset-4"
          >
            History
          </Link>
        </div>
      ) : (
        <Link
          to={`/follow-ups/${followUp.id}`}
          className="mt-2 inline-flex min-h-11 items-center text-sm font-semibold underline decoration-accent underline-offset-4"
        >
          Details and history
        </Link>
      )}
      {noting ? (
        <form
          className="mt-3 space-y-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (note.trim()) send({ note });
          }}
        >
          <label htmlFor={noteId} className="block text-sm font-semibold text-ink">
            Note
          </label>
          <textarea
            id={noteId}
            value={note}
            onChange={(e) => setNote(e.target.value)}
            rows={3}
            maxLength={2000}
            className="w-full rounded-sheet border border-ink-muted bg-card px-3 py-2 text-base"
          />
          <Button type="submit" variant="primary" disabled={update.isPending || note.trim() === ''}>
            Save the note
          </Button>
        </form>
      ) : null}
      {update.isError ? (
        <p role="alert" className="mt-2 text-sm font-semibold text-signal-stop">
          {isApiError(update.error) ? update.error.message : 'That did not save. Try again.'}
        </p>
      ) : null}
    </li>
  );
}

/**
 * The follow-ups a regional lead opened that are not done yet, for a saw (its page) or a site (the start screen),
 * with the next step one tap away. Done ones stay in the history, a link away.
 */
export function FollowUpsPanel({
  sawId,
  siteId,
  heading = 'Follow-ups',
  hideWhenEmpty = false,
}: {
  sawId?: string;
  siteId?: string;
  heading?: string;
  /** Show nothing at all while there is nothing open and no history (a saw's page, the start screen). */
  hideWhenEmpty?: boolean;
}) {
  const active = useQuery(followUpListQuery(parseFollowUpListQuery({ sawId, siteId, state: 'active', limit: 20 })));
  const done = useQuery(followUpListQuery(parseFollowUpListQuery({ sawId, siteId, state: 'done', limit: 1 })));
  if (hideWhenEmpty && active.data?.total === 0 && done.data?.total === 0) return null;
  const historyQuery = new URLSearchParams({
    ...(sawId ? { sawId } : {}),
    ...(siteId ? { siteId } : {}),
    state: 'done',
  });
  return (
    <Card className="p-4" aria-label={heading}>
      <h2 className="text-lg font-bold text-ink">{heading}</h2>
      {active.isPending ? (
        <p role="status" className="mt-2 text-ink-muted">
          Loading the follow-ups…
        </p>
      ) : active.isError ? (
        <div className="mt-2">
          <Notice title="The follow-ups could not be loaded">{active.error.message}</Notice>
        </div>
      ) : active.data.items.length === 0 ? (
        <p className="mt-2 text-ink-muted">Nothing to follow up.</p>
      ) : (
        <ul className="mt-3 space-y-3">
          {active.data.items.map((f) => (
            <FollowUpItem key={f.id} followUp={f} showSaw={!sawId} />
          ))}
        </ul>
      )}
      {done.data && done.data.total > 0 ? (
        <Link
          to={`/follow-ups?${historyQuery.toString()}`}
          className="mt-3 inline-flex min-h-11 items-center text-sm font-semibold underline decoration-accent underline-offset-4"
        >
          {done.data.total} done follow-up{done.data.total === 1 ? '' : 's'} in the history
        </Link>
      ) : null}
    </Card>
  );
}
