import { useQuery } from '@tanstack/react-query';
import type { UseFormRegisterReturn } from 'react-hook-form';
import type { FailureMode } from '@kerfline/domain/diagnosis/schema';
import type { RunDiagnosisOnWire } from '@kerfline/domain/blade-runs/wire';
import { ChoiceGroup, ChoiceTile } from '../../../lib/ui/choice-group';
import { Notice } from '../../../lib/ui/notice';
import { likelyCausesQuery } from '../api/queries';

/** What the ranking was fed, in words: the evidence from this saw's own records. */
export function evidenceWords(d: RunDiagnosisOnWire): string {
  const parts = [
    d.evidenceUsed.cutLogs === 0
      ? 'no cut logs of this blade'
      : `${d.evidenceUsed.cutLogs} cut log${d.evidenceUsed.cutLogs === 1 ? '' : 's'} of this blade`,
    d.evidenceUsed.breakInFollowed === null
      ? 'break-in not recorded'
      : d.evidenceUsed.breakInFollowed
        ? 'break-in followed'
        : 'break-in skipped',
    d.evidenceUsed.checks === 0 ? 'no checks recorded' : `${d.evidenceUsed.checks} checks`,
  ];
  return `Ranked by Kerfline from the failure and this saw’s records: ${parts.join(', ')}. The order says where to look first; it is not a finding.`;
}

/** One cause as a tile: its name, what to do, and the evidence that moved it. */
function CauseTile({
  cause,
  register,
}: {
  cause: RunDiagnosisOnWire['causes'][number];
  register: UseFormRegisterReturn;
}) {
  return (
    <ChoiceTile
      type="radio"
      value={cause.cause}
      label={cause.label}
      hint={
        <>
          {cause.advice}
          {cause.evidence.length > 0 ? (
            <span className="mt-1 block">
              {cause.evidence.map((line) => (
                <span key={line.text} className="block">
                  <span aria-hidden="true">{line.effect > 0 ? '▲ ' : '▽ '}</span>
                  <span className="sr-only">{line.effect > 0 ? 'For: ' : 'Against: '}</span>
                  {line.text}
                </span>
              ))}
            </span>
          ) : null}
        </>
      }
      {...register}
    />
  );
}

/**
 * The ranked likely causes of a failure on this run, from this saw's records, as choices to confirm one of (or
 * "not sure yet"). Shown as soon as a reason is chosen, before the blade is recorded as off.
 */
export function LikelyCausesChoice({
  runId,
  reason,
  register,
  error,
  offerUnsure = true,
}: {
  runId: string;
  reason: FailureMode;
  register: UseFormRegisterReturn;
  error?: string | undefined;
  /** Offer "not sure yet" (while taking the blade off; its own page asks for a cause). */
  offerUnsure?: boolean;
}) {
  const diagnosis = useQuery(likelyCausesQuery(runId, reason));
  if (diagnosis.isPending)
    return (
      <p role="status" className="text-sm text-ink-muted">
        Ranking the likely causes for this saw…
      </p>
    );
  if (diagnosis.isError)
    return (
      <Notice tone="caution" title="The likely causes could not be loaded">
        {diagnosis.error.message} You can still record the blade as off and confirm a cause later from its page.
      </Notice>
    );
  const d = diagnosis.data;
  if (d.causes.length === 0) return null;
  return (
    <ChoiceGroup
      legend={`Likely causes of ${d.modeLabel.toLowerCase()}, most likely first`}
      hint={evidenceWords(d)}
      error={error}
    >
      <ol className="space-y-2">
        {d.causes.map((cause) => (
          <li key={cause.cause}>
            <CauseTile cause={cause} register={register} />
          </li>
        ))}
        {offerUnsure ? (
          <li>
            <ChoiceTile
              type="radio"
              value=""
              label="Not sure yet"
              hint="Confirm a cause later from the blade’s page."
              {...register}
            />
          </li>
        ) : null}
      </ol>
    </ChoiceGroup>
  );
}
