import { planBreakIn, type BreakInPlan } from '@kerfline/domain/break-in/break-in-plan';
import { breakInPlanRequestSchema, type BreakInMode } from '@kerfline/domain/break-in/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readQuantity, type Entry } from './quantities';
import { compute, hasErrors, placeIssues, take } from './readings';
import type { FieldErrors } from './use-entries';

export type BreakInKey = 'mode' | 'rate';

export interface BreakInEvaluation {
  errors: FieldErrors<BreakInKey>;
  formError: string | null;
  plan: BreakInPlan | null;
}

export function breakInMode(entry: Entry): BreakInMode {
  return entry.text === 'area' ? 'area' : 'time';
}

/**
 * The break-in plan with the domain's default steps, measured in minutes or in area cut; a normal cutting rate
 * (typed in cm²/min or in²/min, handed over in mm²/min) fills in the other measure of each step.
 */
export function evaluateBreakIn(entries: Record<BreakInKey, Entry>, system: UnitSystem): BreakInEvaluation {
  const errors: FieldErrors<BreakInKey> = {};
  const rateReading = readQuantity(entries.rate, 'areaRate');
  const rate = take(rateReading, 'rate', 'Normal cutting rate', errors, false);
  const parsed = breakInPlanRequestSchema.safeParse({
    settings: { mode: breakInMode(entries.mode) },
    normalCuttingRateMm2PerMin: rate ?? null,
  });
  let unplaced: string[] = [];
  if (!parsed.success) {
    unplaced = placeIssues(
      parsed.error.issues,
      (path) => (path[0] === 'normalCuttingRateMm2PerMin' ? 'rate' : undefined),
      errors,
      system,
    );
  }
  if (!parsed.success || hasErrors(errors)) return { errors, formError: unplaced[0] ?? null, plan: null };
  const { settings, normalCuttingRateMm2PerMin } = parsed.data;
  const worked = compute(() => planBreakIn(settings, normalCuttingRateMm2PerMin));
  return worked.ok
    ? { errors, formError: null, plan: worked.value }
    : { errors, formError: worked.message, plan: null };
}
