import { z } from 'zod';

const count = (label: string) =>
  z
    .number({ message: `${label} must be a number of blades` })
    .int({ message: `${label} must be a whole number of blades` })
    .min(0, { message: `${label} must not be negative` });

/** Default look-back for the consumption rate, days (our choice: a quarter smooths out a slow week). */
export const DEFAULT_USAGE_WINDOW_DAYS = 90;

/** Stock of one blade spec at one site, and what the reorder rule needs. */
export const stockStatusInputSchema = z.object({
  onHand: count('Blades on hand'),
  /** Ordered but not yet received; counts toward the inventory position, not toward days left. */
  onOrder: count('Blades on order').default(0),
  /** Blades of this spec put on saws in the last `windowDays`. */
  usedInWindow: count('Blades used'),
  windowDays: z
    .number({ message: 'Usage window must be a number of days' })
    .int({ message: 'Usage window must be a whole number of days' })
    .min(1, { message: 'Usage window must be at least 1 day' })
    .max(3650, { message: 'Usage window must be at most 3650 days' })
    .default(DEFAULT_USAGE_WINDOW_DAYS),
  leadTimeDays: z
    .number({ message: 'Lead time must be a number of days' })
    .min(0, { message: 'Lead time must not be negative' })
    .max(365, { message: 'Lead time must be at most 365 days' }),
  safetyStock: z
    .number({ message: 'Safety stock must be a number of blades' })
    .min(0, { message: 'Safety stock must not be negative' })
    .default(0),
});
export type StockStatusInput = z.input<typeof stockStatusInputSchema>;

export const usageWindowInputSchema = z.object({
  usedAt: z.array(z.coerce.date({ message: 'Each use must have a date' })),
  asOf: z.coerce.date({ message: 'As-of date must be a date' }),
  windowDays: z
    .number()
    .int()
    .min(1, { message: 'Usage window must be at least 1 day' })
    .max(3650)
    .default(DEFAULT_USAGE_WINDOW_DAYS),
});
export type UsageWindowInput = z.input<typeof usageWindowInputSchema>;
