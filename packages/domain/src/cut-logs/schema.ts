import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';
import { materialGroupSchema, MATERIAL_GROUPS } from '../band-speed/schema.js';
import { stockCutSchema, stockShapeSchema } from '../stock-area/schema.js';
import { MAX_CUT_TIME_S } from '../cutting/schema.js';
import {
  dateRangeQueryFields,
  notesSchema,
  recordTimeSchema,
  recordWarningSchema,
  refineDateRange,
} from '../records/schema.js';

/**
 * A cut log is optional detail a site may keep: what was cut (stock shape and size, material, how many cuts),
 * at what band speed, and the feed or the cut time. Kerfline works out and stores the cut area and the teeth in
 * the work (with the pitch of the blade on the saw at the time), and returns warnings where the cut was outside
 * the trade's limits. The log belongs to the blade run that was on the saw when it was cut.
 */

export const MAX_CUTS_PER_LOG = 10_000;

export const cutLogSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  sawId: idSchema,
  /** The run of the blade on the saw at `cutAt`; null when no blade was recorded on it then. */
  bladeRunId: idSchema.nullable(),
  cutAt: z.string(),
  shape: stockShapeSchema,
  pieceCount: z.number().int(),
  piecesAcross: z.number().int(),
  materialGroup: z.enum(MATERIAL_GROUPS),
  /** Cuts of this kind logged at once. */
  quantity: z.number().int(),
  bandSpeedMPerMin: z.number().nullable(),
  feedMmPerMin: z.number().nullable(),
  cutTimeS: z.number().nullable(),
  /** Cut face area of one cut (all pieces of the bundle), mm². */
  areaPerCutMm2: z.number(),
  /** `areaPerCutMm2` × `quantity`, mm²: what the log adds to the blade's life. */
  areaCutMm2: z.number(),
  /** Least and greatest teeth in the work with the blade's pitch; null without a blade run. */
  teethInWorkMin: z.number().nullable(),
  teethInWorkMax: z.number().nullable(),
  warnings: z.array(recordWarningSchema),
  notes: z.string().nullable(),
  createdById: idSchema.nullable(),
  createdAt: z.string(),
});
export type CutLog = z.infer<typeof cutLogSchema>;

export const cutLogCreateSchema = z
  .object({
    sawId: idSchema,
    cutAt: recordTimeSchema('Cut at').optional(),
    stock: stockCutSchema,
    materialGroup: materialGroupSchema,
    quantity: z
      .number({ message: 'Quantity must be a number of cuts' })
      .int({ message: 'Quantity must be a whole number of cuts' })
      .min(1, { message: 'Quantity must be at least 1 cut' })
      .max(MAX_CUTS_PER_LOG, { message: `Quantity must be at most ${MAX_CUTS_PER_LOG} cuts` })
      .default(1),
    bandSpeedMPerMin: z
      .number({ message: 'Band speed must be a number (m/min)' })
      .positive({ message: 'Band speed must be greater than 0 m/min' })
      .max(5000, { message: 'Band speed must be at most 5000 m/min' })
      .nullable()
      .default(null),
    feedMmPerMin: z
      .number({ message: 'Feed must be a number (mm/min)' })
      .positive({ message: 'Feed must be greater than 0 mm/min' })
      .max(5000, { message: 'Feed must be at most 5000 mm/min' })
      .nullable()
      .default(null),
    cutTimeS: z
      .number({ message: 'Cut time must be a number (seconds)' })
      .positive({ message: 'Cut time must be greater than 0 seconds' })
      .max(MAX_CUT_TIME_S, { message: `Cut time must be at most ${MAX_CUT_TIME_S} seconds (24 hours)` })
      .nullable()
      .default(null),
    notes: notesSchema.default(null),
  })
  .strict();
export type CutLogCreate = z.input<typeof cutLogCreateSchema>;
export type CutLogCreateParsed = z.output<typeof cutLogCreateSchema>;

export const CUT_LOG_SORTS = ['cutAt', '-cutAt'] as const;

export const cutLogListQuerySchema = pageQuerySchema
  .extend({
    siteId: idSchema.optional(),
    sawId: idSchema.optional(),
    bladeRunId: idSchema.optional(),
    materialGroup: z.enum(MATERIAL_GROUPS).optional(),
    /** On cutAt. */
    ...dateRangeQueryFields,
    sort: z.enum(CUT_LOG_SORTS).default('-cutAt'),
  })
  .superRefine(refineDateRange);
export type CutLogListQuery = z.infer<typeof cutLogListQuerySchema>;
