import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';
import { DOWNTIME_CATEGORIES, type DowntimeCategory } from '../metrics/schema.js';
import { UNIT_SYSTEMS } from '../sites/schema.js';
import { SAW_KINDS } from '../saws/schema.js';
import { MATERIAL_GROUPS } from '../band-speed/schema.js';
import { REMOVAL_REASONS } from '../diagnosis/schema.js';
import { MAX_PERIOD_MONTHS, addMonths, defaultPeriod, monthSchema, periodLength } from './period.js';

/**
 * What the fleet screens ask for and what they get: figures per site and month, per site over a period, and per
 * saw over a period, every one computed in SQL within the caller's scope. Quantities in SI (mm², hours), money in
 * integer minor units with the currency beside it.
 */

/** A comma-separated list of ids in a query string (`sites=a,b`). */
export const idListSchema = z
  .string()
  .transform((s) =>
    s
      .split(',')
      .map((x) => x.trim())
      .filter(Boolean),
  )
  .pipe(z.array(idSchema).max(200, { message: 'must name at most 200 ids' }));

const periodFields = {
  from: monthSchema.optional(),
  to: monthSchema.optional(),
};

type PeriodQueryInput = { from?: string | undefined; to?: string | undefined };

/** Fills a period's missing ends: the last twelve whole months by default, or twelve months ending at `to`. */
export function resolvePeriod<T extends PeriodQueryInput>(
  q: T,
  now = new Date(),
): Omit<T, 'from' | 'to'> & { from: string; to: string } {
  const fallback = defaultPeriod(now);
  const to = q.to ?? (q.from ? addMonths(q.from, 11) : fallback.to);
  const from = q.from ?? (q.to ? addMonths(q.to, -11) : fallback.from);
  return { ...q, from, to };
}

function refinePeriod(q: { from: string; to: string }, ctx: z.RefinementCtx): void {
  if (q.to < q.from)
    ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last month must not be before the first' });
  else if (periodLength(q) > MAX_PERIOD_MONTHS)
    ctx.addIssue({ code: 'custom', path: ['from'], message: `A period may span at most ${MAX_PERIOD_MONTHS} months` });
}

/** `?from=2026-01&to=2026-06&sites=…`: the fleet screens' filters, as they sit in the URL. */
export const fleetQuerySchema = z
  .object({ ...periodFields, sites: idListSchema.optional() })
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
export type FleetQuery = z.output<typeof fleetQuerySchema>;
export type FleetQueryInput = z.input<typeof fleetQuerySchema>;

/** A period query for one site's or one saw's figures. */
export const periodQuerySchema = z
  .object(periodFields)
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
export type PeriodQuery = z.output<typeof periodQuerySchema>;

/** A saw's blade runs in a period, paged. */
export const periodRunsQuerySchema = pageQuerySchema
  .extend(periodFields)
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
export type PeriodRunsQuery = z.output<typeof periodRunsQuerySchema>;

const missingPartSchema = z.object({ amountMinor: z.number().int(), currency: z.string(), month: z.string() });

/** Money in the reporting currency: what could be converted, and what could not for want of a rate. */
export const convertedMoneySchema = z.object({
  amountMinor: z.number().int(),
  currency: z.string(),
  complete: z.boolean(),
  missing: z.array(missingPartSchema),
});
export type ConvertedMoney = z.infer<typeof convertedMoneySchema>;

export const stopHoursSchema = z.record(z.enum(DOWNTIME_CATEGORIES), z.number());
export type StopHoursByCategory = Record<DowntimeCategory, number>;

/**
 * The figures of one site, one saw or the fleet over one bucket of time (a month or a period). Definitions in
 * DEVELOPERS.md ("Fleet figures"); each is checked against the domain function of the same name.
 */
export const figuresSchema = z.object({
  /** Blades put on a saw in the bucket (runs by install time). */
  bladesUsed: z.number().int(),
  /** Their cost as fixed at install, in the reporting currency. */
  spend: convertedMoneySchema,
  /** Blades taken off in the bucket (runs by removal time): finished lives. */
  bladesRemoved: z.number().int(),
  /** Of those, the ones with their area cut recorded: the blade-life and cost-per-area figures use these. */
  bladesWithArea: z.number().int(),
  areaCutMm2: z.number(),
  /** Cost of the blades with area ÷ their area, minor units of the reporting currency per mm²; null without area or with a missing rate. */
  costPerAreaMinorPerMm2: z.number().nullable(),
  costPerAreaComplete: z.boolean(),
  meanLifeMm2: z.number().nullable(),
  medianLifeMm2: z.number().nullable(),
  meanCutsPerBlade: z.number().nullable(),
  /** Hours stopped per category, clipped to the bucket and the saw's time in service. */
  stopHours: stopHoursSchema,
  scheduledHours: z.number(),
  downtimeHours: z.number(),
  uptimeHours: z.number(),
  failures: z.number().int(),
  failureDowntimeHours: z.number(),
  mtbfHours: z.number().nullable(),
  mttrHours: z.number().nullable(),
  /** Operational availability (IEC 60050-192), 0–1; null without scheduled time. */
  operationalAvailability: z.number().nullable(),
  /** Runs installed in the bucket whose break-in was recorded, and of those the ones that followed it. */
  breakInRecorded: z.number().int(),
  breakInFollowed: z.number().int(),
});
export type Figures = z.infer<typeof figuresSchema>;

/** A site as the fleet screens name it, with its mark slot (`siteMarkSlots`: the same for every reader of the site). */
export const fleetSiteSchema = z.object({
  id: idSchema,
  code: z.string(),
  name: z.string(),
  regionId: idSchema,
  currency: z.string(),
  unitSystem: z.enum(UNIT_SYSTEMS),
  timeZone: z.string(),
  colourIndex: z.number().int().min(0),
});
export type FleetSite = z.infer<typeof fleetSiteSchema>;

