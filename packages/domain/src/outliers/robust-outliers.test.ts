import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { interquartileRange, mean, median, probit, quantile, sampleStandardDeviation } from 'simple-statistics';
import { MEAN_AD_FACTOR, MODIFIED_Z_FACTOR, findOutliers } from './robust-outliers.js';

const group = (values: number[]) => values.map((value, i) => ({ id: `saw-${i + 1}`, value }));

describe('simple-statistics against outside references', () => {
  it('NIST StRD univariate "NumAcc1": certified mean 10000002 and sample standard deviation 1', () => {
    // NIST Statistical Reference Datasets, univariate summary statistics, NumAcc1 (3 observations).
    const numAcc1 = [10000001, 10000003, 10000002];
    expect(mean(numAcc1)).toBe(10000002);
    expect(sampleStandardDeviation(numAcc1)).toBeCloseTo(1, 12);
  });

  it('NIST StRD "NumAcc2": certified mean 1.2 and sample standard deviation 0.1', () => {
    // Layout from memory: 1001 observations, 1.2 followed by 500 pairs of 1.1 and 1.3. The certified values
    // (mean 1.2, standard deviation 0.1) are NIST's.
    const numAcc2 = [1.2, ...Array.from({ length: 500 }, () => [1.1, 1.3]).flat()];
    expect(numAcc2).toHaveLength(1001);
    expect(mean(numAcc2)).toBeCloseTo(1.2, 13);
    expect(sampleStandardDeviation(numAcc2)).toBeCloseTo(0.1, 13);
  });

  it('quantile follows the linear-interpolation definition (Hyndman & Fan 1996 type 7), checked by hand', () => {
    // Sorted sample of 10: position of p is (n − 1)·p, interpolating between neighbours.
    // p = 0.25 → 2.25 → 7 + 0.25·(8 − 7) = 7.25; p = 0.5 → 4.5 → (8 + 10)/2 = 9; p = 0.75 → 6.75 → 13 + 0.75·(15 − 13) = 14.5.
    const x = [20, 3, 16, 7, 8, 13, 6, 10, 15, 8];
    expect(quantile(x, [0.25, 0.5, 0.75])).toEqual([7.25, 9, 14.5]);
    expect(median(x)).toBe(9);
    expect(interquartileRange(x)).toBe(7.25);
  });

  it('0.6745 is the 0.75 quantile of the standard normal; 0.7979 is √(2/π)', () => {
    expect(probit(0.75)).toBeCloseTo(MODIFIED_Z_FACTOR, 4);
    expect(Math.sqrt(2 / Math.PI)).toBeCloseTo(MEAN_AD_FACTOR, 4);
  });
});

