import { z } from 'zod';
import { in2ToMm2 } from '../units/units.js';

/**
 * Defaults for a new blade's break-in. Common practice, no source: run at full normal band speed, feed at
 * about one third of normal for about ten minutes (or the first 50 in² of cut), then raise the feed in
 * steps to 50 % and 75 % before going back to normal feed. Every number is a setting the site may change.
 */
export const BREAK_IN_DEFAULTS = {
  /** Fraction of the normal band speed during break-in (1 = full normal speed). */
  bandSpeedFraction: 1,
  /** Fraction of the normal feed rate in the first, reduced step. */
  initialFeedFraction: 1 / 3,
  /** Feed fractions of the steps between the reduced step and normal feed, rising. */
  rampFeedFractions: [0.5, 0.75] as readonly number[],
  /** Time mode: minutes at the reduced feed. */
  initialDurationMin: 10,
  /** Time mode: minutes at each ramp step. */
  rampStepDurationMin: 5,
  /** Area mode: area cut at the reduced feed, 50 in² = 32 258 mm². */
  initialAreaMm2: in2ToMm2(50),
  /** Area mode: area cut at each ramp step, 25 in² = 16 129 mm² (so the whole break-in is 100 in²). */
  rampStepAreaMm2: in2ToMm2(25),
} as const;

export const BREAK_IN_MODES = ['time', 'area'] as const;
export type BreakInMode = (typeof BREAK_IN_MODES)[number];

const fraction = (label: string) =>
  z
    .number({ message: `${label} must be a number` })
    .gt(0, { message: `${label} must be greater than 0` })
    .max(1, { message: `${label} must be at most 1 (100 % of normal)` });

const positive = (label: string, unit: string, max: number) =>
  z
    .number({ message: `${label} must be a number` })
    .positive({ message: `${label} must be greater than 0` })
    .max(max, { message: `${label} must be at most ${max} ${unit}` });

const commonFields = {
  bandSpeedFraction: fraction('Band speed fraction').default(BREAK_IN_DEFAULTS.bandSpeedFraction),
  initialFeedFraction: fraction('Starting feed fraction').default(BREAK_IN_DEFAULTS.initialFeedFraction),
  rampFeedFractions: z
    .array(fraction('Each step feed fraction'), { message: 'Feed steps must be a list of fractions' })
    .max(10, { message: 'Use at most 10 feed steps' })
    .default(() => [...BREAK_IN_DEFAULTS.rampFeedFractions]),
};

export const timeBreakInSettingsSchema = z.object({
  mode: z.literal('time'),
  ...commonFields,
  initialDurationMin: positive('Minutes at the starting feed', 'min', 240).default(
    BREAK_IN_DEFAULTS.initialDurationMin,
  ),
  rampStepDurationMin: positive('Minutes per feed step', 'min', 240).default(BREAK_IN_DEFAULTS.rampStepDurationMin),
});

export const areaBreakInSettingsSchema = z.object({
  mode: z.literal('area'),
  ...commonFields,
  initialAreaMm2: positive('Area at the starting feed', 'mm²', 1e8).default(BREAK_IN_DEFAULTS.initialAreaMm2),
  rampStepAreaMm2: positive('Area per feed step', 'mm²', 1e8).default(BREAK_IN_DEFAULTS.rampStepAreaMm2),
});

type RampFields = { initialFeedFraction: number; rampFeedFractions: number[] };

/** The feed must rise at every step: above the starting feed, each step above the last, all below normal. */
function checkRamp(value: RampFields, ctx: z.core.$RefinementCtx<RampFields>): void {
  let previous = value.initialFeedFraction;
  if (previous >= 1) {
    ctx.addIssue({
      code: 'custom',
      path: ['initialFeedFraction'],
      message: 'Starting feed fraction must be below 1 (a break-in starts below normal feed)',
    });
    return;
  }
  value.rampFeedFractions.forEach((f, i) => {
    if (f <= previous || f >= 1) {
      ctx.addIssue({
        code: 'custom',
        path: ['rampFeedFractions', i],
        message: 'Each feed step must be above the one before it and below 1 (normal feed)',
      });
    }
    previous = Math.max(previous, f);
  });
}

/** Break-in settings as a site stores them; `mode` picks minutes or area as the measure of each step. */
export const breakInSettingsSchema = z
  .discriminatedUnion('mode', [timeBreakInSettingsSchema, areaBreakInSettingsSchema], {
    message: 'Break-in mode must be time or area',
  })
  .superRefine(checkRamp);
export type BreakInSettings = z.infer<typeof breakInSettingsSchema>;
export type BreakInSettingsInput = z.input<typeof breakInSettingsSchema>;

/** Optional normal cutting rate of this blade on this job, mm² per minute at 100 % feed. */
export const normalCuttingRateSchema = z
  .number({ message: 'Normal cutting rate must be a number (mm² per minute)' })
  .positive({ message: 'Normal cutting rate must be greater than 0 mm²/min' })
  .max(1e7, { message: 'Normal cutting rate must be at most 10 000 000 mm²/min' })
  .nullable();

/** What a break-in plan form sends: the settings plus an optional known cutting rate. */
export const breakInPlanRequestSchema = z.object({
  settings: breakInSettingsSchema.prefault({ mode: 'time' }),
  normalCuttingRateMm2PerMin: normalCuttingRateSchema.default(null),
});
export type BreakInPlanRequest = z.input<typeof breakInPlanRequestSchema>;