const periodSchema = z.object({ from: z.string(), to: z.string() });

export const fleetOverviewSchema = z.object({
  period: periodSchema,
  previous: periodSchema,
  asOf: z.string(),
  reportingCurrency: z.string(),
  sites: z.array(z.object({ site: fleetSiteSchema, current: figuresSchema, previous: figuresSchema })),
  /** Every site the caller may pick in the filter (the shown ones are `sites`). */
  choices: z.array(fleetSiteSchema),
  fleet: z.object({ current: figuresSchema, previous: figuresSchema }),
  months: z.array(z.object({ siteId: idSchema, month: z.string(), figures: figuresSchema })),
  /** Missing exchange rates the figures needed, in words. */
  warnings: z.array(z.string()),
});
export type FleetOverview = z.infer<typeof fleetOverviewSchema>;

/** A saw as the fleet screens list it. */
export const fleetSawSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  assetTag: z.string(),
  name: z.string(),
  kind: z.enum(SAW_KINDS),
  retiredAt: z.string().nullable(),
  /** The material group most of its blades in the period were put on for; null when none was recorded. */
  mainMaterial: z.enum(MATERIAL_GROUPS).nullable(),
});
export type FleetSaw = z.infer<typeof fleetSawSchema>;

export const siteFiguresSchema = z.object({
  period: periodSchema,
  asOf: z.string(),
  reportingCurrency: z.string(),
  site: fleetSiteSchema,
  figures: figuresSchema,
  months: z.array(z.object({ month: z.string(), figures: figuresSchema })),
  saws: z.array(z.object({ saw: fleetSawSchema, figures: figuresSchema })),
  warnings: z.array(z.string()),
});
export type SiteFigures = z.infer<typeof siteFiguresSchema>;

export const sawFiguresSchema = z.object({
  period: periodSchema,
  asOf: z.string(),
  reportingCurrency: z.string(),
  site: fleetSiteSchema,
  saw: fleetSawSchema,
  figures: figuresSchema,
  months: z.array(z.object({ month: z.string(), figures: figuresSchema })),
  /** Blades taken off in the period by reason. */
  removalReasons: z.record(z.enum(REMOVAL_REASONS), z.number().int()),
  warnings: z.array(z.string()),
});
export type SawFigures = z.infer<typeof sawFiguresSchema>;

/** One blade run in the drill-down: its life and cost. */
export const fleetRunSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  sawId: idSchema,
  bladeSpecId: idSchema,
  bladeSpecName: z.string(),
  installedAt: z.string(),
  removedAt: z.string().nullable(),
  removalReason: z.enum(REMOVAL_REASONS).nullable(),
  areaCutMm2: z.number().nullable(),
  cuts: z.number().int().nullable(),
  costMinor: z.number().int(),
  currency: z.string(),
  breakInFollowed: z.boolean().nullable(),
  materialGroup: z.enum(MATERIAL_GROUPS).nullable(),
});
export type FleetRun = z.infer<typeof fleetRunSchema>;

/** Per site: how well two habits are kept, and the blade life with and without the first. */
export const practiceSchema = z.object({
  period: periodSchema,
  sites: z.array(
    z.object({
      site: fleetSiteSchema,
      breakInRecorded: z.number().int(),
      breakInFollowed: z.number().int(),
      /** Followed ÷ recorded, 0–1; null when none was recorded. */
      breakInShare: z.number().nullable(),
      /** Median area per finished blade (removed in the period) whose break-in was followed, and not followed. */
      medianLifeFollowedMm2: z.number().nullable(),
      medianLifeSkippedMm2: z.number().nullable(),
      bladesFollowed: z.number().int(),
      bladesSkipped: z.number().int(),
      /** Checks that fell due in the period, and of those the ones done by their due date; null while checks are not recorded. */
      checksDue: z.number().int().nullable(),
      checksOnTime: z.number().int().nullable(),
      checksOnTimeShare: z.number().nullable(),
      /** Median area per blade taken off in the period whose blade-change checks were all on time, and of the others. */
      medianLifeChecksOnTimeMm2: z.number().nullable(),
      medianLifeChecksLateMm2: z.number().nullable(),
    }),
  ),
});
export type Practice = z.infer<typeof practiceSchema>;

/** The tables each fleet screen exports (every chart's numbers are one of them). */
export const OVERVIEW_TABLES = ['sites', 'months', 'stop-hours', 'blade-life'] as const;
export const SITE_TABLES = ['saws', 'months'] as const;
export const SAW_TABLES = ['months', 'reasons', 'runs'] as const;

const unitsField = { units: z.enum(UNIT_SYSTEMS, { message: 'Units must be metric or imperial' }).default('metric') };

/** `?table=…&units=…` plus the screen's own filters: an export is scoped exactly like the screen. */
export const overviewExportQuerySchema = z
  .object({ ...periodFields, sites: idListSchema.optional(), table: z.enum(OVERVIEW_TABLES), ...unitsField })
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
export const siteExportQuerySchema = z
  .object({ ...periodFields, table: z.enum(SITE_TABLES), ...unitsField })
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
export const sawExportQuerySchema = z
  .object({ ...periodFields, table: z.enum(SAW_TABLES), ...unitsField })
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
export const practiceExportQuerySchema = z
  .object({ ...periodFields, sites: idListSchema.optional(), ...unitsField })
  .transform((q) => resolvePeriod(q))
  .superRefine(refinePeriod);
