import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';
import { currencySchema } from '../sites/schema.js';
import { bladeSpecRefSchema } from '../blade-specs/schema.js';
import {
  CLOCK_SKEW_MS,
  dateRangeQueryFields,
  moneyMinorSchema,
  notesSchema,
  refineDateRange,
} from '../records/schema.js';
import { DEFAULT_USAGE_WINDOW_DAYS } from '../stock/schema.js';

/**
 * Blades in a site's stock. Receipts add blades of one spec; each blade run that draws a blade from stock takes
 * one away from the oldest receipt that still has blades (first in, first out), and its cost is that receipt's
 * unit cost. On hand per spec = blades received − blades drawn.
 */

/** Most blades on one receipt: more is a typo (a price typed into the quantity). */
export const MAX_RECEIPT_QUANTITY = 10_000;

/** A calendar date `YYYY-MM-DD`, not after today (allowing for sites ahead of UTC). */
const receivedOnSchema = z.iso
  .date({ message: 'Received on must be a date such as 2026-03-04' })
  .refine((d) => Date.parse(`${d}T00:00:00Z`) <= Date.now() + 14 * 3600_000 + CLOCK_SKEW_MS, {
    message: 'Received on must not be in the future',
  })
  .refine((d) => d >= '1990-01-01', { message: 'Received on must be on or after 1990-01-01' });

export const stockReceiptSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  bladeSpecId: idSchema,
  bladeSpecName: z.string(),
  quantity: z.number().int(),
  /** Blades of this receipt already put on saws. */
  drawn: z.number().int(),
  unitCostMinor: z.number().int(),
  currency: z.string(),
  receivedOn: z.string(),
  reference: z.string().nullable(),
  notes: z.string().nullable(),
  createdById: idSchema.nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type StockReceipt = z.infer<typeof stockReceiptSchema>;

const quantitySchema = z
  .number({ message: 'Quantity must be a number of blades' })
  .int({ message: 'Quantity must be a whole number of blades' })
  .min(1, { message: 'Quantity must be at least 1 blade' })
  .max(MAX_RECEIPT_QUANTITY, { message: `Quantity must be at most ${MAX_RECEIPT_QUANTITY} blades` });

const receiptFieldShapes = {
  siteId: idSchema,
  bladeSpecId: idSchema,
  quantity: quantitySchema,
  unitCostMinor: moneyMinorSchema('Unit cost'),
  currency: currencySchema,
  receivedOn: receivedOnSchema,
  reference: text(80).nullable(),
  notes: notesSchema,
};

/** Currency defaults to the site's; the reference (lot or delivery note) and notes are optional. */
export const stockReceiptCreateSchema = z.object({
  ...receiptFieldShapes,
  currency: receiptFieldShapes.currency.optional(),
  reference: receiptFieldShapes.reference.default(null),
  notes: receiptFieldShapes.notes.default(null),
});
export type StockReceiptCreate = z.input<typeof stockReceiptCreateSchema>;
export type StockReceiptCreateParsed = z.output<typeof stockReceiptCreateSchema>;

/** The site stays; the quantity may not fall below the blades already drawn from the receipt. */
export const stockReceiptUpdateSchema = z.object(receiptFieldShapes).omit({ siteId: true }).partial().strict();
export type StockReceiptUpdate = z.infer<typeof stockReceiptUpdateSchema>;

export const STOCK_RECEIPT_SORTS = ['receivedOn', '-receivedOn'] as const;
export const stockReceiptListQuerySchema = pageQuerySchema
  .extend({
    siteId: idSchema.optional(),
    bladeSpecId: idSchema.optional(),
    ...dateRangeQueryFields,
    sort: z.enum(STOCK_RECEIPT_SORTS).default('-receivedOn'),
  })
  .superRefine(refineDateRange);
export type StockReceiptListQuery = z.infer<typeof stockReceiptListQuerySchema>;

