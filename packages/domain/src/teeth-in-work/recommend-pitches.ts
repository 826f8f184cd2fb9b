/**
 * Pitch advice for a stock shape. Solid sections (round, square and flat bar) take the pitch Machinery's
 * Handbook prints for their length of cut (see `pitch-table.ts`), with the site's teeth-in-work guards (shipped 3
 * and 24) as checks. Tubes and structural shapes are not covered by that table: they keep a choice by teeth in the
 * work, ranked by how close their teeth come to the site's preferred range (shipped 6–12), and the advice says so.
 */
import type { StockShape } from '../stock-area/schema.js';
import { published, type FigureBasis } from '../figures/basis.js';
import { engagedLengthMm } from './engaged-length.js';
import { meanTpi, pitchLabel, STANDARD_PITCHES } from './pitch.js';
import { PITCH_TABLE_SOURCE, tablePitchForLengthOfCut, type TablePitch } from './pitch-table.js';
import type { Pitch } from './schema.js';
import { judgeTeethInWork, teethInWorkForStock, teethInWorkRule, teethInWorkRuleBasis } from './teeth-in-work.js';
import type { TeethInWorkRule } from './teeth-in-work.js';
import type { EffectiveSettings } from '../settings/effective.js';
import type { TeethFit, TeethWarning } from './teeth-in-work.js';

/**
 * Why a pitch is recommended: the printed table's own pitch, the pitch of the given list nearest to it, or (beyond
 * the table, or for tubes and shapes) the teeth-in-work guards and preference.
 */
export type PitchSource = 'published_table' | 'nearest_to_table' | 'teeth_in_work';

export interface PitchCandidate {
  pitch: Pitch;
  /** As the trade writes it, e.g. "4/6". */
  label: string;
  /** TPI used to count teeth (the mean of a variable pitch). */
  meanTpi: number;
  /** Teeth on the lower figure of metal (the least; on round bar the mean over the cut). */
  teethMin: number;
  /** Teeth where the most metal is under the band (on round bar: at the centre line). */
  teethMax: number;
  /** Teeth on the length the too-few-teeth warning reads (a round bar's centre line; else the least). */
  teethFewest: number;
  /** The site's preferred range met (shipped 6–12): shown as a preference, never ranked above the printed table. */
  inPreferredRange: boolean;
  fit: TeethFit;
  warnings: TeethWarning[];
  /** True for the one pitch recommended (the first of the list). */
  recommended: boolean;
}

export interface RecommendPitchesOptions {
  /** Pieces of a bundle side by side along the band; 1 unless given. */
  piecesAcross?: number;
  /** Pitches to choose from; the standard list unless given (e.g. the pitches a site has in stock). */
  pitches?: readonly Pitch[];
  /** Return at most this many candidates. */
  limit?: number;
  /** The site's effective settings: its `teeth_in_work` guards and preference; the shipped ones when left out. */
  settings?: EffectiveSettings;
}

export interface PitchAdvice {
  /** Candidates, the recommended pitch first. */
  candidates: PitchCandidate[];
  /** Why the first candidate is recommended. */
  source: PitchSource;
  /** The printed table's pitch for this solid's length of cut; null for tubes and shapes. */
  table: (TablePitch & { lengthOfCutMm: number }) | null;
  /** Printed source of the recommendation, or the site's teeth-in-work setting when it rests on that alone. */
  basis: FigureBasis;
  /** The guards and preference used (the site's `teeth_in_work` setting), and where they come from. */
  rule: TeethInWorkRule;
  ruleBasis: FigureBasis;
  /** One sentence for the user: where the recommendation comes from. */
  note: string;
}

const SOLIDS: ReadonlySet<StockShape['kind']> = new Set(['round_bar', 'square_bar', 'flat_bar']);

/**
 * How far a tooth count sits from the 6–12 preference, on a log scale so that 3 and 24 weigh alike. Crossing 3 or
 * 24 adds a step so that any pitch within the guards ranks above any pitch outside them; too few teeth adds more
 * than too many, because stripped teeth end a blade while packed gullets only slow the cut.
 */
function distanceFromPreference(teeth: number, rule: TeethInWorkRule): number {
  const { fewest, most, bestFewest, bestMost } = rule;
  if (teeth < bestFewest) return Math.log(bestFewest / teeth) + (teeth < fewest ? 100 : 0);
  if (teeth > bestMost) return Math.log(teeth / bestMost) + (teeth > most ? 10 : 0);
  return 0;
}

const ratioDistance = (a: number, b: number) => Math.abs(Math.log(a / b));

