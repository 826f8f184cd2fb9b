import { recommendedBandSpeed, type BandSpeedOptions, type RecommendedBandSpeed } from '../band-speed/speed-ranges.js';
import type { MaterialGroup } from '../band-speed/schema.js';
import { bandSpeedToDisplay, type UnitSystem } from '../units/display.js';
import type { FigureBasis } from '../figures/basis.js';
import { effectiveSetting, settingBasis, settingValue, type EffectiveSettings } from '../settings/effective.js';
import {
  breakInSettingsSchema,
  normalCuttingRateSchema,
  type BreakInMode,
  type BreakInSettingsInput,
} from './schema.js';

export type BreakInStepKind = 'reduced' | 'ramp' | 'normal';

/**
 * One step of a break-in. `feedFraction` is a fraction of the normal feed rate (head descent speed), so at
 * the same work height the area cut per minute scales with it. `durationMin` and `areaMm2` are both given
 * where they can be worked out; the final `normal` step is open-ended (both null).
 */
export interface BreakInStep {
  kind: BreakInStepKind;
  feedFraction: number;
  bandSpeedFraction: number;
  /** Minutes in this step; null when the step is measured by area and no cutting rate is known. */
  durationMin: number | null;
  /** Area cut in this step, mm²; null when the step is measured by time and no cutting rate is known. */
  areaMm2: number | null;
  note: string;
}

export interface BreakInPlan {
  mode: BreakInMode;
  steps: BreakInStep[];
  /** Minutes from the first cut until normal feed; null when it cannot be worked out. */
  totalDurationMin: number | null;
  /** Area cut before normal feed, mm²; null when it cannot be worked out. */
  totalAreaMm2: number | null;
  /** The normal cutting rate used, mm²/min at 100 % feed, or null. */
  normalCuttingRateMm2PerMin: number | null;
  /**
   * Band speeds for the material, when one is given: its normal range (with its basis) and the range during
   * break-in (the normal range × the break-in band speed fraction), m/min.
   */
  bandSpeed: {
    materialGroup: MaterialGroup;
    normal: RecommendedBandSpeed;
    breakInMinMPerMin: number;
    breakInMaxMPerMin: number;
  } | null;
  /**
   * Where the steps come from: the site's `break_in` setting (Kerfline's starting plan, or the site's own, with
   * who changed it and when), or the steps a caller gave for this plan.
   */
  basis: FigureBasis;
}

export interface BreakInMaterialOptions extends BandSpeedOptions {
  /** The material the new blade will cut first: its band speed range goes into the plan. */
  materialGroup?: MaterialGroup;
  /** Wording of the speeds in the step notes; metric unless given. */
  system?: UnitSystem;
  /** Where the steps come from; the site's `break_in` setting unless given (see `planBreakInForSite`). */
  basis?: FigureBasis;
}

const percent = (f: number): string => `${Math.round(f * 100)} %`;

function sumOrNull(values: (number | null)[]): number | null {
  let total = 0;
  for (const v of values) {
    if (v === null) return null;
    total += v;
  }
  return total;
}

/**
 * Builds the break-in plan for a new blade.
 *
 * - Time mode: a reduced feed for `initialDurationMin` minutes, then each ramp feed for
 *   `rampStepDurationMin` minutes. With a cutting rate R (mm²/min at 100 % feed) the area of a step is
 *   feedFraction × R × minutes.
 * - Area mode: a reduced feed for the first `initialAreaMm2`, then `rampStepAreaMm2` at each ramp feed.
 *   With R the minutes of a step are area ÷ (feedFraction × R).
 *
 * A last open-ended step returns to normal feed and full band speed. The shipped steps are common practice, no
 * source: a site keeps its own as the `break_in` setting (`planBreakInForSite`). Bad settings throw a ZodError
 * whose messages say which field to fix.
 *
 * @param settings break-in settings (defaults: time mode, 1/3 feed for 10 min, then 50 % and 75 % for 5 min each)
 * @param normalCuttingRateMm2PerMin cutting rate at normal feed, mm²/min, if known
 */
