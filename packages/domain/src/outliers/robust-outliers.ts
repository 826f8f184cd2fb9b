import { mean, median, medianAbsoluteDeviation, quantile } from 'simple-statistics';
import { outlierInputSchema, type OutlierInput, type OutlierRule } from './schema.js';

/**
 * Modified z-score M = 0.6745 · (x − median) / MAD (Iglewicz & Hoaglin 1993, "How to Detect and Handle
 * Outliers"; NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.17). 0.6745 is the 0.75 quantile of the
 * standard normal, so M is on the scale of an ordinary z-score for normal data.
 */
export const MODIFIED_Z_FACTOR = 0.6745;

/**
 * Fallback when MAD = 0: M = (x − median) / (1.253314 · MeanAD) = 0.7979 · (x − median) / MeanAD, where MeanAD
 * is the mean absolute deviation from the median and 0.7979 ≈ √(2/π) is the mean absolute deviation of the
 * standard normal. From memory (a variant used by a common statistics package), not from the 1993 book.
 */
export const MEAN_AD_FACTOR = 0.7979;

export type OutlierScale = 'mad' | 'mean_absolute_deviation';

export interface OutlierItem {
  id: string;
  value: number;
  /** Null when the group is too small or has no spread to scale by. */
  modifiedZ: number | null;
  outsideFences: boolean;
  flagged: boolean;
  direction: 'high' | 'low' | null;
  /** value − median, in the value's own unit. */
  deviationFromMedian: number;
  /** value ÷ median; null when the median is 0. */
  ratioToMedian: number | null;
  reason: string;
}

export interface OutlierResult {
  groupSize: number;
  rule: OutlierRule;
  threshold: number;
  median: number | null;
  mad: number | null;
  /** Which spread M was scaled by; null when M could not be computed. */
  scale: OutlierScale | null;
  q1: number | null;
  q3: number | null;
  iqr: number | null;
  lowerFence: number | null;
  upperFence: number | null;
  flaggedCount: number;
  /** Why nothing (or something unusual) was done for the whole group; null when the normal path ran. */
  notice: string | null;
  items: OutlierItem[];
}

const fmt = (x: number): string => String(Number(x.toPrecision(4)));

/**
 * Robust outliers among comparable saws. Each value gets the modified z-score and is compared with Tukey's
 * fences Q1 − k·IQR and Q3 + k·IQR (k = 1.5). Median, MAD and quartiles come from simple-statistics, whose
 * quantile is the linear-interpolation definition (type 7 of Hyndman & Fan 1996, R's default).
 *
 * - Fewer items than `minGroupSize` (default 5): nothing is flagged, and `notice` says why.
 * - MAD = 0: by default M falls back to the mean absolute deviation (see `MEAN_AD_FACTOR`); with
 *   `madZero: 'no_flags'` nothing is flagged. If every value is equal nothing is flagged.
 * - `rule` picks the flag: the modified z-score (default), the fences, either, or both.
 */