/**
 * Reorder settings for one spec at one site. Defaults when a site has set none: our choice, not a published
 * figure — 14 days lead time (a typical blade welder's delivery) and no safety stock.
 */
export const DEFAULT_STOCK_LEVELS = { leadTimeDays: 14, safetyStock: 0 } as const;

export const stockLevelsInputSchema = z
  .object({
    leadTimeDays: z
      .number({ message: 'Lead time must be a number of days' })
      .int({ message: 'Lead time must be a whole number of days' })
      .min(0, { message: 'Lead time must not be negative' })
      .max(365, { message: 'Lead time must be at most 365 days' }),
    safetyStock: z
      .number({ message: 'Safety stock must be a number of blades' })
      .int({ message: 'Safety stock must be a whole number of blades' })
      .min(0, { message: 'Safety stock must not be negative' })
      .max(MAX_RECEIPT_QUANTITY, { message: `Safety stock must be at most ${MAX_RECEIPT_QUANTITY} blades` }),
  })
  .strict();
export type StockLevelsInput = z.infer<typeof stockLevelsInputSchema>;

export const siteStockQuerySchema = z.object({
  windowDays: z.coerce
    .number({ message: 'Usage window must be a number of days' })
    .int({ message: 'Usage window must be a whole number of days' })
    .min(7, { message: 'Usage window must be at least 7 days' })
    .max(730, { message: 'Usage window must be at most 730 days' })
    .default(DEFAULT_USAGE_WINDOW_DAYS),
});
export type SiteStockQuery = z.infer<typeof siteStockQuerySchema>;

/** One spec's stock at a site, with days left and the reorder point from the domain's stock computation. */
export const stockLineSchema = z.object({
  bladeSpec: bladeSpecRefSchema,
  received: z.number().int(),
  drawn: z.number().int(),
  onHand: z.number().int(),
  /** Blades of this spec put on the site's saws in the usage window (from stock or not). */
  usedInWindow: z.number().int(),
  leadTimeDays: z.number(),
  safetyStock: z.number(),
  /** Null while the site uses Kerfline's starting values (`DEFAULT_STOCK_LEVELS`). */
  levelsSetAt: z.string().nullable(),
  levelsSetByName: z.string().nullable(),
  dailyUsage: z.number(),
  daysOfStockLeft: z.number().nullable(),
  reorderPoint: z.number(),
  reorderNow: z.boolean(),
  reason: z.string(),
  formula: z.string(),
});
export type StockLine = z.infer<typeof stockLineSchema>;

export const siteStockSchema = z.object({
  siteId: idSchema,
  asOf: z.string(),
  windowDays: z.number().int(),
  items: z.array(stockLineSchema),
});
export type SiteStock = z.infer<typeof siteStockSchema>;

/** A movement of stock: blades received (+quantity) or one blade drawn for a run on a saw (−1). */
export const stockMovementSchema = z.object({
  kind: z.enum(['receipt', 'draw']),
  at: z.string(),
  bladeSpecId: idSchema,
  bladeSpecName: z.string(),
  quantity: z.number().int(),
  stockReceiptId: idSchema,
  reference: z.string().nullable(),
  bladeRunId: idSchema.nullable(),
  sawId: idSchema.nullable(),
  sawAssetTag: z.string().nullable(),
  unitCostMinor: z.number().int(),
  currency: z.string(),
});
export type StockMovement = z.infer<typeof stockMovementSchema>;

const stockMovementFilterFields = { bladeSpecId: idSchema.optional(), ...dateRangeQueryFields };

export const stockMovementListQuerySchema = pageQuerySchema
  .extend(stockMovementFilterFields)
  .superRefine(refineDateRange);
export type StockMovementListQuery = z.infer<typeof stockMovementListQuerySchema>;

/** The list's filters without paging: the CSV export of the same table (movements carry no unit to choose). */
export const stockMovementExportQuerySchema = z.object(stockMovementFilterFields).superRefine(refineDateRange);
export type StockMovementExportQuery = z.infer<typeof stockMovementExportQuerySchema>;
