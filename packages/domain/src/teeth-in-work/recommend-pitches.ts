/**
 * Ranks blade pitches for a stock shape by how well their teeth in the work sit in the trade's window.
 */
import type { StockShape } from '../stock-area/schema.js';
import { meanTpi, pitchLabel, STANDARD_PITCHES } from './pitch.js';
import type { Pitch } from './schema.js';
import { judgeTeethInWork, TEETH_IN_WORK_RULE, teethInWorkForStock } from './teeth-in-work.js';
import type { TeethFit, TeethWarning } from './teeth-in-work.js';

export interface PitchCandidate {
  pitch: Pitch;
  /** As the trade writes it, e.g. "4/6". */
  label: string;
  /** TPI used to count teeth (the mean of a variable pitch). */
  meanTpi: number;
  /** Teeth in the work where the least metal is under the band. */
  teethMin: number;
  /** Teeth in the work where the most metal is under the band. */
  teethMax: number;
  fit: TeethFit;
  warnings: TeethWarning[];
}

export interface RecommendPitchesOptions {
  /** Pieces of a bundle side by side along the band; 1 unless given. */
  piecesAcross?: number;
  /** Pitches to choose from; the standard list unless given (e.g. the pitches a site has in stock). */
  pitches?: readonly Pitch[];
  /** Return at most this many candidates. */
  limit?: number;
}

/**
 * How far a tooth count sits from the 6–12 window, on a log scale so that 3 and 24 weigh alike. Crossing 3 or 24
 * adds a step so that any pitch within the limits ranks above any pitch outside them; too few teeth adds more
 * than too many, because stripped teeth end a blade while packed gullets only slow the cut.
 */
function distanceFromWindow(teeth: number): number {
  const { fewest, most, bestFewest, bestMost } = TEETH_IN_WORK_RULE;
  if (teeth < bestFewest) return Math.log(bestFewest / teeth) + (teeth < fewest ? 100 : 0);
  if (teeth > bestMost) return Math.log(teeth / bestMost) + (teeth > most ? 10 : 0);
  return 0;
}

/**
 * Candidate pitches for cutting a stock shape (mm), best first: pitches with 6–12 teeth all through the cut, then
 * those within 3–24, then the rest, each group ordered by how close its teeth sit to the 6–12 window. Each
 * candidate carries its least and greatest teeth in the work, a fit label and warnings outside 3–24.
 * Ties keep the order of the pitch list.
 */
export function recommendPitches(shape: StockShape, options: RecommendPitchesOptions = {}): PitchCandidate[] {
  const pitches = options.pitches ?? STANDARD_PITCHES;
  const scored = pitches.map((pitch, index) => {
    const teeth = teethInWorkForStock(shape, pitch, options.piecesAcross ?? 1);
    const judged = judgeTeethInWork(teeth);
    const candidate: PitchCandidate = {
      pitch,
      label: pitchLabel(pitch),
      meanTpi: meanTpi(pitch),
      teethMin: teeth.min,
      teethMax: teeth.max,
      fit: judged.fit,
      warnings: judged.warnings,
    };
    return { candidate, index, score: distanceFromWindow(teeth.min) + distanceFromWindow(teeth.max) };
  });
  scored.sort((a, b) => a.score - b.score || a.index - b.index);
  const ranked = scored.map((s) => s.candidate);
  return options.limit === undefined ? ranked : ranked.slice(0, Math.max(0, options.limit));
}
