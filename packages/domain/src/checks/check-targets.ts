import { mmToIn, nToLbf, paToPsi } from '../units/units.js';
import {
  CHECK_DEFAULTS,
  DEFAULT_TENSION_RANGE_MPA,
  bandTensionInputSchema,
  bearingWearInputSchema,
  checkInputSchema,
  chipBrushInputSchema,
  feedPressureInputSchema,
  guideClearanceInputSchema,
  trackingInputSchema,
  type CheckInput,
  type CheckKindId,
  type CheckUnit,
} from './schema.js';
import type { z } from 'zod';

export const BASIS_COMMON_PRACTICE = 'common practice, no source';
export const BASIS_FROM_MEMORY = 'from memory';

/**
 * A check's target for this saw and blade, and, once a value is measured, whether it passed.
 * Numbers are in `unit` (mm, N or MPa); `condition` checks carry no numbers.
 */
export interface CheckResult {
  kind: CheckKindId;
  unit: CheckUnit;
  /** The value to set or aim for; null for condition checks. */
  target: number | null;
  /** Lowest passing value (inclusive); null when there is no lower limit or for condition checks. */
  min: number | null;
  /** Highest passing value (inclusive); null for condition checks. */
  max: number | null;
  measured: number | null;
  /** null until something is measured or observed. */
  passed: boolean | null;
  explanation: string;
  /** Where the target comes from: "common practice, no source", "from memory", or the user's own figure. */
  basis: string;
}

/** Measuring tools resolve to about 0.001 mm at best; this keeps a value exactly on a limit from failing on float noise. */
const EPSILON = 1e-9;

function within(value: number, min: number | null, max: number | null): boolean {
  return (min === null || value >= min - EPSILON) && (max === null || value <= max + EPSILON);
}

const mmText = (mm: number): string => `${mm.toFixed(3)} mm (${mmToIn(mm).toFixed(4)} in)`;

/**
 * Guide bearing clearance: target opening = band thickness + 0.001 in (common practice, no source).
 * Passes when the measured opening lies within target ± tolerance (default ±0.001 in, so from the band
 * thickness up to thickness + 0.002 in — our choice). All lengths in mm.
 */
export function guideClearanceTarget(input: z.input<typeof guideClearanceInputSchema>): CheckResult {
  const v = guideClearanceInputSchema.parse(input);
  const target = v.bandThicknessMm + v.extraClearanceMm;
  const min = Math.max(0, target - v.toleranceMm);
  const max = target + v.toleranceMm;
  const measured = v.measuredMm ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  let explanation = `Set the guide opening to the band thickness plus ${mmText(v.extraClearanceMm)}: ${mmText(target)}. A reading from ${mmText(min)} to ${mmText(max)} passes.`;
  if (measured !== null && !passed) {
    explanation +=
      measured < min
        ? ` Measured ${mmText(measured)} is too tight: the guides will pinch and heat the band.`
        : ` Measured ${mmText(measured)} is too loose: the band can twist and wander in the cut.`;
  }
  const defaults =
    v.extraClearanceMm === CHECK_DEFAULTS.guideExtraClearanceMm && v.toleranceMm === CHECK_DEFAULTS.guideToleranceMm;
  return {
    kind: 'guide_clearance',
    unit: 'mm',
    target,
    min,
    max,
    measured,
    passed,
    explanation,
    basis: defaults ? BASIS_COMMON_PRACTICE : 'site setting',
  };
}

/**
 * Tracking: with the back of the band flush with the back edge of the wheel, the tooth edge should overhang the
 * wheel face by about 1/8 in on a 1 in band (common practice, no source). We scale that as 1/8 of the band
 * width, bounded to [1/16 in, 1/4 in] by default, and pass within ±1/32 in. Lengths in mm.
 */
export function trackingTarget(input: z.input<typeof trackingInputSchema>): CheckResult {
  const v = trackingInputSchema.parse(input);
  const scaled = v.bandWidthMm * CHECK_DEFAULTS.trackingOverhangPerWidth;
  const target = Math.min(v.maxOverhangMm, Math.max(v.minOverhangMm, scaled));
  const min = Math.max(0, target - v.toleranceMm);
  const max = target + v.toleranceMm;
  const measured = v.measuredOverhangMm ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  let explanation = `With the back of the band flush with the back edge of the wheel, the tooth edge should stand ${mmText(target)} off the wheel face (1/8 of the band width, bounded); ${mmText(min)} to ${mmText(max)} passes.`;
  if (measured !== null && !passed) {
    explanation +=
      measured < min
        ? ' Too little overhang: the tooth set can ride on the wheel and be flattened. Adjust the tracking.'
        : ' Too much overhang: the band is running off the front of the wheel. Adjust the tracking.';
  }
  return {
    kind: 'tracking',
    unit: 'mm',
    target,
    min,
    max,
    measured,
    passed,
    explanation,
    basis: BASIS_COMMON_PRACTICE,
  };
}

/**
 * Feed / head pressure: the spring-balance reading of the head over the last inch of its travel must not
 * exceed this saw's maximum (default 8 lbf ≈ 35.6 N, common practice for one class of saw, no source). Force in N.
 */
