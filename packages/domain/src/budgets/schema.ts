import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import { monthSchema } from '../fleet/period.js';
import { fleetSiteSchema } from '../fleet/schema.js';

/**
 * A monthly blade budget per site, in the site's own currency, set by administrators and managers. Spend against
 * it is the blades put on the site's saws in the month (cost fixed at install), converted into the site's currency
 * where a blade was bought in another; the month in progress gets a projection from its spend so far.
 */
export const budgetPutSchema = z
  .object({
    amountMinor: z
      .number({ message: 'Budget must be a number of minor units (cents)' })
      .int({ message: 'Budget must be a whole number of minor units (cents)' })
      .min(0, { message: 'Budget must not be negative' })
      .max(100_000_000_000, { message: 'Budget is too large' }),
  })
  .strict();
export type BudgetPut = z.infer<typeof budgetPutSchema>;

export const budgetParamsSchema = z.object({ siteId: idSchema, month: monthSchema });

export const budgetSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  month: z.string(),
  amountMinor: z.number().int(),
  currency: z.string(),
  setByName: z.string().nullable(),
  updatedAt: z.string(),
});
export type Budget = z.infer<typeof budgetSchema>;

export const budgetMonthSchema = z.object({
  month: z.string(),
  budget: budgetSchema.nullable(),
  /** Spend in the site's currency; `spendComplete` false when some blade's currency had no rate that month. */
  spentMinor: z.number().int(),
  spendComplete: z.boolean(),
  /** Budget − spend (negative: over); null without a budget. */
  varianceMinor: z.number().int().nullable(),
  percentUsed: z.number().nullable(),
  /** Share of the month gone at the time of asking (1 for past months, 0 for future ones). */
  elapsedFraction: z.number(),
  /** The month in progress only: spend at the rate so far over the whole month. */
  projectedMinor: z.number().int().nullable(),
  projectedOverBudget: z.boolean().nullable(),
});
export type BudgetMonth = z.infer<typeof budgetMonthSchema>;

export const budgetStatusSchema = z.object({
  period: z.object({ from: z.string(), to: z.string() }),
  asOf: z.string(),
  sites: z.array(
    z.object({
      site: fleetSiteSchema,
      months: z.array(budgetMonthSchema),
      budgetMinor: z.number().int(),
      spentMinor: z.number().int(),
      spendComplete: z.boolean(),
      /** Months of the period with a budget; the variance covers only those. */
      budgetedMonths: z.number().int(),
      varianceMinor: z.number().int().nullable(),
    }),
  ),
  warnings: z.array(z.string()),
});
export type BudgetStatus = z.infer<typeof budgetStatusSchema>;
