import { bandLengthMm, centreDistanceForBandLengthMm } from '@kerfline/domain/band/band-length';
import { bandLengthInputSchema, centreDistanceInputSchema } from '@kerfline/domain/band/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readQuantity, type Entry } from './quantities';
import { compute, hasErrors, placeIssues, take } from './readings';
import type { FieldErrors } from './use-entries';

export type BandLengthKey = 'mode' | 'driveMm' | 'idlerMm' | 'centreMm' | 'bandMm';

/** What to work out: the band for a centre distance, or the centre distance for a band. */
export type BandLengthMode = 'length' | 'centre';

export const BAND_LENGTH_LABELS = {
  driveMm: 'Drive wheel diameter',
  idlerMm: 'Idler wheel diameter',
  centreMm: 'Centre distance',
  bandMm: 'Band length',
} as const;

export interface BandLengthResult {
  mode: BandLengthMode;
  driveMm: number;
  idlerMm: number;
  centreMm: number;
  bandMm: number;
}

export interface BandLengthEvaluation {
  errors: FieldErrors<BandLengthKey>;
  formError: string | null;
  result: BandLengthResult | null;
}

const FIELD_BY_SCHEMA_KEY: Record<string, BandLengthKey> = {
  driveWheelDiameterMm: 'driveMm',
  idlerWheelDiameterMm: 'idlerMm',
  centreDistanceMm: 'centreMm',
  bandLengthMm: 'bandMm',
};

export function bandLengthMode(entry: Entry): BandLengthMode {
  return entry.text === 'centre' ? 'centre' : 'length';
}

/**
 * Band length by the open-belt formula from the wheels and their centre distance, or the inverse: the centre
 * distance a band needs. An idler left empty is taken as the same size as the drive wheel.
 */
export function evaluateBandLength(entries: Record<BandLengthKey, Entry>, system: UnitSystem): BandLengthEvaluation {
  const errors: FieldErrors<BandLengthKey> = {};
  const mode = bandLengthMode(entries.mode);
  const driveMm = take(readQuantity(entries.driveMm, 'length'), 'driveMm', BAND_LENGTH_LABELS.driveMm, errors);
  const idlerReading = readQuantity(entries.idlerMm, 'length');
  const idlerEmpty = idlerReading.kind === 'empty';
  const idlerMm = idlerEmpty ? driveMm : take(idlerReading, 'idlerMm', BAND_LENGTH_LABELS.idlerMm, errors);
  const wheels = { driveWheelDiameterMm: driveMm, idlerWheelDiameterMm: idlerMm };
  const fieldFor = (path: readonly PropertyKey[]) => {
    const key = FIELD_BY_SCHEMA_KEY[String(path[0])];
    // An idler copied from the drive wheel has no field of its own to blame.
    return key === 'idlerMm' && idlerEmpty ? undefined : key;
  };

  if (mode === 'length') {
    const centreMm = take(readQuantity(entries.centreMm, 'length'), 'centreMm', BAND_LENGTH_LABELS.centreMm, errors);
    const parsed = bandLengthInputSchema.safeParse({ ...wheels, centreDistanceMm: centreMm });
    if (!parsed.success) placeIssues(parsed.error.issues, fieldFor, errors, system);
    if (!parsed.success || hasErrors(errors)) return { errors, formError: null, result: null };
    const worked = compute(() => bandLengthMm(parsed.data));
    if (!worked.ok) return { errors, formError: worked.message, result: null };
    const { driveWheelDiameterMm, idlerWheelDiameterMm, centreDistanceMm } = parsed.data;
    return {
      errors,
      formError: null,
      result: {
        mode,
        driveMm: driveWheelDiameterMm,
        idlerMm: idlerWheelDiameterMm,
        centreMm: centreDistanceMm,
        bandMm: worked.value,
      },
    };
  }

  const bandMm = take(readQuantity(entries.bandMm, 'length'), 'bandMm', BAND_LENGTH_LABELS.bandMm, errors);
  // The schema works out the shortest band from the wheels, so they must be numbers before it runs.
  if (driveMm === undefined || idlerMm === undefined) return { errors, formError: null, result: null };
  const parsed = centreDistanceInputSchema.safeParse({ ...wheels, bandLengthMm: bandMm });
  if (!parsed.success) placeIssues(parsed.error.issues, fieldFor, errors, system);
  if (!parsed.success || hasErrors(errors)) return { errors, formError: null, result: null };
  const worked = compute(() => centreDistanceForBandLengthMm(parsed.data));
  if (!worked.ok) return { errors, formError: worked.message, result: null };
  const { driveWheelDiameterMm, idlerWheelDiameterMm, bandLengthMm: band } = parsed.data;
  return {
    errors,
    formError: null,
    result: {
      mode,
      driveMm: driveWheelDiameterMm,
      idlerMm: idlerWheelDiameterMm,
      centreMm: worked.value,
      bandMm: band,
    },
  };
}