export function findOutliers(input: OutlierInput): OutlierResult {
  const v = outlierInputSchema.parse(input);
  const values = v.items.map((i) => i.value);
  const n = values.length;

  if (n === 0) {
    return {
      groupSize: 0,
      rule: v.rule,
      threshold: v.threshold,
      median: null,
      mad: null,
      scale: null,
      q1: null,
      q3: null,
      iqr: null,
      lowerFence: null,
      upperFence: null,
      flaggedCount: 0,
      notice: 'No saws in the group.',
      items: [],
    };
  }

  const med = median(values);
  const mad = medianAbsoluteDeviation(values);
  const [q1, q3] = quantile(values, [0.25, 0.75]) as [number, number];
  const iqr = q3 - q1;
  const lowerFence = q1 - v.fenceMultiplier * iqr;
  const upperFence = q3 + v.fenceMultiplier * iqr;
  const tooSmall = n < v.minGroupSize;

  let scale: OutlierScale | null = null;
  let divisor = 0;
  let notice: string | null = null;
  if (tooSmall) {
    notice = `Only ${n} comparable saw${n === 1 ? '' : 's'}; at least ${v.minGroupSize} are needed before any is flagged.`;
  } else if (mad > 0) {
    scale = 'mad';
    divisor = mad / MODIFIED_Z_FACTOR;
  } else {
    const meanAd = mean(values.map((x) => Math.abs(x - med)));
    if (meanAd === 0) {
      notice = 'Every saw in the group has the same value: nothing to flag.';
    } else if (v.madZero === 'no_flags') {
      notice = 'More than half the saws share the same value (MAD = 0): no saw is flagged.';
    } else {
      scale = 'mean_absolute_deviation';
      divisor = meanAd / MEAN_AD_FACTOR;
      notice =
        'More than half the saws share the same value (MAD = 0): scores use the mean absolute deviation instead.';
    }
  }
  // Without a usable scale for M (too few saws, all equal, or MAD = 0 under 'no_flags') nothing is flagged,
  // by the fences either, so one group never gets two contradicting verdicts.
  const canFlag = scale !== null;

  // How each value was judged, in words. Worked out when first read: a fleet-wide review judges thousands of saws
  // and reads the words of the few it flags, and formatting every number was a good share of its time.
  const reasonOf = (item: Omit<OutlierItem, 'id' | 'reason'>): string => {
    if (!canFlag) return notice!;
    const { value, modifiedZ, outsideFences, flagged, direction, deviationFromMedian, ratioToMedian } = item;
    const zText = `modified z-score ${fmt(modifiedZ!)} (limit ±${fmt(v.threshold)})`;
    const fenceText = outsideFences
      ? value > upperFence
        ? `above the upper fence ${fmt(upperFence)}`
        : `below the lower fence ${fmt(lowerFence)}`
      : `inside the fences ${fmt(lowerFence)} to ${fmt(upperFence)}`;
    const howMuch =
      ratioToMedian === null
        ? `${fmt(deviationFromMedian)} from the median`
        : `${fmt(ratioToMedian)}× the group median of ${fmt(med)}`;
    return flagged
      ? `${fmt(value)} is unusually ${direction}: ${howMuch}; ${zText}, ${fenceText}.`
      : `${fmt(value)} is in line with the group: ${zText}, ${fenceText}.`;
  };

  const items: OutlierItem[] = v.items.map(({ id, value }) => {
    const deviationFromMedian = value - med;
    const ratioToMedian = med === 0 ? null : value / med;
    const modifiedZ = scale === null ? null : deviationFromMedian / divisor;
    const zFlag = modifiedZ !== null && Math.abs(modifiedZ) > v.threshold;
    const outsideFences = value < lowerFence || value > upperFence;
    const fenceFlag = canFlag && outsideFences;
    const flagged = canFlag && ruleFlags(v.rule, zFlag, fenceFlag);
    const direction = flagged ? (deviationFromMedian > 0 ? 'high' : 'low') : null;
    let reason: string | undefined;
    return {
      id,
      value,
      modifiedZ,
      outsideFences,
      flagged,
      direction,
      deviationFromMedian,
      ratioToMedian,
      // An own, enumerable getter: the item reads, spreads and serialises as if the words were stored.
      get reason() {
        return (reason ??= reasonOf(this));
      },
    };
  });

  return {
    groupSize: n,
    rule: v.rule,
    threshold: v.threshold,
    median: med,
    mad,
    scale,
    q1,
    q3,
    iqr,
    lowerFence,
    upperFence,
    flaggedCount: items.filter((i) => i.flagged).length,
    notice,
    items,
  };
}

const RULE_TESTS: Record<OutlierRule, (zFlag: boolean, fenceFlag: boolean) => boolean> = {
  modified_z: (z) => z,
  fences: (_z, f) => f,
  either: (z, f) => z || f,
  both: (z, f) => z && f,
};

function ruleFlags(rule: OutlierRule, zFlag: boolean, fenceFlag: boolean): boolean {
  return RULE_TESTS[rule](zFlag, fenceFlag);
}