describe('findOutliers', () => {
  it('hand-worked: [10, 11, 12, 12, 13, 14, 40] flags 40 as high', () => {
    // median 12; |x − 12| = 2,1,0,0,1,2,28 → MAD 1; M(40) = 0.6745 × 28 = 18.886.
    // Quartiles (type 7, n = 7): Q1 at 1.5 → 11.5, Q3 at 4.5 → 13.5; IQR 2; fences 8.5 and 16.5.
    const r = findOutliers({ items: group([10, 11, 12, 12, 13, 14, 40]) });
    expect(r).toMatchObject({
      groupSize: 7,
      median: 12,
      mad: 1,
      q1: 11.5,
      q3: 13.5,
      iqr: 2,
      lowerFence: 8.5,
      upperFence: 16.5,
      scale: 'mad',
      flaggedCount: 1,
      notice: null,
    });
    const top = r.items[6]!;
    expect(top.modifiedZ).toBeCloseTo(18.886, 3);
    expect(top).toMatchObject({ flagged: true, direction: 'high', outsideFences: true, deviationFromMedian: 28 });
    expect(top.ratioToMedian).toBeCloseTo(10 / 3, 12);
    expect(top.reason).toBe(
      '40 is unusually high: 3.333× the group median of 12; modified z-score 18.89 (limit ±3.5), above the upper fence 16.5.',
    );
    expect(r.items[0]!.modifiedZ).toBeCloseTo(-1.349, 3);
    expect(r.items[0]!.reason).toContain('in line with the group');
    // The words are worked out when first read, yet copy and serialise like any other field.
    expect(JSON.parse(JSON.stringify(top))).toEqual({ ...top, reason: top.reason });
    expect({ ...r.items[0]! }.reason).toBe(r.items[0]!.reason);
    expect(Object.keys(top)).toContain('reason');
  });

  it('flags a low value as low', () => {
    const r = findOutliers({ items: group([50, 52, 49, 51, 50, 48, 3]) });
    expect(r.items[6]).toMatchObject({ flagged: true, direction: 'low' });
    expect(r.items[6]!.reason).toContain('below the lower fence');
  });

  it('below the minimum group size nothing is flagged and the result says why', () => {
    const r = findOutliers({ items: group([1, 2, 3, 100]) });
    expect(r.flaggedCount).toBe(0);
    expect(r.notice).toBe('Only 4 comparable saws; at least 5 are needed before any is flagged.');
    expect(r.items.every((i) => i.modifiedZ === null && !i.flagged && i.reason === r.notice)).toBe(true);
    expect(findOutliers({ items: group([7]) }).notice).toContain('Only 1 comparable saw;');
    expect(findOutliers({ items: group([1, 2, 3, 100]), minGroupSize: 3 }).flaggedCount).toBe(1);
  });

  it('MAD = 0: falls back to the mean absolute deviation, or flags nothing when asked to', () => {
    // median 5; |x − 5| = 0,0,0,0,0,1,15 → MAD 0; MeanAD = 16/7; M(20) = 0.7979 × 15 / (16/7) = 5.236.
    const values = [5, 5, 5, 5, 5, 6, 20];
    const r = findOutliers({ items: group(values) });
    expect(r.mad).toBe(0);
    expect(r.scale).toBe('mean_absolute_deviation');
    expect(r.items[6]!.modifiedZ).toBeCloseTo(5.236, 3);
    expect(r.items[6]!.flagged).toBe(true);
    expect(r.items[5]!.flagged).toBe(false);
    expect(r.notice).toContain('mean absolute deviation');
    const none = findOutliers({ items: group(values), madZero: 'no_flags' });
    expect(none.flaggedCount).toBe(0);
    expect(none.items[6]!.modifiedZ).toBeNull();
    expect(none.notice).toContain('no saw is flagged');
  });

  it('all values equal: nothing to flag', () => {
    const r = findOutliers({ items: group([3, 3, 3, 3, 3]) });
    expect(r).toMatchObject({
      flaggedCount: 0,
      scale: null,
      notice: 'Every saw in the group has the same value: nothing to flag.',
    });
  });

  it('the rule picks the test: 20 in 1…10 is outside the fences but |M| = 3.148 < 3.5', () => {
    // median 6; MAD 3; M(20) = 0.6745 × 14 / 3 = 3.148. Q1 = 3.5, Q3 = 8.5 (type 7, n = 11); upper fence 16.
    const items = group([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 20]);
    const flagOf = (rule: 'modified_z' | 'fences' | 'either' | 'both') =>
      findOutliers({ items, rule }).items[10]!.flagged;
    expect(findOutliers({ items }).items[10]!.modifiedZ).toBeCloseTo(3.148, 3);
    expect([flagOf('modified_z'), flagOf('fences'), flagOf('either'), flagOf('both')]).toEqual([
      false,
      true,
      true,
      false,
    ]);
    expect(findOutliers({ items, threshold: 3 }).items[10]!.flagged).toBe(true);
    expect(findOutliers({ items: group([10, 11, 12, 12, 13, 14, 40]), rule: 'both' }).items[6]!.flagged).toBe(true);
  });

  it('a zero median gives the deviation instead of a ratio', () => {
    const r = findOutliers({ items: group([-2, -1, 0, 0, 1, 2, 50]) });
    expect(r.items[6]!.ratioToMedian).toBeNull();
    expect(r.items[6]!.reason).toContain('50 from the median');
  });

  it('an empty group is not an error', () => {
    expect(findOutliers({ items: [] })).toMatchObject({
      groupSize: 0,
      median: null,
      flaggedCount: 0,
      notice: 'No saws in the group.',
    });
  });

  it('rejects duplicate ids and non-numbers', () => {
    expect(() =>
      findOutliers({
        items: [
          { id: 'a', value: 1 },
          { id: 'a', value: 2 },
        ],
      }),
    ).toThrow(/Each item id must appear once/);
    expect(() => findOutliers({ items: [{ id: 'a', value: Number.NaN }] })).toThrow(/finite number/);
    expect(() => findOutliers({ items: [], minGroupSize: 2 })).toThrow(/at least 3/);
  });

  it('property: scores and flags do not change when every value is scaled and shifted (a·x + b, a > 0)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 5, maxLength: 25 }),
        fc.integer({ min: 1, max: 50 }),
        fc.integer({ min: -10000, max: 10000 }),
        (xs, a, b) => {
          const r1 = findOutliers({ items: group(xs), rule: 'either' });
          const r2 = findOutliers({ items: group(xs.map((x) => a * x + b)), rule: 'either' });
          expect(r2.items.map((i) => i.flagged)).toEqual(r1.items.map((i) => i.flagged));
          r2.items.forEach((it, k) => {
            const m1 = r1.items[k]!.modifiedZ;
            if (m1 === null) expect(it.modifiedZ).toBeNull();
            else expect(it.modifiedZ!).toBeCloseTo(m1, 9);
          });
        },
      ),
    );
  });

  it('property: negating every value keeps the flags and swaps high and low', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 5, maxLength: 25 }), (xs) => {
        const r1 = findOutliers({ items: group(xs) });
        const r2 = findOutliers({ items: group(xs.map((x) => -x)) });
        const swap = { high: 'low', low: 'high' } as const;
        r1.items.forEach((it, k) => {
          expect(r2.items[k]!.flagged).toBe(it.flagged);
          expect(r2.items[k]!.direction).toBe(it.direction === null ? null : swap[it.direction]);
        });
      }),
    );
  });
});
