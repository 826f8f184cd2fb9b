import { planBreakInForSite, type BreakInPlan } from '@kerfline/domain/break-in/break-in-plan';
import { breakInPlanRequestSchema, type BreakInMode } from '@kerfline/domain/break-in/schema';
import { materialGroupSchema, type MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readQuantity, type Entry } from './quantities';
import { compute, hasErrors, placeIssues, take } from './readings';
import type { FieldErrors } from './use-entries';

export type BreakInKey = 'mode' | 'rate' | 'material' | 'sawMin' | 'sawMax';

export const BREAK_IN_LABELS = {
  sawMin: 'Lowest band speed of the saw',
  sawMax: 'Highest band speed of the saw',
} as const;

export interface BreakInEvaluation {
  errors: FieldErrors<BreakInKey>;
  formError: string | null;
  plan: BreakInPlan | null;
  material: MaterialGroup | null;
  /**
   * The break-in band speeds this saw can run: the plan's range for the material within the saw's own range,
   * m/min; null without a material or the saw's range, `empty` when the saw cannot reach any of it.
   */
  onSaw: { minMPerMin: number; maxMPerMin: number } | 'empty' | null;
}

export function breakInMode(entry: Entry): BreakInMode {
  return entry.text === 'area' ? 'area' : 'time';
}

/**
 * The break-in plan of the site's `break_in` setting, measured in minutes or in area cut; a normal cutting rate
 * (typed in cm²/min or in²/min, handed over in mm²/min) fills in the other measure of each step. With a material
 * the plan gives its band speeds (the site's range), and with the saw's speed range, the part the saw can run.
 */
export function evaluateBreakIn(
  entries: Record<BreakInKey, Entry>,
  system: UnitSystem,
  settings: EffectiveSettings = {},
): BreakInEvaluation {
  const errors: FieldErrors<BreakInKey> = {};
  const rate = take(readQuantity(entries.rate, 'areaRate'), 'rate', 'Normal cutting rate', errors, false);
  const parsedMaterial = entries.material.text === '' ? null : materialGroupSchema.safeParse(entries.material.text);
  if (parsedMaterial && !parsedMaterial.success) errors.material = parsedMaterial.error.issues[0]?.message;
  const material = parsedMaterial?.success ? parsedMaterial.data : null;
  const sawMin = take(readQuantity(entries.sawMin, 'bandSpeed'), 'sawMin', BREAK_IN_LABELS.sawMin, errors, false);
  const sawMax = take(readQuantity(entries.sawMax, 'bandSpeed'), 'sawMax', BREAK_IN_LABELS.sawMax, errors, false);
  if (sawMin !== undefined && sawMax !== undefined && sawMin > sawMax)
    errors.sawMax = 'The highest band speed must not be below the lowest';
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
  const none = { errors, material, onSaw: null, plan: null };
  if (!parsed.success || hasErrors(errors)) return { ...none, formError: unplaced[0] ?? null };
  const worked = compute(() =>
    planBreakInForSite(breakInMode(entries.mode), parsed.data.normalCuttingRateMm2PerMin, {
      system,
      settings,
      ...(material ? { materialGroup: material } : {}),
    }),
  );
  if (!worked.ok) return { ...none, formError: worked.message };
  const plan = worked.value;
  let onSaw: BreakInEvaluation['onSaw'] = null;
  if (plan.bandSpeed && sawMin !== undefined && sawMax !== undefined) {
    const low = Math.max(plan.bandSpeed.breakInMinMPerMin, sawMin);
    const high = Math.min(plan.bandSpeed.breakInMaxMPerMin, sawMax);
    onSaw = low <= high ? { minMPerMin: low, maxMPerMin: high } : 'empty';
  }
  return { errors, formError: null, plan, material, onSaw };
}
