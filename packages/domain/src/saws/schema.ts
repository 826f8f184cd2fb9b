import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';
import { DOWNTIME_CATEGORIES } from '../metrics/schema.js';

export const SAW_KINDS = ['horizontal', 'vertical'] as const;
export type SawKind = (typeof SAW_KINDS)[number];

/**
 * How the saw's head is fed down into the cut: by its own weight held back by a spring or counterweight
 * (`gravity_spring`), or by a hydraulic cylinder (`hydraulic`). The spring-balance head-force check applies only
 * to the first: a hydraulic head's down-force is set by its feed valve, not read on a balance. One list, kept
 * with the checks that read it.
 */
export { HEAD_FEEDS, type HeadFeed } from '../checks/schema.js';
import { HEAD_FEEDS } from '../checks/schema.js';

/**
 * in_service: available to cut; down: has an open stop (derived from the stop, never stored); retired: kept
 * for history only.
 */
export const SAW_STATUSES = ['in_service', 'down', 'retired'] as const;
export type SawStatus = (typeof SAW_STATUSES)[number];

/** What the database stores: whether the saw is retired. "Down" comes from its open stop. */
export const SAW_STORED_STATUSES = ['in_service', 'retired'] as const;
export type SawStoredStatus = (typeof SAW_STORED_STATUSES)[number];

/** Why and since when a saw is down: its open stop. */
export const sawDownSchema = z.object({
  stopId: idSchema,
  category: z.enum(DOWNTIME_CATEGORIES),
  planned: z.boolean(),
  since: z.string(),
});
export type SawDown = z.infer<typeof sawDownSchema>;

/** The blade on the saw now: its open blade run. */
export const sawBladeOnSchema = z.object({
  runId: idSchema,
  bladeSpecId: idSchema,
  bladeSpecName: z.string(),
  since: z.string(),
});
export type SawBladeOn = z.infer<typeof sawBladeOnSchema>;

/** Who last set a saw's own head-force limits and when, from the audit trail. */
export const sawHeadForceSetSchema = z.object({
  byName: z.string().nullable(),
  at: z.string(),
});
export type SawHeadForceSet = z.infer<typeof sawHeadForceSetSchema>;

const positiveMm = (label: string, max: number) =>
  z
    .number({ message: `${label} must be a number` })
    .positive({ message: `${label} must be greater than 0` })
    .max(max, { message: `${label} must be at most ${max} mm` });

/** A spring-balance limit in newtons; 1,000 N (about 225 lbf) is far above any head a balance can weigh. */
const headForceN = (label: string, least: 'zero' | 'positive') => {
  const base = z.number({ message: `${label} must be a number` });
  return (
    least === 'zero'
      ? base.min(0, { message: `${label} must not be negative` })
      : base.positive({ message: `${label} must be greater than 0` })
  ).max(1000, { message: `${label} must be at most 1000 N` });
};

/**
 * A saw as the API returns it. All lengths in millimetres, band speeds in metres per minute (SI inside;
 * the web converts at the edge for imperial sites).
 */
export const sawSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  assetTag: z.string(),
  name: z.string(),
  kind: z.enum(SAW_KINDS),
  headFeed: z.enum(HEAD_FEEDS),
  make: z.string().nullable(),
  model: z.string().nullable(),
  wheelDiameterMm: z.number(),
  centreDistanceMm: z.number(),
  bandWidthMm: z.number(),
  bandThicknessMm: z.number(),
  bandLengthMm: z.number(),
  bandSpeedMinMPerMin: z.number(),
  bandSpeedMaxMPerMin: z.number(),
  capacityRoundMm: z.number().nullable(),
  capacityRectWidthMm: z.number().nullable(),
  capacityRectHeightMm: z.number().nullable(),
  /**
   * This saw's own spring-balance limits on head down-force (N, over the last inch of travel); null means the
   * site's `head_force` setting. Read only for a gravity- or spring-fed head.
   */
  minHeadForceN: z.number().nullable(),
  maxHeadForceN: z.number().nullable(),
  /** Who set this saw's own head-force limits and when; null while it has none. */
  headForceSet: sawHeadForceSetSchema.nullable(),
  /** Retired, else down while a stop is open, else in service. */
  status: z.enum(SAW_STATUSES),
  /** The open stop, when the saw is down. */
  down: sawDownSchema.nullable(),
  /** The blade on the saw now, if one is recorded. */
  bladeOn: sawBladeOnSchema.nullable(),
  retiredAt: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Saw = z.infer<typeof sawSchema>;

/**
 * The fields as a user may send them, without defaults: an update built from these leaves every field it
 * does not name as it is (a default inside `.partial()` would silently reset it).
 */
