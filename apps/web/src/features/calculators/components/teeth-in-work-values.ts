import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { StockShape } from '@kerfline/domain/stock-area/schema';
import { engagedLengthMm, type EngagedLength } from '@kerfline/domain/teeth-in-work/engaged-length';
import { parsePitchLabel, pitchLabel, STANDARD_PITCHES } from '@kerfline/domain/teeth-in-work/pitch';
import { pitchAdvice, type PitchAdvice, type PitchCandidate } from '@kerfline/domain/teeth-in-work/recommend-pitches';
import { pitchAdviceInputSchema, pitchSchema, type Pitch } from '@kerfline/domain/teeth-in-work/schema';
import {
  judgeTeethInWork,
  teethInWorkForStock,
  type TeethFit,
  type TeethInWorkRange,
  type TeethWarning,
} from '@kerfline/domain/teeth-in-work/teeth-in-work';
import { readNumber, type Entry } from './quantities';
import { compute, hasErrors, placeIssues, take } from './readings';
import { dimensionAt, isShapeKind, readShapeDimensions, type DimensionKey } from './stock-shape';
import type { FieldErrors } from './use-entries';

export type TeethKey = 'shape' | DimensionKey | 'piecesAcross' | 'pitch' | 'otherPitch';

/** The pitch list's value for "a pitch not in the list", typed in its own field. */
export const OTHER_PITCH = 'other';

/** The pitch choices: none yet, each standard pitch by its index, or another typed in. */
export const PITCH_OPTIONS = [
  { value: '', label: 'Choose a pitch…' },
  ...STANDARD_PITCHES.map((pitch, index) => ({
    value: String(index),
    label: `${pitchLabel(pitch)} TPI${pitch.kind === 'variable' ? ' (variable)' : ''}`,
  })),
  { value: OTHER_PITCH, label: 'Another pitch…' },
];

/** The option value of a standard pitch, so a recommended pitch can be picked straight from the list. */
export function pitchOptionValue(pitch: Pitch): string {
  const label = pitchLabel(pitch);
  return String(STANDARD_PITCHES.findIndex((p) => pitchLabel(p) === label));
}

export interface ChosenPitchResult {
  pitch: Pitch;
  label: string;
  range: TeethInWorkRange;
  fit: TeethFit;
  warnings: TeethWarning[];
}

export interface TeethEvaluation {
  errors: FieldErrors<TeethKey>;
  formError: string | null;
  shape: StockShape | null;
  piecesAcross: number;
  engaged: EngagedLength | null;
  /** The chosen pitch's teeth in the work; null until a pitch is chosen and the stock is valid. */
  chosen: ChosenPitchResult | null;
  /** The standard pitches ranked for this stock, the recommended one first. */
  recommendations: PitchCandidate[];
  /** Where the recommendation comes from (the printed table for solids, the teeth-in-work rule otherwise). */
  advice: Pick<PitchAdvice, 'source' | 'basis' | 'note'> | null;
}

function readPitch(entries: Record<TeethKey, Entry>, errors: FieldErrors<TeethKey>): Pitch | null {
  const choice = entries.pitch.text;
  if (choice === '') return null;
  if (choice !== OTHER_PITCH) return STANDARD_PITCHES[Number(choice)] ?? null;
  const typed = entries.otherPitch.text.trim();
  if (typed === '') {
    errors.otherPitch = 'Enter the pitch, e.g. 3 or 4/6';
    return null;
  }
  const parsed = parsePitchLabel(typed);
  if (!parsed.ok) {
    errors.otherPitch = parsed.message;
    return null;
  }
  // The domain's pitch schema has the last word on what a pitch may be.
  const checked = pitchSchema.safeParse(parsed.pitch);
  if (!checked.success) {
    errors.otherPitch = checked.error.issues[0]?.message ?? 'Check the pitch';
    return null;
  }
  return checked.data;
}

/**
 * Teeth in the work for the stock and pitch entered: the schema checks the stock (in mm) and the pieces side by
 * side, the domain counts the teeth for the chosen pitch and ranks the standard pitches.
 */
export function evaluateTeethInWork(
  entries: Record<TeethKey, Entry>,
  system: UnitSystem,
  /** The site's effective settings: its teeth-in-work guards and preference (shipped ones when left out). */
  settings: EffectiveSettings = {},
): TeethEvaluation {
  const errors: FieldErrors<TeethKey> = {};
  const kind = entries.shape.text;
  const empty = {
    errors,
    formError: null,
    shape: null,
    piecesAcross: 1,
    engaged: null,
    chosen: null,
    recommendations: [],
    advice: null,
  };
  if (!isShapeKind(kind)) return { ...empty, errors: { shape: 'Choose a stock shape' } };

  const shape = readShapeDimensions(kind, entries, errors);
  const piecesReading = readNumber(entries.piecesAcross.text);
  // Left empty, the pieces side by side default to one, as in the schema.
  const piecesAcross =
    piecesReading.kind === 'empty' ? 1 : take(piecesReading, 'piecesAcross', 'Pieces side by side', errors);
  // A pitch that cannot be read must not hide the pitch advice for the stock, so its message is kept apart.
  const pitchErrors: FieldErrors<TeethKey> = {};
  const pitch = readPitch(entries, pitchErrors);

  const parsed = pitchAdviceInputSchema.safeParse({ shape, piecesAcross });
  if (!parsed.success) {
    placeIssues(
      parsed.error.issues,
      (path) => (path[0] === 'shape' ? dimensionAt(path) : path[0] === 'piecesAcross' ? 'piecesAcross' : undefined),
      errors,
      system,
    );
  }
  if (!parsed.success || hasErrors(errors)) {
    return { ...empty, errors: { ...errors, ...pitchErrors }, piecesAcross: piecesAcross ?? 1 };
  }

  const stock = parsed.data.shape;
  const pieces = parsed.data.piecesAcross;
  const worked = compute(() => {
    const range = pitch ? teethInWorkForStock(stock, pitch, pieces) : null;
    const advice = pitchAdvice(stock, { piecesAcross: pieces, settings });
    return {
      engaged: engagedLengthMm(stock, pieces),
      recommendations: advice.candidates,
      advice: { source: advice.source, basis: advice.basis, note: advice.note },
      chosen:
        pitch && range ? { pitch, label: pitchLabel(pitch), range, ...judgeTeethInWork(range, advice.rule) } : null,
    };
  });
  if (!worked.ok) return { ...empty, errors: pitchErrors, formError: worked.message };
  return { errors: pitchErrors, formError: null, shape: stock, piecesAcross: pieces, ...worked.value };
}
