import type { BladeRun } from '@kerfline/domain/blade-runs/schema';
import { Button } from '../../../lib/ui/button';
import { useUpdateBladeRun } from '../api/mutations';

/**
 * One tap to record whether the blade on the saw was broken in, for a run put on before the break-in was done.
 * Skipped break-ins are among the first things the likely causes look at.
 */
export function BreakInAnswer({ run, onSaved }: { run: BladeRun; onSaved?: () => void }) {
  const update = useUpdateBladeRun();
  if (run.breakInFollowed !== null) return null;
  const answer = (followed: boolean) =>
    update.mutate({ runId: run.id, input: { breakInFollowed: followed } }, { onSuccess: () => onSaved?.() });
  return (
    <div className="rounded-sheet border border-rule bg-paper p-3">
      <p className="font-semibold text-ink">Was this blade broken in as planned?</p>
      {update.isError ? <p className="text-sm font-semibold text-signal-stop">{update.error.message}</p> : null}
      <div className="mt-2 grid grid-cols-2 gap-2 sm:flex">
        <Button onClick={() => answer(true)} disabled={update.isPending}>
          Yes, followed
        </Button>
        <Button onClick={() => answer(false)} disabled={update.isPending}>
          No, skipped
        </Button>
      </div>
    </div>
  );
}
