import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { in2ToMm2, mm2ToCm2 } from '../units/units.js';
import { bladeLife, bladeSpendAgainstBudget, costPerAreaCut } from './blade-economics.js';

describe('bladeLife', () => {
  it('averages removed blades only, with the median beside the mean', () => {
    const r = bladeLife([
      { areaCutMm2: 1_000_000, cuts: 400, removed: true },
      { areaCutMm2: 3_000_000, cuts: 1200, removed: true },
      { areaCutMm2: 200_000, cuts: 50, removed: true },
      { areaCutMm2: 500_000, cuts: 100, removed: false },
    ]);
    expect(r.bladeCount).toBe(3);
    expect(r.openRunCount).toBe(1);
    expect(r.totalAreaMm2).toBe(4_200_000);
    expect(r.meanAreaMm2PerBlade).toBe(1_400_000);
    expect(r.medianAreaMm2PerBlade).toBe(1_000_000);
    expect(r.meanCutsPerBlade).toBe(550);
  });

  it('has no averages without a finished blade, and rejects bad runs', () => {
    expect(bladeLife([{ areaCutMm2: 10, cuts: 1, removed: false }])).toMatchObject({
      bladeCount: 0,
      meanAreaMm2PerBlade: null,
      medianAreaMm2PerBlade: null,
      meanCutsPerBlade: null,
    });
    expect(() => bladeLife([{ areaCutMm2: -1, cuts: 1, removed: true }])).toThrow(/Area cut must not be negative/);
    expect(() => bladeLife([{ areaCutMm2: 1, cuts: 1.5, removed: true }])).toThrow(/Cuts must be a whole number/);
  });
});

describe('costPerAreaCut', () => {
  it('hand-worked: 12 500 cents over 1 000 000 mm² = 0.0125 ¢/mm² = 1.25 ¢/cm² = 8.0645 ¢/in²', () => {
    const r = costPerAreaCut({ currency: 'usd', costMinor: 12_500, areaCutMm2: 1_000_000 });
    expect(r.currency).toBe('USD');
    expect(r.minorPerMm2).toBe(0.0125);
    expect(r.minorPerCm2).toBeCloseTo(1.25, 12);
    // 1 in² = 645.16 mm² exactly (1 in = 25.4 mm, NIST SP 811 B.8): 0.0125 × 645.16 = 8.0645.
    expect(r.minorPerIn2).toBeCloseTo(8.0645, 12);
  });

  it('property: the same cost over the same area agrees in every unit', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 10_000_000 }),
        fc.double({ min: 1, max: 1e9, noNaN: true }),
        (cost, area) => {
          const r = costPerAreaCut({ currency: 'EUR', costMinor: cost, areaCutMm2: area });
          expect(r.minorPerCm2! * mm2ToCm2(area)).toBeCloseTo(cost, 6);
          expect(r.minorPerIn2! * (area / in2ToMm2(1))).toBeCloseTo(cost, 6);
        },
      ),
    );
  });

  it('no area cut gives null with a reason; fractional money is refused', () => {
    expect(costPerAreaCut({ currency: 'EUR', costMinor: 100, areaCutMm2: 0 })).toMatchObject({
      minorPerMm2: null,
      reason: expect.stringContaining('No area cut'),
    });
    expect(() => costPerAreaCut({ currency: 'EUR', costMinor: 10.5, areaCutMm2: 1 })).toThrow(
      /whole number of minor units/,
    );
    expect(() => costPerAreaCut({ currency: 'EURO', costMinor: 10, areaCutMm2: 1 })).toThrow(/three-letter ISO 4217/);
  });
});

describe('bladeSpendAgainstBudget', () => {
  const period = { periodStart: '2025-01-01T00:00:00Z', periodEnd: '2025-01-31T00:00:00Z' }; // 30 days

  it('hand-worked: 10 days into a 30-day month, 4 000.00 spent of 9 000.00: 44.4 % used, projected 12 000.00 (over)', () => {
    const r = bladeSpendAgainstBudget({
      ...period,
      currency: 'EUR',
      budgetMinor: 900_000,
      asOf: '2025-01-11T00:00:00Z',
      spends: [
        { amountMinor: 150_000, currency: 'EUR', at: '2025-01-02T08:00:00Z' },
        { amountMinor: 250_000, currency: 'EUR', at: '2025-01-10T08:00:00Z' },
        { amountMinor: 99_999, currency: 'EUR', at: '2025-01-20T08:00:00Z' }, // after asOf
        { amountMinor: 77_777, currency: 'EUR', at: '2024-12-31T08:00:00Z' }, // before the period
      ],
    });
    expect(r.spentMinor).toBe(400_000);
    expect(r.remainingMinor).toBe(500_000);
    expect(r.overBudget).toBe(false);
    expect(r.percentUsed).toBeCloseTo(44.444, 3);
    expect(r.elapsedFraction).toBeCloseTo(1 / 3, 12);
    expect(r.projectedMinor).toBe(1_200_000);
    expect(r.projectedOverBudget).toBe(true);
    expect(r.projectedPercent).toBeCloseTo(133.333, 3);
  });

  it('over budget at the end of the period; projection equals the spend', () => {
    const r = bladeSpendAgainstBudget({
      ...period,
      currency: 'EUR',
      budgetMinor: 1000,
      asOf: '2025-03-01T00:00:00Z',
      spends: [{ amountMinor: 1500, currency: 'EUR', at: '2025-01-15T00:00:00Z' }],
    });
    expect(r).toMatchObject({
      spentMinor: 1500,
      remainingMinor: -500,
      overBudget: true,
      projectedMinor: 1500,
      elapsedFraction: 1,
    });
  });

  it('before the period starts there is no projection; a zero budget has no percentage', () => {
    const r = bladeSpendAgainstBudget({
      ...period,
      currency: 'EUR',
      budgetMinor: 0,
      asOf: '2024-12-01T00:00:00Z',
      spends: [],
    });
    expect(r).toMatchObject({
      spentMinor: 0,
      projectedMinor: null,
      projectedOverBudget: null,
      projectedPercent: null,
      percentUsed: null,
      elapsedFraction: 0,
    });
  });

  it('refuses a spend in another currency, saying to convert', () => {
    expect(() =>
      bladeSpendAgainstBudget({
        ...period,
        currency: 'EUR',
        budgetMinor: 10,
        asOf: period.periodEnd,
        spends: [{ amountMinor: 5, currency: 'USD', at: '2025-01-02T00:00:00Z' }],
      }),
    ).toThrow(/Spend is in USD but the budget is in EUR: convert it first/);
  });

  it('property: projected spend is never below the spend so far and remaining + spent = budget', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 100_000 }), fc.integer({ min: 0, max: 29 })), { maxLength: 20 }),
        fc.integer({ min: 1, max: 30 }),
        (items, asOfDay) => {
          const day = (d: number) => new Date(Date.parse(period.periodStart) + d * 86_400_000);
          const r = bladeSpendAgainstBudget({
            ...period,
            currency: 'EUR',
            budgetMinor: 500_000,
            asOf: day(asOfDay),
            spends: items.map(([a, d]) => ({ amountMinor: a, currency: 'EUR', at: day(d) })),
          });
          expect(r.projectedMinor!).toBeGreaterThanOrEqual(r.spentMinor);
          expect(r.remainingMinor + r.spentMinor).toBe(500_000);
        },
      ),
    );
  });
});
