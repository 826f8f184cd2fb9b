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
import type { FigureBasis } from '../figures/basis.js';
import { effectiveSetting, settingBasis, settingValue, type EffectiveSettings } from '../settings/effective.js';

/** The guards and preference on teeth in the work that pitch advice and cut-log warnings read. */
export interface TeethInWorkRule {
  fewest: number;
  most: number;
  bestFewest: number;
  bestMost: number;
}

/**
 * A site's guards on teeth in the work, from its `teeth_in_work` setting: fewer than `fewest` and teeth strip,
 * more than `most` and the gullets overload; `bestFewest`–`bestMost` is the range pitch advice prefers. Shipped
 * 3, 24 and 6–12 (common practice, no source; the printed pitch table itself runs from 3.0 teeth at its smallest
 * length of cut to 20 at its largest). The preference never overrides the printed pitch table.
 */
export function teethInWorkRule(settings?: EffectiveSettings): TeethInWorkRule {
  const setting = effectiveSetting(settings, 'teeth_in_work');
  return {
    fewest: settingValue(setting, 'fewestTeeth'),
    most: settingValue(setting, 'mostTeeth'),
    bestFewest: settingValue(setting, 'preferredFewestTeeth'),
    bestMost: settingValue(setting, 'preferredMostTeeth'),
  };
}

/** Where a site's teeth-in-work guards come from: Kerfline's starting value, or the site's own. */
export function teethInWorkRuleBasis(settings?: EffectiveSettings): FigureBasis {
  return settingBasis(effectiveSetting(settings, 'teeth_in_work'));
}

/** The shipped guards (3, 24, and 6–12 preferred): what a site that never changed them uses. */
export const TEETH_IN_WORK_RULE: Readonly<TeethInWorkRule> = Object.freeze(teethInWorkRule());

/**
 * Teeth cutting at once over a length of metal: mean TPI × length in inches. Linear in both.
 * @param lengthMm length of metal a tooth path crosses, mm (> 0)
 */
export function teethInWork(pitch: Pitch, lengthMm: number): number {
  requirePositive(lengthMm, 'Length of metal under the band', 'mm');
  return requirePositive(meanTpi(pitch), 'Pitch', 'TPI') * mmToIn(lengthMm);
}

export interface TeethInWorkRange {
  /** Teeth on the lower figure of metal: the least, or on round bar the mean over the cut (`minLabel`). */
  min: number;
  /** Teeth where the most metal is under the band (on round bar: at the centre line). */
  max: number;
  /** What `min` is: "least", or "mean over the cut" on round bar. */
  minLabel: string;
  /** What `max` is: "greatest", or "at the centre line" on round bar. */
  maxLabel: string;
  /**
   * Teeth on the length the too-few-teeth warning reads: the length of cut of a published pitch table for a solid
   * (a round bar's diameter), the least length for tubes and shapes. Equals `min` except on round bar.
   */
  fewest: number;
  /** Where the figures come from (see `engagedLengthMm`). */
  basis: string;
}

/** Teeth in the work for a stock shape (mm) cut with a pitch, `piecesAcross` side by side. */
export function teethInWorkForStock(shape: StockShape, pitch: Pitch, piecesAcross = 1): TeethInWorkRange {
  const engaged = engagedLengthMm(shape, piecesAcross);
  return {
    min: teethInWork(pitch, engaged.minMm),
    max: teethInWork(pitch, engaged.maxMm),
    minLabel: engaged.minLabel,
    maxLabel: engaged.maxLabel,
    fewest: teethInWork(pitch, engaged.fewestTeethMm),
    basis: engaged.basis,
  };
}

/**
 * best: 6–12 teeth (the trade's preference) on the figures the warnings read; workable: within 3–24;
 * outside_limits: below 3 or above 24.
 */
export const TEETH_FITS = ['best', 'workable', 'outside_limits'] as const;
export type TeethFit = (typeof TEETH_FITS)[number];

export interface TeethWarning {
  code: 'too_few_teeth' | 'too_many_teeth';
  message: string;
}

const oneDecimal = (teeth: number) => (Math.round(teeth * 10) / 10).toFixed(1);
/** A count exactly on a guard (3.0 teeth from 12 TPI over 1/4 in) must not fail on float noise in the inch. */
const EPSILON = 1e-9;

/**
 * Judges teeth in the work against a site's rule (the shipped one unless given): a fit label and plain-word
 * warnings. The too-few check reads `fewest` when given (a round bar's centre line, as published pitch tables read
 * its diameter), else `min`.
 */
export function judgeTeethInWork(
  range: { min: number; max: number; fewest?: number },
  rule: TeethInWorkRule = TEETH_IN_WORK_RULE,
): {
  fit: TeethFit;
  warnings: TeethWarning[];
} {
  const { fewest, most, bestFewest, bestMost } = rule;
  const warnings: TeethWarning[] = [];
  const low = range.fewest ?? range.min;
  if (low < fewest - EPSILON) {
    const where = range.fewest !== undefined && range.fewest !== range.min ? ' at the centre line' : '';
    warnings.push({
      code: 'too_few_teeth',
      message: `As few as ${oneDecimal(low)} teeth in the work${where} (fewer than ${fewest}): teeth may strip. Choose a finer pitch.`,
    });
  }
  if (range.max > most + EPSILON) {
    warnings.push({
      code: 'too_many_teeth',
      message: `Up to ${oneDecimal(range.max)} teeth in the work (more than ${most}): gullets pack with chips and the cut slows. Choose a coarser pitch.`,
    });
  }
  if (warnings.length > 0) return { fit: 'outside_limits', warnings };
  const best = low >= bestFewest - EPSILON && range.max <= bestMost + EPSILON;
  return { fit: best ? 'best' : 'workable', warnings };
}