export function planBreakIn(
  settings: BreakInSettingsInput = { mode: 'time' },
  normalCuttingRateMm2PerMin: number | null = null,
  material: BreakInMaterialOptions = {},
): BreakInPlan {
  const s = breakInSettingsSchema.parse(settings);
  const rate = normalCuttingRateSchema.parse(normalCuttingRateMm2PerMin);
  const system = material.system ?? 'metric';
  const normal = material.materialGroup === undefined ? null : recommendedBandSpeed(material.materialGroup, material);
  const speedRange = (low: number, high: number) => {
    const lo = bandSpeedToDisplay(low, system);
    return `${lo.text.slice(0, -lo.unit.length - 1)}–${bandSpeedToDisplay(high, system).text}`;
  };
  const speedFor = (fraction: number) =>
    normal === null ? '' : ` (${speedRange(normal.minMPerMin * fraction, normal.maxMPerMin * fraction)})`;

  const feeds: { kind: BreakInStepKind; feedFraction: number }[] = [
    { kind: 'reduced', feedFraction: s.initialFeedFraction },
    ...s.rampFeedFractions.map((f) => ({ kind: 'ramp' as const, feedFraction: f })),
  ];
  const speedText =
    (s.bandSpeedFraction === 1 ? 'full normal band speed' : `${percent(s.bandSpeedFraction)} of normal band speed`) +
    speedFor(s.bandSpeedFraction);

  const steps: BreakInStep[] = feeds.map(({ kind, feedFraction }, i) => {
    const areaRate = rate === null ? null : feedFraction * rate;
    let durationMin: number | null;
    let areaMm2: number | null;
    let measure: string;
    if (s.mode === 'time') {
      durationMin = i === 0 ? s.initialDurationMin : s.rampStepDurationMin;
      areaMm2 = areaRate === null ? null : areaRate * durationMin;
      measure = `for ${durationMin} min`;
    } else {
      areaMm2 = i === 0 ? s.initialAreaMm2 : s.rampStepAreaMm2;
      durationMin = areaRate === null ? null : areaMm2 / areaRate;
      measure = `for the next ${Math.round(areaMm2).toLocaleString('en-US')} mm² of cut`;
    }
    const note =
      kind === 'reduced'
        ? `New blade: ${speedText}, feed at ${percent(feedFraction)} of normal ${measure}, so the sharp tooth tips hone instead of chipping.`
        : `Raise the feed to ${percent(feedFraction)} of normal ${measure} at ${speedText}.`;
    return { kind, feedFraction, bandSpeedFraction: s.bandSpeedFraction, durationMin, areaMm2, note };
  });

  steps.push({
    kind: 'normal',
    feedFraction: 1,
    bandSpeedFraction: 1,
    durationMin: null,
    areaMm2: null,
    note: `Break-in done: normal feed and normal band speed${speedFor(1)} from here on.`,
  });

  const breakInSteps = steps.slice(0, -1);
  return {
    mode: s.mode,
    steps,
    totalDurationMin: sumOrNull(breakInSteps.map((st) => st.durationMin)),
    totalAreaMm2: sumOrNull(breakInSteps.map((st) => st.areaMm2)),
    normalCuttingRateMm2PerMin: rate,
    bandSpeed:
      normal === null || material.materialGroup === undefined
        ? null
        : {
            materialGroup: material.materialGroup,
            normal,
            breakInMinMPerMin: normal.minMPerMin * s.bandSpeedFraction,
            breakInMaxMPerMin: normal.maxMPerMin * s.bandSpeedFraction,
          },
    basis: material.basis ?? settingBasis(effectiveSetting(material.settings, 'break_in')),
  };
}

/**
 * The plan steps a site's `break_in` setting gives, measured in minutes or in area cut: its starting feed, two
 * steps up and band speed (stored in percent of normal), and the minutes or area of each step.
 */
export function breakInSettingsForSite(
  settings: EffectiveSettings | undefined,
  mode: BreakInMode,
): BreakInSettingsInput {
  // A site on the shipped plan gets the shipped steps as they are (1/3 exactly, not 33.33… % ÷ 100).
  if (settings?.break_in === undefined) return { mode };
  const setting = effectiveSetting(settings, 'break_in');
  const v = (field: string) => settingValue(setting, field);
  const common = {
    bandSpeedFraction: v('bandSpeedPercent') / 100,
    initialFeedFraction: v('startFeedPercent') / 100,
    rampFeedFractions: [v('secondFeedPercent') / 100, v('thirdFeedPercent') / 100],
  };
  return mode === 'time'
    ? { mode, ...common, initialDurationMin: v('startMinutes'), rampStepDurationMin: v('stepMinutes') }
    : { mode, ...common, initialAreaMm2: v('startAreaMm2'), rampStepAreaMm2: v('stepAreaMm2') };
}

/**
 * The break-in plan a site gives a new blade: the steps of its `break_in` setting (shipped or its own), with the
 * material's band speeds when one is given. The plan's basis says whose steps they are.
 */
export function planBreakInForSite(
  mode: BreakInMode,
  normalCuttingRateMm2PerMin: number | null = null,
  options: BreakInMaterialOptions = {},
): BreakInPlan {
  const setting = effectiveSetting(options.settings, 'break_in');
  return planBreakIn(breakInSettingsForSite(options.settings, mode), normalCuttingRateMm2PerMin, {
    ...options,
    basis: settingBasis(setting),
  });
}