/**
 * Pitch advice for cutting a stock shape (mm): candidates best first, where the recommendation comes from, and
 * the printed pitch for a solid's length of cut. Each candidate carries its teeth in the work, a fit label and
 * warnings outside 3–24. Ties keep the order of the pitch list.
 */
export function pitchAdvice(shape: StockShape, options: RecommendPitchesOptions = {}): PitchAdvice {
  const pitches = options.pitches ?? STANDARD_PITCHES;
  const rule = teethInWorkRule(options.settings);
  const ruleBasis = teethInWorkRuleBasis(options.settings);
  const piecesAcross = options.piecesAcross ?? 1;
  const engaged = engagedLengthMm(shape, piecesAcross);
  const scored = pitches.map((pitch, index) => {
    const teeth = teethInWorkForStock(shape, pitch, piecesAcross);
    const judged = judgeTeethInWork(teeth, rule);
    const candidate: PitchCandidate = {
      pitch,
      label: pitchLabel(pitch),
      meanTpi: meanTpi(pitch),
      teethMin: teeth.min,
      teethMax: teeth.max,
      teethFewest: teeth.fewest,
      inPreferredRange: judged.fit === 'best',
      fit: judged.fit,
      warnings: judged.warnings,
      recommended: false,
    };
    return {
      candidate,
      index,
      byRule: distanceFromPreference(teeth.fewest, rule) + distanceFromPreference(teeth.max, rule),
    };
  });
  const withinGuards = (c: PitchCandidate) => c.fit !== 'outside_limits';

  let source: PitchSource = 'teeth_in_work';
  let table: PitchAdvice['table'] = null;
  let ranked: typeof scored;
  if (SOLIDS.has(shape.kind)) {
    const lengthOfCutMm = engaged.fewestTeethMm;
    table = { ...tablePitchForLengthOfCut(lengthOfCutMm), lengthOfCutMm };
    const target = meanTpi(table.pitch);
    const printedLabel = pitchLabel(table.pitch);
    const isPrinted = (c: PitchCandidate) => Number(c.label === printedLabel);
    // The printed pitch itself first, then the nearest to it; within the guards before outside them.
    ranked = [...scored].sort(
      (a, b) =>
        Number(withinGuards(b.candidate)) - Number(withinGuards(a.candidate)) ||
        isPrinted(b.candidate) - isPrinted(a.candidate) ||
        ratioDistance(a.candidate.meanTpi, target) - ratioDistance(b.candidate.meanTpi, target) ||
        a.index - b.index,
    );
    const first = ranked[0]?.candidate;
    if (first && withinGuards(first) && table.withinTable) {
      source = first.label === printedLabel ? 'published_table' : 'nearest_to_table';
    }
    if (source === 'teeth_in_work') {
      // Beyond the printed lengths, or the printed pitch breaks a guard: the guards and the preference choose.
      ranked = [...scored].sort((a, b) => a.byRule - b.byRule || a.index - b.index);
    }
  } else {
    ranked = [...scored].sort((a, b) => a.byRule - b.byRule || a.index - b.index);
  }

  const candidates = ranked.map((s, i) => ({ ...s.candidate, recommended: i === 0 }));
  const limited = options.limit === undefined ? candidates : candidates.slice(0, Math.max(0, options.limit));
  const first = candidates[0];
  let note: string;
  if (source === 'published_table' && table) {
    note = `Machinery's Handbook prints ${pitchLabel(table.pitch)} TPI for this length of cut.`;
  } else if (source === 'nearest_to_table' && table) {
    note = `Machinery's Handbook prints ${pitchLabel(table.pitch)} TPI for this length of cut; ${first?.label ?? ''} TPI is the nearest in the list.`;
  } else if (table) {
    note = `This length of cut is beyond the printed pitch table (1/4 in to 8 in), so the pitch is chosen to keep ${rule.fewest} to ${rule.most} teeth in the work.`;
  } else {
    note = `The printed pitch table covers solid sections only; for tubes and shapes the pitch is chosen to keep ${rule.fewest} to ${rule.most} teeth in the work, nearest ${rule.bestFewest} to ${rule.bestMost}.`;
  }
  return {
    candidates: limited,
    source,
    table,
    basis: source === 'teeth_in_work' ? ruleBasis : published(PITCH_TABLE_SOURCE),
    rule,
    ruleBasis,
    note,
  };
}

/** Candidate pitches for a stock shape, the recommended one first (see `pitchAdvice`). */
export function recommendPitches(shape: StockShape, options: RecommendPitchesOptions = {}): PitchCandidate[] {
  return pitchAdvice(shape, options).candidates;
}
