import { z } from 'zod';
import { currencySchema } from '../sites/schema.js';

/** Downtime categories as recorded on a downtime event. */
export const DOWNTIME_CATEGORIES = [
  'blade_change',
  'blade_failure',
  'mechanical',
  'hydraulic',
  'electrical',
  'no_material_operator',
  'planned_maintenance',
  'other',
] as const;
export type DowntimeCategory = (typeof DOWNTIME_CATEGORIES)[number];

/**
 * Categories that count as a failure of the saw when the stop was unplanned. Following IEC 60050-192, a
 * failure is the loss of the item's ability to perform as required: an unplanned blade failure or a
 * mechanical, hydraulic, electrical or other fault. Not failures: planned stops of any category, routine
 * blade changes, and waiting for material or an operator (the saw could have run; the cause is outside it).
 */
export const FAILURE_CATEGORIES: readonly DowntimeCategory[] = [
  'blade_failure',
  'mechanical',
  'hydraulic',
  'electrical',
  'other',
];

const date = (label: string) => z.coerce.date({ message: `${label} must be a date` });
const minor = (label: string) =>
  z
    .number({ message: `${label} must be a number of minor units (e.g. cents)` })
    .int({ message: `${label} must be a whole number of minor units (e.g. cents)` })
    .min(0, { message: `${label} must not be negative` })
    .max(Number.MAX_SAFE_INTEGER, { message: `${label} is too large` });
const nonNegative = (label: string, unit: string) =>
  z.number({ message: `${label} must be a number (${unit})` }).min(0, { message: `${label} must not be negative` });

/** A reporting period, start inclusive and end exclusive. */
export const periodSchema = z
  .object({ periodStart: date('Period start'), periodEnd: date('Period end') })
  .refine((p) => p.periodEnd.getTime() > p.periodStart.getTime(), {
    path: ['periodEnd'],
    message: 'Period end must be after its start',
  });

/** One blade run as blade-life metrics need it. */
export const bladeRunLifeSchema = z.object({
  areaCutMm2: nonNegative('Area cut', 'mm²'),
  cuts: z.number().int({ message: 'Cuts must be a whole number' }).min(0, { message: 'Cuts must not be negative' }),
  /** Only removed blades have a finished life; runs still on a saw are counted apart. */
  removed: z.boolean({ message: 'removed must be true or false' }),
});
export const bladeLifeInputSchema = z.array(bladeRunLifeSchema, { message: 'Blade runs must be a list' });
export type BladeRunLife = z.input<typeof bladeRunLifeSchema>;

export const costPerAreaInputSchema = z.object({
  currency: currencySchema,
  costMinor: minor('Blade cost'),
  areaCutMm2: nonNegative('Area cut', 'mm²'),
});
export type CostPerAreaInput = z.input<typeof costPerAreaInputSchema>;

export const moneyItemSchema = z.object({ amountMinor: minor('Amount'), currency: currencySchema });

export const spendAgainstBudgetInputSchema = z
  .object({
    currency: currencySchema,
    budgetMinor: minor('Budget'),
    /** Blade purchases or blades issued to saws, each with the date it counts on. */
    spends: z.array(moneyItemSchema.extend({ at: date('Spend date') })),
    periodStart: date('Period start'),
    periodEnd: date('Period end'),
    asOf: date('As-of date'),
  })
  .refine((v) => v.periodEnd.getTime() > v.periodStart.getTime(), {
    path: ['periodEnd'],
    message: 'Period end must be after its start',
  })
  .superRefine((v, ctx) => {
    v.spends.forEach((s, i) => {
      if (s.currency !== v.currency) {
        ctx.addIssue({
          code: 'custom',
          path: ['spends', i, 'currency'],
          message: `Spend is in ${s.currency} but the budget is in ${v.currency}: convert it first`,
        });
      }
    });
  });
export type SpendAgainstBudgetInput = z.input<typeof spendAgainstBudgetInputSchema>;

/** A stop of a saw. `endAt` null: still down. */
export const downtimeEventSchema = z
  .object({
    startAt: date('Start'),
    endAt: date('End').nullable(),
    category: z
      .enum(DOWNTIME_CATEGORIES, { message: `Category must be one of ${DOWNTIME_CATEGORIES.join(', ')}` })
      .optional(),
    planned: z.boolean().optional(),
  })
  .refine((e) => e.endAt === null || e.endAt.getTime() >= e.startAt.getTime(), {
    path: ['endAt'],
    message: 'End must not be before the start',
  });

export const downtimeInputSchema = z
  .object({
    events: z.array(downtimeEventSchema),
    periodStart: date('Period start'),
    periodEnd: date('Period end'),
    /** Open events end here; default the period end. */
    asOf: date('As-of date').optional(),
  })
  .refine((v) => v.periodEnd.getTime() > v.periodStart.getTime(), {
    path: ['periodEnd'],
    message: 'Period end must be after its start',
  });
export type DowntimeInput = z.input<typeof downtimeInputSchema>;

export const reliabilityInputSchema = z
  .object({
    events: z.array(
      downtimeEventSchema.safeExtend({
        category: z.enum(DOWNTIME_CATEGORIES, { message: `Category must be one of ${DOWNTIME_CATEGORIES.join(', ')}` }),
        planned: z.boolean({ message: 'planned must be true or false' }),
      }),
    ),
    periodStart: date('Period start'),
    periodEnd: date('Period end'),
    asOf: date('As-of date').optional(),
    /**
     * Hours the saw was scheduled to run in the period, when its shifts are not known one by one; downtime is
     * then taken to fall inside them. Default the whole period (24 h a day).
     */
    scheduledHours: z.number().positive({ message: 'Scheduled hours must be greater than 0' }).optional(),
    /**
     * The saw's scheduled shifts, when known: downtime outside them does not count against uptime. Give these or
     * `scheduledHours`, not both.
     */
    scheduledWindows: z
      .array(
        z
          .object({ start: date('Shift start'), end: date('Shift end') })
          .refine((w) => w.end.getTime() > w.start.getTime(), {
            path: ['end'],
            message: 'Shift end must be after its start',
          }),
      )
      .optional(),
  })
  .refine((v) => v.scheduledHours === undefined || v.scheduledWindows === undefined, {
    path: ['scheduledWindows'],
    message: 'Give the scheduled hours or the scheduled shifts, not both',
  })
  .refine((v) => v.periodEnd.getTime() > v.periodStart.getTime(), {
    path: ['periodEnd'],
    message: 'Period end must be after its start',
  })
  .refine(
    (v) =>
      v.scheduledHours === undefined ||
      v.scheduledHours <= (v.periodEnd.getTime() - v.periodStart.getTime()) / 3_600_000 + 1e-9,
    {
      path: ['scheduledHours'],
      message: 'Scheduled hours must not exceed the hours in the period',
    },
  );
export type ReliabilityInput = z.input<typeof reliabilityInputSchema>;
