/**
 * Pitch for a solid section from its length of cut, as printed in Machinery's Handbook, 31st ed., p. 1245 (the
 * notes to the bi-metal band speed table): 1/4 in → 10/14, 3/4 in → 6/10, 1 1/4 in → 4/6, 4 in → 3/4 and
 * 8 in → 2/3 TPI. The length of cut of a solid is the length each tooth travels through it: the diameter of a
 * round bar, the side of a square, the width of a flat along the band.
 *
 * Between the printed lengths, a length takes the pitch of the printed length nearest to it on a ratio scale
 * (the boundaries are the geometric means of neighbouring printed lengths): our reading of the table, since it
 * prints points, not bands. Beyond its ends the table says nothing; `recommendPitches` then lets the
 * teeth-in-work guards choose.
 */
import { inToMm, mmToIn } from '../units/units.js';
import { requirePositive } from '../units/guards.js';
import { MH31_BAND_SAW_NOTES } from '../figures/sources.js';
import type { Pitch } from './schema.js';

export interface PrintedPitchPair {
  /** Length of cut as printed, inches. */
  lengthOfCutIn: number;
  /** The pitch printed for it. */
  pitch: Pitch;
}

const variable = (coarseTpi: number, fineTpi: number): Pitch => ({ kind: 'variable', coarseTpi, fineTpi });

/** The printed pairs, shortest length of cut first (Machinery's Handbook, 31st ed., p. 1245). */
export const PRINTED_PITCH_PAIRS: readonly PrintedPitchPair[] = [
  { lengthOfCutIn: 0.25, pitch: variable(10, 14) },
  { lengthOfCutIn: 0.75, pitch: variable(6, 10) },
  { lengthOfCutIn: 1.25, pitch: variable(4, 6) },
  { lengthOfCutIn: 4, pitch: variable(3, 4) },
  { lengthOfCutIn: 8, pitch: variable(2, 3) },
];

export const PITCH_TABLE_SOURCE = MH31_BAND_SAW_NOTES;

export interface TablePitch {
  pitch: Pitch;
  /** The printed length of cut whose pitch this is, mm. */
  printedLengthOfCutMm: number;
  /** Whether the length lies within the printed lengths (1/4 in to 8 in); outside, the table is only the nearest end. */
  withinTable: boolean;
}

/**
 * The printed pitch for a solid's length of cut (mm): the pitch of the nearest printed length on a ratio scale.
 * Throws a `RangeError` for a length that is not a positive number.
 */
export function tablePitchForLengthOfCut(lengthOfCutMm: number): TablePitch {
  requirePositive(lengthOfCutMm, 'Length of cut', 'mm');
  const inches = mmToIn(lengthOfCutMm);
  let nearest = PRINTED_PITCH_PAIRS[0]!;
  for (const pair of PRINTED_PITCH_PAIRS) {
    if (Math.abs(Math.log(inches / pair.lengthOfCutIn)) < Math.abs(Math.log(inches / nearest.lengthOfCutIn))) {
      nearest = pair;
    }
  }
  const first = PRINTED_PITCH_PAIRS[0]!.lengthOfCutIn;
  const last = PRINTED_PITCH_PAIRS[PRINTED_PITCH_PAIRS.length - 1]!.lengthOfCutIn;
  return {
    pitch: nearest.pitch,
    printedLengthOfCutMm: inToMm(nearest.lengthOfCutIn),
    withinTable: inches >= first - 1e-9 && inches <= last + 1e-9,
  };
}
