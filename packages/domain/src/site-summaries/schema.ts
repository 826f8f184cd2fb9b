import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import { queryFlagSchema } from '../records/schema.js';

/**
 * What a site's tile shows: what people act on today. Saws down now (from their open stops), blades on saws,
 * and the blade spec that runs out first at the rate blades were put on lately (the domain's stock computation,
 * the same as the site's stock page). Worked out in SQL for every site the caller reads, in one request.
 */

export const siteSummaryQuerySchema = z.object({
  regionId: idSchema.optional(),
  includeRetired: queryFlagSchema.default(false),
});
export type SiteSummaryQuery = z.output<typeof siteSummaryQuerySchema>;

export const siteStockSummarySchema = z.object({
  /** Blade specs the site keeps stock of (received, given levels, or used in the window). */
  specs: z.number().int(),
  /** Specs at or below their reorder point. */
  toReorder: z.number().int(),
  /** The fewest days of stock left among the specs in use; null when none was used in the window. */
  fewestDaysLeft: z.number().nullable(),
  fewestDaysSpecId: idSchema.nullable(),
  fewestDaysSpecName: z.string().nullable(),
  /** Days of use the rate is taken over. */
  windowDays: z.number().int(),
});
export type SiteStockSummary = z.infer<typeof siteStockSummarySchema>;

export const siteSummarySchema = z.object({
  siteId: idSchema,
  sawsInUse: z.number().int(),
  sawsDown: z.number().int(),
  /** When the longest of the current stops began; null when no saw is down. */
  downSince: z.string().nullable(),
  /** Saws with a blade recorded on them now. */
  bladesOn: z.number().int(),
  /** Null when the caller may not read the site's stock. */
  stock: siteStockSummarySchema.nullable(),
});
export type SiteSummary = z.infer<typeof siteSummarySchema>;

export const siteSummariesSchema = z.object({ asOf: z.string(), items: z.array(siteSummarySchema) });
export type SiteSummaries = z.infer<typeof siteSummariesSchema>;
