import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bladesUsedInWindow, stockStatus } from './reorder.js';

describe('stockStatus (ROP = d × L + SS, Heizer, Render & Munson, Operations Management)', () => {
  it('worked example: 12 blades in 30 days, 10 days lead time, 2 safety: ROP 6, 5 on hand → reorder, 12.5 days left', () => {
    // d = 12 / 30 = 0.4 blades/day; ROP = 0.4 × 10 + 2 = 6; days left = 5 / 0.4 = 12.5.
    const r = stockStatus({ onHand: 5, usedInWindow: 12, windowDays: 30, leadTimeDays: 10, safetyStock: 2 });
    expect(r.dailyUsage).toBeCloseTo(0.4, 12);
    expect(r.reorderPoint).toBeCloseTo(6, 12);
    expect(r.daysOfStockLeft).toBeCloseTo(12.5, 12);
    expect(r.reorderNow).toBe(true);
    expect(r.reason).toContain('Reorder now');
    expect(r.formula).toContain('ROP = d × L + SS');
  });

  it('blades already on order count toward the position, not toward days left', () => {
    const r = stockStatus({
      onHand: 5,
      onOrder: 4,
      usedInWindow: 12,
      windowDays: 30,
      leadTimeDays: 10,
      safetyStock: 2,
    });
    expect(r.inventoryPosition).toBe(9);
    expect(r.reorderNow).toBe(false);
    expect(r.daysOfStockLeft).toBeCloseTo(12.5, 12);
    expect(r.reason).toBe('12 days of stock left at 0.40 blades/day; reorder at 6.0 blades.');
  });

  it('reorders exactly at the reorder point', () => {
    expect(
      stockStatus({ onHand: 6, usedInWindow: 12, windowDays: 30, leadTimeDays: 10, safetyStock: 2 }).reorderNow,
    ).toBe(true);
    expect(
      stockStatus({ onHand: 7, usedInWindow: 12, windowDays: 30, leadTimeDays: 10, safetyStock: 2 }).reorderNow,
    ).toBe(false);
  });

  it('zero consumption: days left is null with a reason; reorder only below safety stock', () => {
    const r = stockStatus({ onHand: 3, usedInWindow: 0, leadTimeDays: 14, safetyStock: 2 });
    expect(r).toMatchObject({ dailyUsage: 0, daysOfStockLeft: null, reorderPoint: 2, reorderNow: false });
    expect(r.reason).toBe('No blades used in the last 90 days: at this rate the stock does not run out.');
    const low = stockStatus({ onHand: 1, usedInWindow: 0, leadTimeDays: 14, safetyStock: 2 });
    expect(low.reorderNow).toBe(true);
    expect(low.reason).toContain('below the safety stock');
    expect(stockStatus({ onHand: 0, usedInWindow: 0, leadTimeDays: 14 }).reorderNow).toBe(false);
  });

  it('rejects bad input with messages that say what to fix', () => {
    expect(() => stockStatus({ onHand: -1, usedInWindow: 0, leadTimeDays: 1 })).toThrow(
      /Blades on hand must not be negative/,
    );
    expect(() => stockStatus({ onHand: 1.5, usedInWindow: 0, leadTimeDays: 1 })).toThrow(/whole number of blades/);
    expect(() => stockStatus({ onHand: 1, usedInWindow: 0, leadTimeDays: 1, windowDays: 0 })).toThrow(/at least 1 day/);
    expect(() => stockStatus({ onHand: 1, usedInWindow: 0, leadTimeDays: -3 })).toThrow(
      /Lead time must not be negative/,
    );
  });

  it('property: days left × daily usage = on hand, and more stock never makes a reorder more urgent', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 500 }),
        fc.integer({ min: 1, max: 500 }),
        fc.integer({ min: 1, max: 365 }),
        fc.integer({ min: 0, max: 120 }),
        fc.integer({ min: 0, max: 50 }),
        (onHand, used, windowDays, lead, safety) => {
          const r = stockStatus({ onHand, usedInWindow: used, windowDays, leadTimeDays: lead, safetyStock: safety });
          expect(r.daysOfStockLeft! * r.dailyUsage).toBeCloseTo(onHand, 6);
          expect(r.reorderPoint).toBeCloseTo((used / windowDays) * lead + safety, 9);
          const more = stockStatus({
            onHand: onHand + 1,
            usedInWindow: used,
            windowDays,
            leadTimeDays: lead,
            safetyStock: safety,
          });
          if (!r.reorderNow) expect(more.reorderNow).toBe(false);
        },
      ),
    );
  });
});

describe('bladesUsedInWindow', () => {
  it('counts uses in (asOf − N days, asOf]', () => {
    const asOf = '2025-05-31T12:00:00Z';
    const usedAt = [
      '2025-05-31T12:00:00Z',
      '2025-05-20T00:00:00Z',
      '2025-05-01T12:00:00Z',
      '2025-05-01T12:00:01Z',
      '2025-06-01T00:00:00Z',
    ];
    // 30 days back from 31 May 12:00 is 1 May 12:00, excluded; 1 May 12:00:01 is included; 1 June is after asOf.
    expect(bladesUsedInWindow({ usedAt, asOf, windowDays: 30 })).toBe(3);
    expect(bladesUsedInWindow({ usedAt: [], asOf })).toBe(0);
    expect(() => bladesUsedInWindow({ usedAt: ['yesterday'], asOf })).toThrow(/Each use must have a date/);
  });
});
