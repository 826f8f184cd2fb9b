/**
 * The target of a check on a site's list for one saw and the blade on it, and the verdict on a reading. Rule
 * checks go through the trade's target rules (`checks/check-targets.ts`) with the site's settings; fixed checks
 * compare the reading with the limits typed into the list. The API decides pass or fail with this, never the
 * browser's word for it.
 */
import { ZodError } from 'zod';
import type { FigureBasis } from '../figures/basis.js';
import { evaluateCheck, type CheckContext, type CheckResult } from '../checks/check-targets.js';
import type { BladeMaterial, CheckInput, CheckUnit, HeadFeed } from '../checks/schema.js';
import { bothUnits, bothUnitsRange } from '../checks/wording.js';
import type { CheckAnswers, CheckQuantity, CheckTargetRule } from './schema.js';

/** The saw's own figures a check target may need (SI). */
export interface CheckSaw {
  bandThicknessMm: number;
  bandWidthMm: number;
  headFeed: HeadFeed;
  /** This saw's own spring-balance limits (N); null or left out: the site's `head_force` setting. */
  minHeadForceN?: number | null;
  maxHeadForceN?: number | null;
  /** Where the saw's own limits come from (who set them, when), shown as their basis. */
  headForceBasis?: FigureBasis;
}

/** The blade on the saw, when one is recorded: its spec's figures win over the saw's usual band. */
export interface CheckBlade {
  thicknessMm: number;
  widthMm: number;
  material: BladeMaterial;
}

/** The parts of a site's check that decide its target. */
export interface TargetedCheck {
  targetRule: CheckTargetRule;
  quantity: CheckQuantity;
  fixedTarget: number | null;
  fixedMin: number | null;
  fixedMax: number | null;
}

export interface CheckReading {
  /** In the check's SI unit (mm, N, MPa); null when nothing was read yet. */
  reading?: number | null;
  answers?: CheckAnswers | null;
}

export interface SiteCheckContext extends CheckContext {
  /** Where a fixed check's figures come from: the site's list, who set them and when. */
  fixedBasis?: FigureBasis;
}

const UNIT_OF: Record<CheckQuantity, CheckUnit> = { length: 'mm', force: 'N', stress: 'MPa', condition: 'condition' };
const EPSILON = 1e-9;

function fixedResult(check: TargetedCheck, reading: number | null, context: SiteCheckContext): CheckResult {
  const system = context.system ?? 'metric';
  const quantity = check.quantity === 'condition' ? 'length' : check.quantity;
  const { fixedTarget: target, fixedMin: min, fixedMax: max } = check;
  const words = (v: number) => bothUnits(quantity, v, system);
  const range =
    min !== null && max !== null
      ? `${bothUnitsRange(quantity, min, max, system)} passes`
      : min !== null
        ? `at least ${words(min)} passes`
        : `at most ${words(max!)} passes`;
  const passed =
    reading === null ? null : (min === null || reading >= min - EPSILON) && (max === null || reading <= max + EPSILON);
  let explanation = `${target === null ? 'No target given' : `Aim for ${words(target)}`}; ${range}.`;
  if (reading !== null && passed === false) {
    explanation +=
      min !== null && reading < min
        ? ` Measured ${words(reading)} is below the lowest passing value.`
        : ` Measured ${words(reading)} is above the highest passing value.`;
  }
  return {
    kind: 'guide_clearance',
    unit: UNIT_OF[check.quantity],
    applicable: true,
    target,
    min,
    max,
    measured: reading,
    passed,
    explanation,
    basis: context.fixedBasis ?? { kind: 'record', note: 'your site’s list of checks' },
  };
}

/**
 * The basis of a saw's own head-force limits: "this saw's limit" (or limits), and who set them and when when the
 * audit trail says. A limit the saw leaves empty is the site's setting, and the words say so.
 */
export function sawHeadForceBasis(
  saw: Pick<CheckSaw, 'minHeadForceN' | 'maxHeadForceN'>,
  set: { byName: string | null; at: string } | null,
): FigureBasis {
  const hasMin = saw.minHeadForceN != null;
  const hasMax = saw.maxHeadForceN != null;
  const note =
    hasMin && hasMax
      ? 'this saw’s own head-force limits'
      : hasMax
        ? 'this saw’s own largest head force (the least is your site’s setting)'
        : 'this saw’s own least head force (the largest is your site’s setting)';
  return set ? { kind: 'record', note, setByName: set.byName, setAt: set.at } : { kind: 'record', note };
}

