import { FOLLOW_UP_STATE_LABELS, type FollowUpState } from '@kerfline/domain/follow-ups/schema';

/**
 * A follow-up's state in a word and a shape: open is a triangle (needs attention), in progress a half-filled
 * circle, done a filled circle; overdue adds its own word.
 */
export function FollowUpStateBadge({ state, overdue }: { state: FollowUpState; overdue?: boolean }) {
  const styles: Record<FollowUpState, string> = {
    open: 'border-signal-caution bg-signal-caution-soft text-ink',
    in_progress: 'border-signal-info bg-signal-info-soft text-signal-info',
    done: 'border-signal-safe bg-signal-safe-soft text-signal-safe',
  };
  const mark = state === 'open' ? '▲' : state === 'in_progress' ? '◐' : '●';
  return (
    <span className="inline-flex flex-wrap items-center gap-1">
      <span
        className={`inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-bold ${styles[state]}`}
      >
        <span aria-hidden="true">{mark}</span>
        {FOLLOW_UP_STATE_LABELS[state]}
      </span>
      {overdue ? (
        <span className="inline-flex items-center gap-1 rounded border border-signal-stop bg-signal-stop-soft px-1.5 py-0.5 text-xs font-bold text-signal-stop">
          <span aria-hidden="true">■</span>Overdue
        </span>
      ) : null}
    </span>
  );
}