const sawFieldShapes = {
  siteId: idSchema,
  assetTag: text(40),
  name: text(120),
  kind: z.enum(SAW_KINDS, { message: 'choose horizontal or vertical' }),
  headFeed: z.enum(HEAD_FEEDS, { message: 'choose gravity or spring, or hydraulic' }),
  make: text(80).nullable(),
  model: text(80).nullable(),
  wheelDiameterMm: positiveMm('Wheel diameter', 3000),
  centreDistanceMm: positiveMm('Centre distance', 10000),
  bandWidthMm: positiveMm('Band width', 200),
  bandThicknessMm: positiveMm('Band thickness', 5),
  bandLengthMm: positiveMm('Band length', 30000),
  bandSpeedMinMPerMin: z.number().positive({ message: 'Lowest band speed must be greater than 0' }).max(5000),
  bandSpeedMaxMPerMin: z.number().positive({ message: 'Highest band speed must be greater than 0' }).max(5000),
  capacityRoundMm: positiveMm('Round capacity', 3000).nullable(),
  capacityRectWidthMm: positiveMm('Rectangle capacity width', 5000).nullable(),
  capacityRectHeightMm: positiveMm('Rectangle capacity height', 5000).nullable(),
  /** Null: the site's setting. Below the least the head is not feeding. */
  minHeadForceN: headForceN('Least head force', 'zero').nullable(),
  maxHeadForceN: headForceN('Largest head force', 'positive').nullable(),
};

/** On create, optional details default to "not recorded". A saw is down only through a stop. */
const sawFields = z.object({
  ...sawFieldShapes,
  // Production saws are mostly fed hydraulically; a gravity- or spring-fed head is said so.
  headFeed: sawFieldShapes.headFeed.default('hydraulic'),
  make: sawFieldShapes.make.default(null),
  model: sawFieldShapes.model.default(null),
  capacityRoundMm: sawFieldShapes.capacityRoundMm.default(null),
  capacityRectWidthMm: sawFieldShapes.capacityRectWidthMm.default(null),
  capacityRectHeightMm: sawFieldShapes.capacityRectHeightMm.default(null),
  minHeadForceN: sawFieldShapes.minHeadForceN.default(null),
  maxHeadForceN: sawFieldShapes.maxHeadForceN.default(null),
});

type SawRanges = {
  bandSpeedMinMPerMin?: number;
  bandSpeedMaxMPerMin?: number;
  bandWidthMm?: number;
  bandThicknessMm?: number;
  minHeadForceN?: number | null;
  maxHeadForceN?: number | null;
};

/** Cross-field rules shared by create and update (update checks them against the merged record in the API). */
export function sawRangeIssues(v: SawRanges): { path: string; message: string }[] {
  const issues: { path: string; message: string }[] = [];
  if (
    v.bandSpeedMinMPerMin !== undefined &&
    v.bandSpeedMaxMPerMin !== undefined &&
    v.bandSpeedMinMPerMin > v.bandSpeedMaxMPerMin
  ) {
    issues.push({ path: 'bandSpeedMaxMPerMin', message: 'Highest band speed must not be below the lowest' });
  }
  if (v.bandWidthMm !== undefined && v.bandThicknessMm !== undefined && v.bandThicknessMm >= v.bandWidthMm) {
    issues.push({ path: 'bandThicknessMm', message: 'Band thickness must be smaller than the band width' });
  }
  if (
    v.minHeadForceN !== undefined &&
    v.minHeadForceN !== null &&
    v.maxHeadForceN !== undefined &&
    v.maxHeadForceN !== null &&
    v.minHeadForceN > v.maxHeadForceN
  ) {
    issues.push({ path: 'maxHeadForceN', message: 'Largest head force must not be below the least' });
  }
  return issues;
}

export const sawCreateSchema = sawFields.superRefine((value, ctx) => {
  for (const issue of sawRangeIssues(value))
    ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
});
export type SawCreate = z.input<typeof sawCreateSchema>;
export type SawCreateParsed = z.output<typeof sawCreateSchema>;

/** Any subset of the fields; moving a saw to another site is allowed only where the caller may write both. */
export const sawUpdateSchema = z
  .object(sawFieldShapes)
  .partial()
  .strict()
  .superRefine((value, ctx) => {
    for (const issue of sawRangeIssues(value))
      ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message });
  });
export type SawUpdate = z.infer<typeof sawUpdateSchema>;

export const sawListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  status: z.enum(SAW_STATUSES).optional(),
  kind: z.enum(SAW_KINDS).optional(),
  /** Matches asset tag or name, case-insensitively. */
  q: z.string().trim().max(80).optional(),
  includeRetired: z
    .enum(['true', 'false'])
    .transform((v) => v === 'true')
    .default(false),
});
export type SawListQuery = z.infer<typeof sawListQuerySchema>;
