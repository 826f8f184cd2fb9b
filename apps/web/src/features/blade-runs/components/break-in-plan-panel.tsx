import type { BreakInAdviceOnWire as BreakInAdvice } from '@kerfline/domain/blade-runs/wire';
import { MATERIAL_GROUP_LABELS } from '@kerfline/domain/band-speed/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatArea, formatNumber, formatQuantity, formatSpeedRange } from '../../../lib/format';
import { basisSentence } from '../../../lib/figure-basis';
import { Notice } from '../../../lib/ui/notice';

/**
 * The break-in plan for this saw, band and material, as the blade-on form shows it: the steps in order, the
 * material's band speed (and the part of it this saw reaches), and where every figure comes from.
 */
export function BreakInPlanPanel({
  advice,
  specName,
  system,
  timeZone,
}: {
  advice: BreakInAdvice;
  specName: string;
  system: UnitSystem;
  timeZone: string;
}) {
  const material = advice.materialGroup ? MATERIAL_GROUP_LABELS[advice.materialGroup] : null;
  const speed = advice.bandSpeed;
  return (
    <section aria-labelledby="break-in-heading" className="space-y-3 rounded-sheet border border-rule bg-paper p-4">
      <h3 id="break-in-heading" className="text-base font-bold text-ink">
        Break-in plan for {specName}
        {material ? ` cutting ${material}` : ''}
      </h3>
      {advice.warnings.length > 0 ? (
        <Notice tone="caution" title="Check the blade against this saw">
          <ul className="list-disc pl-5">
            {advice.warnings.map((w) => (
              <li key={w.code}>{w.message}</li>
            ))}
          </ul>
        </Notice>
      ) : null}
      <ol className="space-y-2">
        {advice.plan.steps.map((step, index) => (
          <li key={index} className="flex gap-3">
            <span
              aria-hidden="true"
              className="tabular flex size-7 shrink-0 items-center justify-center rounded-full border border-ink text-sm font-bold text-ink"
            >
              {index + 1}
            </span>
            <span className="text-sm text-ink">
              {step.note}
              {step.durationMin !== null || step.areaMm2 !== null ? (
                <span className="block text-ink-muted tabular">
                  {[
                    step.durationMin !== null ? `${formatNumber(step.durationMin, 1)} min` : null,
                    step.areaMm2 !== null ? `about ${formatArea(step.areaMm2, system)} of cut` : null,
                  ]
                    .filter(Boolean)
                    .join(' · ')}
                </span>
              ) : null}
            </span>
          </li>
        ))}
      </ol>
      {advice.plan.totalDurationMin !== null ? (
        <p className="text-sm text-ink">
          Normal feed after <strong className="tabular">{formatNumber(advice.plan.totalDurationMin, 1)} min</strong>
          {advice.plan.totalAreaMm2 !== null ? (
            <>
              {' '}
              (about <span className="tabular">{formatArea(advice.plan.totalAreaMm2, system)}</span> of cut)
            </>
          ) : null}
          .
        </p>
      ) : null}
      <p className="text-sm text-ink-muted">{advice.cuttingRateBasis}</p>
      {advice.normalCuttingRateMm2PerMin !== null ? (
        <p className="text-sm text-ink-muted">
          This saw’s usual cutting rate: {formatQuantity('areaRate', advice.normalCuttingRateMm2PerMin, system)}.
        </p>
      ) : null}
      {speed ? (
        <div className="space-y-1 border-t border-rule pt-3 text-sm">
          <p className="text-ink">
            Band speed for {material}:{' '}
            <strong className="tabular">
              {formatSpeedRange(speed.recommended.minMPerMin, speed.recommended.maxMPerMin, system)}
            </strong>
          </p>
          <p className="text-ink-muted">{basisSentence(speed.recommended.basis, timeZone)}.</p>
          {speed.recommended.corrections.length > 0 && speed.recommended.correctionBasis ? (
            <p className="text-ink-muted">
              Corrected {speed.recommended.corrections.map((c) => c.label).join('; ')} —{' '}
              {basisSentence(speed.recommended.correctionBasis, timeZone)}.
            </p>
          ) : null}
          {speed.reachableMPerMin ? (
            <p className="text-ink">
              This saw reaches{' '}
              <span className="tabular">
                {formatSpeedRange(speed.reachableMPerMin.minMPerMin, speed.reachableMPerMin.maxMPerMin, system)}
              </span>{' '}
              of it.
            </p>
          ) : (
            <p className="font-semibold text-signal-stop">This saw cannot run at that band speed.</p>
          )}
        </div>
      ) : (
        <p className="text-sm text-ink-muted">Choose the material it will cut first to see its band speeds.</p>
      )}
      <p className="text-sm text-ink-muted">Break-in steps: {basisSentence(advice.plan.basis, timeZone)}.</p>
    </section>
  );
}
