import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { roundBarAreaMm2 } from '../stock-area/cut-area.js';
import { inToMm, MM2_PER_IN2 } from '../units/units.js';
import {
  cuttingRateForStockMm2PerMin,
  cuttingRateIn2PerMin,
  cuttingRateMm2PerMin,
  cutTimeSForRate,
} from './cutting-rate.js';
import { cutTimeInputSchema, cuttingRateInputSchema, stockCuttingRateInputSchema } from './schema.js';

describe('cutting rate', () => {
  it('a 4 in round bar cut in 5 minutes runs at 2.51 in²/min', () => {
    // Worked by hand: π·4²/4 = 12.566 in² over 5 min = 2.513 in²/min; in mm², × 645.16 (NIST SP 811 B.8,
    // square inch) = 1,621.4 mm²/min.
    const areaMm2 = roundBarAreaMm2({ diameterMm: inToMm(4) });
    expect(cuttingRateIn2PerMin(areaMm2, 300)).toBeCloseTo(2.5133, 4);
    expect(cuttingRateMm2PerMin(areaMm2, 300)).toBeCloseTo(2.513274 * MM2_PER_IN2, 2);
    expect(cuttingRateForStockMm2PerMin({ kind: 'round_bar', diameterMm: inToMm(4) }, 3, 300)).toBeCloseTo(
      3 * cuttingRateMm2PerMin(areaMm2, 300),
      9,
    );
  });

  it('a cut of 10,000 mm² at 5,000 mm²/min takes 120 s', () => {
    expect(cutTimeSForRate(10000, 5000)).toBe(120);
    expect(cutTimeSForRate(0, 5000)).toBe(0);
  });

  it('rate and time are inverse; the in² figure is the mm² figure over 645.16 (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1e7, noNaN: true }),
        fc.double({ min: 0.1, max: 86400, noNaN: true }),
        (area, seconds) => {
          const rate = cuttingRateMm2PerMin(area, seconds);
          return (
            Math.abs(cutTimeSForRate(area, rate) - seconds) <= 1e-9 * seconds &&
            Math.abs(cuttingRateIn2PerMin(area, seconds) * MM2_PER_IN2 - rate) <= 1e-9 * rate
          );
        },
      ),
    );
  });

  it('refuses zero or negative time and rate, and negative area', () => {
    expect(() => cuttingRateMm2PerMin(1000, 0)).toThrow('Cut time must be a number greater than 0 s (got 0)');
    expect(() => cuttingRateMm2PerMin(1000, -5)).toThrow('Cut time must be a number greater than 0 s (got -5)');
    expect(() => cuttingRateMm2PerMin(-1, 60)).toThrow('Area cut must be a number of 0 mm² or more');
    expect(() => cutTimeSForRate(1000, 0)).toThrow('Cutting rate must be a number greater than 0 mm²/min');
  });
});

describe('cutting schemas', () => {
  it('accept good input and say what to fix', () => {
    expect(cuttingRateInputSchema.safeParse({ areaMm2: 7854, cutTimeS: 95 }).success).toBe(true);
    expect(cuttingRateInputSchema.safeParse({ areaMm2: 7854, cutTimeS: 0 }).error?.issues[0]?.message).toBe(
      'Cut time must be greater than 0 seconds',
    );
    expect(cuttingRateInputSchema.safeParse({ areaMm2: 7854, cutTimeS: -3 }).error?.issues[0]?.message).toBe(
      'Cut time must be greater than 0 seconds',
    );
    expect(cuttingRateInputSchema.safeParse({ areaMm2: 7854, cutTimeS: 90000 }).error?.issues[0]?.message).toMatch(
      /at most 86400 seconds/,
    );
    expect(cuttingRateInputSchema.safeParse({ areaMm2: 0, cutTimeS: 60 }).error?.issues[0]?.message).toBe(
      'Area cut must be greater than 0',
    );
    expect(cutTimeInputSchema.safeParse({ areaMm2: 100, rateMm2PerMin: 0 }).error?.issues[0]?.message).toBe(
      'Cutting rate must be greater than 0',
    );
    const stock = stockCuttingRateInputSchema.parse({
      stock: { shape: { kind: 'square_bar', sideMm: 50 }, pieceCount: 4, piecesAcross: 2 },
      cutTimeS: 120,
    });
    expect(stock.stock.pieceCount).toBe(4);
  });
});