const NO_BLADE_TENSION =
  'No blade is recorded on this saw: put the blade on first (change blade), since the tension range depends on the blade’s material.';

/**
 * The check's target for this saw and blade, and the verdict on the reading when one is given. `kind` of the
 * result is the rule's; a fixed check carries `guide_clearance` there and must be told apart by the check's own
 * `targetRule`. Throws a ZodError when the reading is outside what the rule accepts (see `judgeCheckReading`).
 */
export function siteCheckResult(
  check: TargetedCheck,
  saw: CheckSaw,
  blade: CheckBlade | null,
  reading: CheckReading = {},
  context: SiteCheckContext = {},
): CheckResult {
  const value = reading.reading ?? null;
  if (check.targetRule === 'fixed') return fixedResult(check, value, context);
  const thickness = blade?.thicknessMm ?? saw.bandThicknessMm;
  const width = blade?.widthMm ?? saw.bandWidthMm;
  let input: CheckInput;
  switch (check.targetRule) {
    case 'guide_clearance':
      input = { kind: 'guide_clearance', bandThicknessMm: thickness, measuredMm: value };
      break;
    case 'tracking':
      input = { kind: 'tracking', bandWidthMm: width, measuredOverhangMm: value };
      break;
    case 'feed_pressure': {
      const own = {
        ...(saw.minHeadForceN != null ? { minHeadForceN: saw.minHeadForceN } : {}),
        ...(saw.maxHeadForceN != null ? { maxHeadForceN: saw.maxHeadForceN } : {}),
      };
      const result = evaluateCheck(
        { kind: 'feed_pressure', headFeed: saw.headFeed, measuredN: value, ...own },
        context,
      );
      if (!result.applicable || Object.keys(own).length === 0) return result;
      return { ...result, basis: saw.headForceBasis ?? sawHeadForceBasis(saw, null) };
    }
    case 'bearing_wear':
      input = { kind: 'bearing_wear', measuredGapMm: value };
      break;
    case 'band_tension':
      if (blade === null)
        return {
          kind: 'band_tension',
          unit: 'MPa',
          applicable: false,
          target: null,
          min: null,
          max: null,
          measured: null,
          passed: null,
          explanation: NO_BLADE_TENSION,
          basis: null,
        };
      input = { kind: 'band_tension', bladeMaterial: blade.material, measuredMPa: value };
      break;
    case 'chip_brush':
      input = {
        kind: 'chip_brush',
        reachesGullets: reading.answers?.reachesGullets ?? null,
        worn: reading.answers?.worn ?? null,
      };
      break;
  }
  return evaluateCheck(input, context);
}

export type CheckJudgement =
  { ok: true; result: CheckResult & { passed: boolean } } | { ok: false; path: string; message: string };

/**
 * The verdict on a reading someone wants to record, or what to fix: a check that does not apply to this saw
 * cannot be recorded (it says why), a number check needs a reading and a condition check both answers, and a
 * reading the rule cannot take is refused with the rule's own message.
 */
export function judgeCheckReading(
  check: TargetedCheck,
  saw: CheckSaw,
  blade: CheckBlade | null,
  reading: CheckReading,
  context: SiteCheckContext = {},
): CheckJudgement {
  const target = siteCheckResult(check, saw, blade, {}, context);
  if (!target.applicable)
    return { ok: false, path: 'siteCheckId', message: `This check does not apply: ${target.explanation}` };
  if (check.quantity === 'condition') {
    if (!reading.answers)
      return {
        ok: false,
        path: 'answers',
        message: 'Answer both questions: does the brush reach the gullets, is it worn',
      };
    if (reading.reading !== null && reading.reading !== undefined)
      return { ok: false, path: 'reading', message: 'A condition check takes answers, not a reading' };
  } else {
    if (reading.reading === null || reading.reading === undefined)
      return { ok: false, path: 'reading', message: 'Enter the reading' };
    if (reading.answers) return { ok: false, path: 'answers', message: 'This check takes a reading, not answers' };
  }
  try {
    const result = siteCheckResult(check, saw, blade, reading, context);
    if (result.passed === null) return { ok: false, path: 'reading', message: 'Enter the reading' };
    return { ok: true, result: result as CheckResult & { passed: boolean } };
  } catch (err) {
    if (err instanceof ZodError) {
      const issue = err.issues[0];
      const field = String(issue?.path[0] ?? '');
      return {
        ok: false,
        path: /^measured|^reaches|^worn/.test(field) ? (check.quantity === 'condition' ? 'answers' : 'reading') : field,
        message: issue?.message ?? 'The reading cannot be used',
      };
    }
    throw err;
  }
}
