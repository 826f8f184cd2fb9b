import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';
import { DOWNTIME_CATEGORIES } from '../metrics/schema.js';
import {
  dateRangeQueryFields,
  notesSchema,
  queryFlagSchema,
  recordTimeSchema,
  refineDateRange,
} from '../records/schema.js';

/**
 * A stop is a time a saw was not cutting: a start, an end (null while it lasts), a category and whether it
 * was planned. A saw with an open stop is down. Stops on one saw never overlap; the database enforces it.
 */
export { DOWNTIME_CATEGORIES as STOP_CATEGORIES };
export type StopCategory = (typeof DOWNTIME_CATEGORIES)[number];

export const STOP_CATEGORY_LABELS: Record<StopCategory, string> = {
  blade_change: 'Blade change',
  blade_failure: 'Blade failure',
  mechanical: 'Mechanical',
  hydraulic: 'Hydraulic',
  electrical: 'Electrical',
  no_material_operator: 'No material or operator',
  planned_maintenance: 'Planned maintenance',
  other: 'Other',
};

export const stopSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  sawId: idSchema,
  sawAssetTag: z.string(),
  startedAt: z.string(),
  /** Null while the saw is still stopped. */
  endedAt: z.string().nullable(),
  category: z.enum(DOWNTIME_CATEGORIES),
  planned: z.boolean(),
  notes: z.string().nullable(),
  /** Minutes from start to end, or to now for an open stop. */
  durationMin: z.number(),
  createdById: idSchema.nullable(),
  createdByName: z.string().nullable(),
  endedById: idSchema.nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type Stop = z.infer<typeof stopSchema>;

const categorySchema = z.enum(DOWNTIME_CATEGORIES, {
  message: `Category must be one of ${DOWNTIME_CATEGORIES.join(', ')}`,
});
const plannedSchema = z.boolean({ message: 'Planned must be true or false' });

/** End after start: a stop of no length is a slip. */
function endAfterStart(v: { startedAt?: Date | undefined; endedAt?: Date | null | undefined }, ctx: z.RefinementCtx) {
  if (v.startedAt && v.endedAt && v.endedAt.getTime() <= v.startedAt.getTime())
    ctx.addIssue({ code: 'custom', path: ['endedAt'], message: 'The end must be after the start' });
}

/** Logging a stop: the start defaults to now; with no end the saw is down from then on. */
export const stopCreateSchema = z
  .object({
    sawId: idSchema,
    startedAt: recordTimeSchema('Start').optional(),
    endedAt: recordTimeSchema('End').nullable().default(null),
    category: categorySchema,
    planned: plannedSchema.default(false),
    notes: notesSchema.default(null),
  })
  .strict()
  .superRefine(endAfterStart);
export type StopCreate = z.input<typeof stopCreateSchema>;
export type StopCreateParsed = z.output<typeof stopCreateSchema>;

/** Ending an open stop; the end defaults to now. */
export const stopEndSchema = z.object({ endedAt: recordTimeSchema('End').optional() }).strict();
export type StopEnd = z.infer<typeof stopEndSchema>;

/** Corrections to a stop; setting `endedAt` to null reopens it (the saw is down again). */
export const stopUpdateSchema = z
  .object({
    startedAt: recordTimeSchema('Start'),
    endedAt: recordTimeSchema('End').nullable(),
    category: categorySchema,
    planned: plannedSchema,
    notes: notesSchema,
  })
  .partial()
  .strict()
  .superRefine(endAfterStart);
export type StopUpdate = z.infer<typeof stopUpdateSchema>;

export const STOP_SORTS = ['startedAt', '-startedAt'] as const;

const stopFilterFields = {
  siteId: idSchema.optional(),
  sawId: idSchema.optional(),
  category: z.enum(DOWNTIME_CATEGORIES).optional(),
  planned: queryFlagSchema.optional(),
  /** true: stops still going on. */
  open: queryFlagSchema.optional(),
  /** On startedAt. */
  ...dateRangeQueryFields,
  sort: z.enum(STOP_SORTS).default('-startedAt'),
};

export const stopListQuerySchema = pageQuerySchema.extend(stopFilterFields).superRefine(refineDateRange);
export type StopListQuery = z.infer<typeof stopListQuerySchema>;

/** The list's filters without paging: the CSV export of the same table (stops carry no unit to choose). */
export const stopExportQuerySchema = z.object(stopFilterFields).superRefine(refineDateRange);
export type StopExportQuery = z.infer<typeof stopExportQuerySchema>;
