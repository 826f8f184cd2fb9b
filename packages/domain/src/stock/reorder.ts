import {
  stockStatusInputSchema,
  usageWindowInputSchema,
  type StockStatusInput,
  type UsageWindowInput,
} from './schema.js';

const MS_PER_DAY = 86_400_000;

/**
 * The textbook reorder point with safety stock, ROP = d × L + SS (daily demand × lead time in days + safety
 * stock), as in J. Heizer, B. Render & C. Munson, "Operations Management" (Pearson), inventory management chapter.
 */
export const REORDER_POINT_FORMULA = 'ROP = d × L + SS (Heizer, Render & Munson, Operations Management)';

export interface StockStatus {
  /** Blades per day over the usage window. */
  dailyUsage: number;
  /** Days the blades on hand last at that rate; null when none were used (with `reason`). */
  daysOfStockLeft: number | null;
  /** On hand + on order. */
  inventoryPosition: number;
  /** Blades, not rounded: compare the inventory position against it. */
  reorderPoint: number;
  reorderNow: boolean;
  reason: string;
  formula: string;
}

/**
 * Days of blade stock left and whether to reorder, for one blade spec at one site.
 *
 * daily usage d = blades used in the window ÷ window days; days left = on hand ÷ d; reorder point
 * ROP = d × lead time (days) + safety stock. Reorder when the inventory position (on hand + on order) is at or
 * below ROP; with no usage at all, only when the position has fallen below the safety stock.
 */
export function stockStatus(input: StockStatusInput): StockStatus {
  const v = stockStatusInputSchema.parse(input);
  const dailyUsage = v.usedInWindow / v.windowDays;
  const inventoryPosition = v.onHand + v.onOrder;
  const reorderPoint = dailyUsage * v.leadTimeDays + v.safetyStock;
  const base = { dailyUsage, inventoryPosition, reorderPoint, formula: REORDER_POINT_FORMULA };

  if (dailyUsage === 0) {
    const reorderNow = inventoryPosition < v.safetyStock;
    return {
      ...base,
      daysOfStockLeft: null,
      reorderNow,
      reason: reorderNow
        ? `No blades used in the last ${v.windowDays} days, but stock (${inventoryPosition}) is below the safety stock of ${v.safetyStock}.`
        : `No blades used in the last ${v.windowDays} days: at this rate the stock does not run out.`,
    };
  }

  const daysOfStockLeft = v.onHand / dailyUsage;
  const reorderNow = inventoryPosition <= reorderPoint;
  const rate = `${dailyUsage.toFixed(2)} blades/day`;
  return {
    ...base,
    daysOfStockLeft,
    reorderNow,
    reason: reorderNow
      ? `Reorder now: ${inventoryPosition} on hand and on order is at or below the reorder point of ${reorderPoint.toFixed(1)} (${rate} × ${v.leadTimeDays} days lead time + ${v.safetyStock} safety stock).`
      : `${Math.floor(daysOfStockLeft)} days of stock left at ${rate}; reorder at ${reorderPoint.toFixed(1)} blades.`,
  };
}

/** Blades used in the window (asOf − windowDays, asOf]: the consumption that `stockStatus` needs. */
export function bladesUsedInWindow(input: UsageWindowInput): number {
  const v = usageWindowInputSchema.parse(input);
  const to = v.asOf.getTime();
  const from = to - v.windowDays * MS_PER_DAY;
  return v.usedAt.filter((d) => d.getTime() > from && d.getTime() <= to).length;
}
