import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import { REMOVAL_REASONS } from '../diagnosis/schema.js';
import { CAUSE_IDS } from '../diagnosis/likely-causes.js';
import { DOWNTIME_CATEGORIES } from '../metrics/schema.js';
import { CHECK_QUANTITIES } from '../site-checks/schema.js';

/**
 * One saw's history as a single timeline: its blade runs, its stops and its recorded checks, newest
 * first, each entry placed at its start. Paged by a cursor, so page 200 of a ten-year-old saw costs what page 1
 * costs: each page asks every kind of record for the entries that started before the last one shown.
 */

/** `<ISO date-time>_<id>`: the start and id of the last entry of a page; the next page starts below it. */
export const TIMELINE_CURSOR_PATTERN = /^(\d{4}-\d{2}-\d{2}T[0-9:.]+Z)_([0-9a-f-]{36})$/i;

export const sawTimelineQuerySchema = z.object({
  limit: z.coerce
    .number({ message: 'limit must be a number of entries' })
    .int({ message: 'limit must be a whole number of entries' })
    .min(1, { message: 'limit must be at least 1' })
    .max(100, { message: 'limit must be at most 100' })
    .default(20),
  before: z
    .string()
    .regex(TIMELINE_CURSOR_PATTERN, { message: 'before must be the nextBefore of the previous page' })
    .transform((value) => {
      const [, at, id] = TIMELINE_CURSOR_PATTERN.exec(value)!;
      return { at: new Date(at!), id: id!.toLowerCase() };
    })
    .refine((c) => !Number.isNaN(c.at.getTime()), { message: 'before must be the nextBefore of the previous page' })
    .optional(),
});
export type SawTimelineQuery = z.output<typeof sawTimelineQuerySchema>;

/** What every entry has: its record's id, when it started and ended (null while it lasts), and who logged it. */
const entryBase = {
  id: idSchema,
  startedAt: z.string(),
  endedAt: z.string().nullable(),
  byName: z.string().nullable(),
};

export const timelineBladeRunSchema = z.object({
  kind: z.literal('blade_run'),
  ...entryBase,
  bladeSpecId: idSchema,
  bladeSpecName: z.string(),
  removalReason: z.enum(REMOVAL_REASONS).nullable(),
  confirmedCause: z.enum(CAUSE_IDS).nullable(),
  breakInFollowed: z.boolean().nullable(),
  areaCutMm2: z.number().nullable(),
  cuts: z.number().int().nullable(),
  photoCount: z.number().int(),
});

export const timelineStopSchema = z.object({
  kind: z.literal('stop'),
  ...entryBase,
  category: z.enum(DOWNTIME_CATEGORIES),
  planned: z.boolean(),
  notes: z.string().nullable(),
  /** Minutes from start to end, or to now while the stop lasts. */
  durationMin: z.number(),
});

/** A check recorded on the saw: a moment (no end), its reading in the check's SI unit and the server's verdict. */
export const timelineCheckSchema = z.object({
  kind: z.literal('check'),
  ...entryBase,
  siteCheckId: idSchema,
  checkName: z.string(),
  quantity: z.enum(CHECK_QUANTITIES),
  reading: z.number().nullable(),
  passed: z.boolean(),
  photoCount: z.number().int(),
});

/** Add a kind here (and a source in the API's timeline service) to put another record on the timeline. */
export const timelineEntrySchema = z.discriminatedUnion('kind', [
  timelineBladeRunSchema,
  timelineStopSchema,
  timelineCheckSchema,
]);
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;
export type TimelineEntryKind = TimelineEntry['kind'];

export const sawTimelineSchema = z.object({
  sawId: idSchema,
  items: z.array(timelineEntrySchema),
  /** Every entry of the saw the caller may read, on all pages. */
  total: z.number().int().min(0),
  /** Pass as `before` for the next (older) page; null on the last page. */
  nextBefore: z.string().nullable(),
});
export type SawTimeline = z.infer<typeof sawTimelineSchema>;

/** The cursor that continues after an entry. */
export function timelineCursor(entry: { startedAt: string; id: string }): string {
  return `${new Date(entry.startedAt).toISOString()}_${entry.id}`;
}
