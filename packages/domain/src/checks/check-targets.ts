/**
 * Targets of the maintenance checks for a saw and band, and pass or fail for a reading. The figures a site owns
 * (guide opening, tracking, bearing wear, head force, tension ranges) come from the site's effective settings,
 * passed in the context; each result carries the basis of its target, so the screen can say "published: …" or
 * "your site's setting, changed by … on …", and its explanation reads in the site's units first.
 */
import type { z } from 'zod';
import type { FigureBasis } from '../figures/basis.js';
import { effectiveSetting, settingBasis, settingValue, type EffectiveSettings } from '../settings/effective.js';
import type { UnitSystem } from '../units/display.js';
import {
  CHECK_DEFAULTS,
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
import { bothUnits, bothUnitsRange } from './wording.js';

/** What a check needs beyond its own input: the site's unit system and its effective settings. */
export interface CheckContext {
  /** Wording of explanations; metric unless given. */
  system?: UnitSystem;
  /** The site's effective settings; shipped values for any left out. */
  settings?: EffectiveSettings;
}

/**
 * A check's target for this saw and blade, and, once a value is measured, whether it passed.
 * Numbers are in `unit` (mm, N or MPa); `condition` checks carry no numbers.
 */
export interface CheckResult {
  kind: CheckKindId;
  unit: CheckUnit;
  /** False when the check does not apply to this saw (a spring-balance reading on a hydraulic feed). */
  applicable: boolean;
  /** The value to set or aim for; null for condition checks and checks that do not apply. */
  target: number | null;
  /** Lowest passing value (inclusive); null when there is no lower limit, for condition checks, or not applicable. */
  min: number | null;
  /** Highest passing value (inclusive); null for condition checks or not applicable. */
  max: number | null;
  measured: number | null;
  /** null until something is measured or observed, and when the check does not apply. */
  passed: boolean | null;
  /** What to do and what the reading means, in the site's units first. */
  explanation: string;
  /**
   * Where the target comes from: a printed source, the site's setting (shipped or changed), or the saw's or
   * blade's own record (a blade maker's range, a figure typed for this saw). Null for the chip brush, whose
   * pass rule is a yes/no observation with no figure.
   */
  basis: FigureBasis | null;
}

/** Measuring tools resolve to about 0.001 mm at best; this keeps a value exactly on a limit from failing on float noise. */
const EPSILON = 1e-9;

function within(value: number, min: number | null, max: number | null): boolean {
  return (min === null || value >= min - EPSILON) && (max === null || value <= max + EPSILON);
}

const ownFigure = (what: string): FigureBasis => ({ kind: 'record', note: what });

/**
 * Guide bearing clearance: target opening = band thickness + the site's extra clearance (shipped 0.001 in, common
 * practice, no source). The tolerance is on the open side only: a reading from the target up to target +
 * tolerance passes; anything tighter than the target, and above all tighter than the band, pinches it and fails.
 * All lengths in mm.
 */
export function guideClearanceTarget(
  input: z.input<typeof guideClearanceInputSchema>,
  context: CheckContext = {},
): CheckResult {
  const v = guideClearanceInputSchema.parse(input);
  const system = context.system ?? 'metric';
  const setting = effectiveSetting(context.settings, 'guide_clearance');
  const extra = v.extraClearanceMm ?? settingValue(setting, 'extraClearanceMm');
  const tolerance = v.toleranceMm ?? settingValue(setting, 'toleranceMm');
  const target = v.bandThicknessMm + extra;
  const min = target;
  const max = target + tolerance;
  const measured = v.measuredMm ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  let explanation = `Set the guide opening to the band thickness plus ${bothUnits('length', extra, system)}: ${bothUnits('length', target, system)}. A reading from ${bothUnitsRange('length', min, max, system)} passes; anything tighter pinches the band.`;
  if (measured !== null && !passed) {
    if (measured < v.bandThicknessMm - EPSILON) {
      explanation += ` Measured ${bothUnits('length', measured, system)} is tighter than the band itself: the guides will pinch and heat it.`;
    } else if (measured < min) {
      explanation += ` Measured ${bothUnits('length', measured, system)} is too tight: the band needs its clearance to run free.`;
    } else {
      explanation += ` Measured ${bothUnits('length', measured, system)} is too loose: the band can twist and wander in the cut.`;
    }
  }
  const ownFigures = v.extraClearanceMm !== undefined || v.toleranceMm !== undefined;
  return {
    kind: 'guide_clearance',
    unit: 'mm',
    applicable: true,
    target,
    min,
    max,
    measured,
    passed,
    explanation,
    basis: ownFigures ? ownFigure("this saw's own guide clearance") : settingBasis(setting),
  };
}

/**
 * Tracking: with the back of the band flush with the back edge of the wheel, the tooth edge should overhang the
 * wheel face by about 1/8 in on a 1 in band (common practice, no source). We scale that as 1/8 of the band
 * width, kept within the site's least and greatest overhang (shipped 1/16 in and 1/4 in), and pass within the
 * site's tolerance either side (shipped ±1/32 in). Lengths in mm.
 */
export function trackingTarget(input: z.input<typeof trackingInputSchema>, context: CheckContext = {}): CheckResult {
  const v = trackingInputSchema.parse(input);
  const system = context.system ?? 'metric';
  const setting = effectiveSetting(context.settings, 'tracking');
  const least = v.minOverhangMm ?? settingValue(setting, 'minOverhangMm');
  const greatest = v.maxOverhangMm ?? settingValue(setting, 'maxOverhangMm');
  const tolerance = v.toleranceMm ?? settingValue(setting, 'toleranceMm');
  const scaled = v.bandWidthMm * CHECK_DEFAULTS.trackingOverhangPerWidth;
  const target = Math.min(greatest, Math.max(least, scaled));
  const min = Math.max(0, target - tolerance);
  const max = target + tolerance;
  const measured = v.measuredOverhangMm ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  let explanation = `With the back of the band flush with the back edge of the wheel, the tooth edge should stand ${bothUnits('length', target, system)} off the wheel face (1/8 of the band width, kept within your site's least and greatest); ${bothUnitsRange('length', min, max, system)} passes.`;
  if (measured !== null && !passed) {
    explanation +=
      measured < min
        ? ' Too little overhang: the tooth set can ride on the wheel and be flattened. Adjust the tracking.'
        : ' Too much overhang: the band is running off the front of the wheel. Adjust the tracking.';
  }
  const ownFigures = v.minOverhangMm !== undefined || v.maxOverhangMm !== undefined || v.toleranceMm !== undefined;
  return {
    kind: 'tracking',
    unit: 'mm',
    applicable: true,
    target,
    min,
    max,
    measured,
    passed,
    explanation,
    basis: ownFigures ? ownFigure("this saw's own tracking figures") : settingBasis(setting),
  };
}

/**
 * Head down-force of a gravity- or spring-fed head: hook a spring balance on the head directly above the band,
 * midway between the guide arms, pull straight up and read it over the last inch (25.4 mm) of travel. The
 * reading must lie between the site's least (below it the head is not feeding) and greatest (shipped 8 lbf,
 * common practice, no source) force; a saw's own figures override them. Where the balance hooks on matters: on
 * a pivoting head, a point further from the pivot reads less for the same force at the band. A hydraulically
 * fed head is not checked this way: the result says the check does not apply. Force in N.
 */
export function feedPressureTarget(
  input: z.input<typeof feedPressureInputSchema>,
  context: CheckContext = {},
): CheckResult {
  const v = feedPressureInputSchema.parse(input);
  const system = context.system ?? 'metric';
  if (v.headFeed === 'hydraulic') {
    return {
      kind: 'feed_pressure',
      unit: 'N',
      applicable: false,
      target: null,
      min: null,
      max: null,
      measured: null,
      passed: null,
      explanation:
        "This saw feeds its head hydraulically: a spring-balance reading does not apply. Check the feed pressure and rate as the saw maker's manual says.",
      basis: null,
    };
  }
  const setting = effectiveSetting(context.settings, 'head_force');
  const max = v.maxHeadForceN ?? settingValue(setting, 'maxN');
  // A saw's own greatest below the site's least takes the least down with it, so the range never turns over.
  const min = Math.min(v.minHeadForceN ?? settingValue(setting, 'minN'), max);
  const measured = v.measuredN ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  let explanation = `Hook a spring balance on the head directly above the band, midway between the guide arms (leverage changes the reading anywhere else), pull straight up and read it over the last inch (25.4 mm) of travel: ${bothUnitsRange('force', min, max, system)} passes.`;
  if (measured !== null && !passed) {
    explanation +=
      measured < min
        ? ` Measured ${bothUnits('force', measured, system)} is too light: the head is not feeding. Adjust the head balance.`
        : ` Measured ${bothUnits('force', measured, system)} is too heavy: the head feeds too hard and overloads the teeth. Adjust the head balance or feed.`;
  }
  const ownFigures = v.minHeadForceN !== undefined || v.maxHeadForceN !== undefined;
  return {
    kind: 'feed_pressure',
    unit: 'N',
    applicable: true,
    target: max,
    min,
    max,
    measured,
    passed,
    explanation,
    basis: ownFigures ? ownFigure("this saw's own head-force limits") : settingBasis(setting),
  };
}

/**
 * Guide and pressure bearing wear: a straightedge laid on the bearing face should sit flush (target gap 0 mm);
 * the largest feeler that fits under it must not exceed the site's tolerance (shipped 0.001 in). Lengths in mm.
 */
export function bearingWearTarget(
  input: z.input<typeof bearingWearInputSchema>,
  context: CheckContext = {},
): CheckResult {
  const v = bearingWearInputSchema.parse(input);
  const system = context.system ?? 'metric';
  const setting = effectiveSetting(context.settings, 'bearing_wear');
  const tolerance = v.toleranceMm ?? settingValue(setting, 'toleranceMm');
  const measured = v.measuredGapMm ?? null;
  const passed = measured === null ? null : within(measured, 0, tolerance);
  let explanation = `Lay a straightedge across the bearing face: it should sit flush. A gap up to ${bothUnits('length', tolerance, system)} passes.`;
  if (measured !== null && !passed) {
    explanation += ` A gap of ${bothUnits('length', measured, system)} means the face is worn hollow: replace the bearing.`;
  }
  return {
    kind: 'bearing_wear',
    unit: 'mm',
    applicable: true,
    target: 0,
    min: 0,
    max: tolerance,
    measured,
    passed,
    explanation,
    basis: v.toleranceMm !== undefined ? ownFigure("this saw's own bearing-wear limit") : settingBasis(setting),
  };
}

/**
 * Band tension: the range a band tension meter must read for the blade material, MPa, from the site's
 * `band_tension.<material>` setting (carbon and bi-metal ship the printed blade makers' ranges; carbide-tipped
 * a starting value). The blade maker's range for this blade, when given, replaces it. The target is the middle
 * of the range.
 */
export function bandTensionTarget(
  input: z.input<typeof bandTensionInputSchema>,
  context: CheckContext = {},
): CheckResult {
  const v = bandTensionInputSchema.parse(input);
  const system = context.system ?? 'metric';
  const setting = effectiveSetting(context.settings, `band_tension.${v.bladeMaterial}`);
  const min = v.minMPa ?? settingValue(setting, 'minMPa');
  const max = v.maxMPa ?? settingValue(setting, 'maxMPa');
  const target = (min + max) / 2;
  const measured = v.measuredMPa ?? null;
  const passed = measured === null ? null : within(measured, min, max);
  let explanation = `Tension the band to ${bothUnitsRange('stress', min, max, system)} on a tension meter; aim for ${bothUnits('stress', target, system)}.`;
  if (measured !== null && !passed) {
    explanation +=
      measured < min
        ? ` Measured ${bothUnits('stress', measured, system)} is slack: the band can wander and cut crooked.`
        : ` Measured ${bothUnits('stress', measured, system)} is too tight: it shortens the band's fatigue life.`;
  }
  return {
    kind: 'band_tension',
    unit: 'MPa',
    applicable: true,
    target,
    min,
    max,
    measured,
    passed,
    explanation,
    basis: v.minMPa !== undefined ? ownFigure("the blade maker's range for this blade") : settingBasis(setting),
  };
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
    applicable: true,
    target: null,
    min: null,
    max: null,
    measured: null,
    passed,
    explanation,
    basis: null,
  };
}

/** Any check, dispatched on `kind`; throws a ZodError naming the field to fix on bad input. */
export function evaluateCheck(input: CheckInput, context: CheckContext = {}): CheckResult {
  const v = checkInputSchema.parse(input);
  switch (v.kind) {
    case 'guide_clearance':
      return guideClearanceTarget(v, context);
    case 'tracking':
      return trackingTarget(v, context);
    case 'feed_pressure':
      return feedPressureTarget(v, context);
    case 'bearing_wear':
      return bearingWearTarget(v, context);
    case 'band_tension':
      return bandTensionTarget(v, context);
    case 'chip_brush':
      return chipBrushCheck(v);
  }
}