export function feedPressureTarget(input: z.input<typeof feedPressureInputSchema>): CheckResult {
  const v = feedPressureInputSchema.parse(input);
  const max = v.maxHeadForceN;
  const measured = v.measuredN ?? null;
  const passed = measured === null ? null : within(measured, 0, max);
  let explanation = `Hook a spring balance under the head and read it over the last inch (25.4 mm) of travel: at most ${max.toFixed(1)} N (${nToLbf(max).toFixed(1)} lbf).`;
  if (measured !== null && !passed) {
    explanation += ` Measured ${measured.toFixed(1)} N is too heavy: the head feeds too hard and overloads the teeth. Adjust the head balance or feed pressure.`;
  }
  const basis = max === CHECK_DEFAULTS.maxHeadForceN ? BASIS_COMMON_PRACTICE : 'saw setting';
  return { kind: 'feed_pressure', unit: 'N', target: max, min: 0, max, measured, passed, explanation, basis };
}

/**
 * Guide and pressure bearing wear: a straightedge laid on the bearing face should sit flush (target gap 0 mm);
 * the largest feeler that fits under it must not exceed the tolerance (default 0.001 in, our choice). Lengths in mm.
 */
export function bearingWearTarget(input: z.input<typeof bearingWearInputSchema>): CheckResult {
  const v = bearingWearInputSchema.parse(input);
  const measured = v.measuredGapMm ?? null;
  const passed = measured === null ? null : within(measured, 0, v.toleranceMm);
  let explanation = `Lay a straightedge across the bearing face: it should sit flush. A gap up to ${mmText(v.toleranceMm)} passes.`;
  if (measured !== null && !passed) {
    explanation += ` A gap of ${mmText(measured)} means the face is worn hollow: replace the bearing.`;
  }
  return {
    kind: 'bearing_wear',
    unit: 'mm',
    target: 0,
    min: 0,
    max: v.toleranceMm,
    measured,
    passed,
    explanation,
    basis: BASIS_COMMON_PRACTICE,
  };
}

/**
 * Band tension: target stress range by blade material, MPa, read on a band tension meter. Default ranges are
 * from memory (bi-metal ≈ 30 000–35 000 psi ≈ 207–241 MPa); the blade maker's range, when given, replaces them.
 * The target is the middle of the range.
 */
export function bandTensionTarget(input: z.input<typeof bandTensionInputSchema>): CheckResult {
  const v = bandTensionInputSchema.parse(input);
  const defaults = DEFAULT_TENSION_RANGE_MPA[v.bladeMaterial];
  const min = v.minMPa ?? defaults.minMPa;
  const max = v.maxMPa ?? defaults.maxMPa;
  const target = (min + max) / 2;
  const measured = v.measuredMPa ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  const psi = (mpa: number): string => Math.round(paToPsi(mpa * 1e6)).toLocaleString('en-US');
  let explanation = `Tension the band to ${min.toFixed(0)}–${max.toFixed(0)} MPa (${psi(min)}–${psi(max)} psi) on a tension meter; aim for ${target.toFixed(0)} MPa.`;
  if (measured !== null && !passed) {
    explanation +=
      measured < min
        ? ` Measured ${measured.toFixed(0)} MPa is slack: the band can wander and cut crooked.`
        : ` Measured ${measured.toFixed(0)} MPa is too tight: it shortens the band's fatigue life.`;
  }
  const basis = v.minMPa === undefined && v.maxMPa === undefined ? BASIS_FROM_MEMORY : "blade maker's range";
  return { kind: 'band_tension', unit: 'MPa', target, min, max, measured, passed, explanation, basis };
}

/** Chip brush: passes when it reaches into the gullets and is not worn. Unobserved until both are answered. */
export function chipBrushCheck(input: z.input<typeof chipBrushInputSchema>): CheckResult {
  const v = chipBrushInputSchema.parse(input);
  const reaches = v.reachesGullets ?? null;
  const worn = v.worn ?? null;
  const passed = reaches === null || worn === null ? null : reaches && !worn;
  let explanation = 'The brush must reach into the gullets as the band passes and its bristles must not be worn down.';
  if (reaches === false)
    explanation += ' It does not reach the gullets: set it closer so chips are not carried back into the cut.';
  if (worn === true) explanation += ' It is worn: replace it.';
  return {
    kind: 'chip_brush',
    unit: 'condition',
    target: null,
    min: null,
    max: null,
    measured: null,
    passed,
    explanation,
    basis: BASIS_COMMON_PRACTICE,
  };
}

/** Any check, dispatched on `kind`; throws a ZodError naming the field to fix on bad input. */
export function evaluateCheck(input: CheckInput): CheckResult {
  const v = checkInputSchema.parse(input);
  switch (v.kind) {
    case 'guide_clearance':
      return guideClearanceTarget(v);
    case 'tracking':
      return trackingTarget(v);
    case 'feed_pressure':
      return feedPressureTarget(v);
    case 'bearing_wear':
      return bearingWearTarget(v);
    case 'band_tension':
      return bandTensionTarget(v);
    case 'chip_brush':
      return chipBrushCheck(v);
  }
}
