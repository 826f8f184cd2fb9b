/**
 * Teeth in the work: how many teeth are cutting at once. Too few and each tooth takes too big a bite and can
 * break off (tooth strippage); too many and the gullets fill with chips before they leave the cut, so the cut
 * slows and the blade wanders.
 */
import { mmToIn } from '../units/units.js';
import { requirePositive } from '../units/guards.js';
import type { StockShape } from '../stock-area/schema.js';
import { engagedLengthMm } from './engaged-length.js';
import { meanTpi } from './pitch.js';
import type { Pitch } from './schema.js';

/**
 * The trade's rule for teeth in the work (common practice, no source): at least 3, at most 24, and 6 to 12 cuts
 * best.
 */
export const TEETH_IN_WORK_RULE = { fewest: 3, most: 24, bestFewest: 6, bestMost: 12 } as const;

/**
 * Teeth cutting at once over a length of metal: mean TPI × length in inches. Linear in both.
 * @param lengthMm length of metal a tooth path crosses, mm (> 0)
 */
export function teethInWork(pitch: Pitch, lengthMm: number): number {
  requirePositive(lengthMm, 'Length of metal under the band', 'mm');
  return requirePositive(meanTpi(pitch), 'Pitch', 'TPI') * mmToIn(lengthMm);
}

export interface TeethInWorkRange {
  /** Teeth in the work where the least metal is under the band. */
  min: number;
  /** Teeth in the work where the most metal is under the band. */
  max: number;
  /** Where min and max come from (see `engagedLengthMm`). */
  basis: string;
}

/** Least and greatest teeth in the work for a stock shape (mm) cut with a pitch, `piecesAcross` side by side. */
export function teethInWorkForStock(shape: StockShape, pitch: Pitch, piecesAcross = 1): TeethInWorkRange {
  const engaged = engagedLengthMm(shape, piecesAcross);
  return { min: teethInWork(pitch, engaged.minMm), max: teethInWork(pitch, engaged.maxMm), basis: engaged.basis };
}

/** best: 6–12 teeth all through the cut; workable: within 3–24; outside_limits: below 3 or above 24 somewhere. */
export const TEETH_FITS = ['best', 'workable', 'outside_limits'] as const;
export type TeethFit = (typeof TEETH_FITS)[number];

export interface TeethWarning {
  code: 'too_few_teeth' | 'too_many_teeth';
  message: string;
}

const oneDecimal = (teeth: number) => (Math.round(teeth * 10) / 10).toFixed(1);

/** Judges a range of teeth in the work against `TEETH_IN_WORK_RULE`: a fit label and plain-word warnings. */
export function judgeTeethInWork(range: { min: number; max: number }): { fit: TeethFit; warnings: TeethWarning[] } {
  const { fewest, most, bestFewest, bestMost } = TEETH_IN_WORK_RULE;
  const warnings: TeethWarning[] = [];
  if (range.min < fewest) {
    warnings.push({
      code: 'too_few_teeth',
      message: `As few as ${oneDecimal(range.min)} teeth in the work (fewer than ${fewest}): teeth may strip. Choose a finer pitch.`,
    });
  }
  if (range.max > most) {
    warnings.push({
      code: 'too_many_teeth',
      message: `Up to ${oneDecimal(range.max)} teeth in the work (more than ${most}): gullets pack with chips and the cut slows. Choose a coarser pitch.`,
    });
  }
  if (warnings.length > 0) return { fit: 'outside_limits', warnings };
  const best = range.min >= bestFewest && range.max <= bestMost;
  return { fit: best ? 'best' : 'workable', warnings };
}
