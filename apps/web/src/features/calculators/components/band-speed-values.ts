import { checkBandSpeed, type BandSpeedCheck } from '@kerfline/domain/band-speed/check-band-speed';
import {
  MATERIAL_GROUPS,
  MATERIAL_GROUP_LABELS,
  bandSpeedCheckInputSchema,
  materialGroupSchema,
  type MaterialGroup,
} from '@kerfline/domain/band-speed/schema';
import { recommendedBandSpeed, type RecommendedBandSpeed } from '@kerfline/domain/band-speed/speed-ranges';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readQuantity, type Entry } from './quantities';
import { compute, hasErrors, placeIssues, take } from './readings';
import type { FieldErrors } from './use-entries';

export type BandSpeedKey = 'material' | 'speed' | 'sawMin' | 'sawMax';

export const BAND_SPEED_LABELS = {
  speed: 'Band speed set',
  sawMin: 'Lowest band speed of the saw',
  sawMax: 'Highest band speed of the saw',
} as const;

/** The material groups in the order of the domain's table, named in words. */
export const MATERIAL_OPTIONS = MATERIAL_GROUPS.map((group) => ({
  value: group,
  label: MATERIAL_GROUP_LABELS[group].charAt(0).toUpperCase() + MATERIAL_GROUP_LABELS[group].slice(1),
}));

export interface BandSpeedEvaluation {
  errors: FieldErrors<BandSpeedKey>;
  formError: string | null;
  material: MaterialGroup | null;
  /** The recommended range for the material; shown as soon as a material is chosen. */
  recommended: RecommendedBandSpeed | null;
  /** The set speed against that range and the saw's; null until a speed and the saw's range are entered. */
  check: BandSpeedCheck | null;
}

const FIELD_BY_PATH: Record<string, BandSpeedKey> = {
  materialGroup: 'material',
  speedMPerMin: 'speed',
  'sawRange.minMPerMin': 'sawMin',
  'sawRange.maxMPerMin': 'sawMax',
};

/**
 * The recommended band speed for a material group, and, with a speed and the saw's range, where that speed
 * sits. The speeds are read in fpm or m/min and handed to the domain in m/min.
 */
export function evaluateBandSpeed(
  entries: Record<BandSpeedKey, Entry>,
  system: UnitSystem,
  /** The site's effective settings (its band speed ranges); shipped ranges when left out. */
  settings: EffectiveSettings = {},
): BandSpeedEvaluation {
  const errors: FieldErrors<BandSpeedKey> = {};
  const material = materialGroupSchema.safeParse(entries.material.text);
  if (!material.success) {
    return {
      errors: { material: material.error.issues[0]?.message },
      formError: null,
      material: null,
      recommended: null,
      check: null,
    };
  }
  const recommended = recommendedBandSpeed(material.data, { settings });
  const base = { errors, formError: null, material: material.data, recommended, check: null };

  const readings = {
    speed: readQuantity(entries.speed, 'bandSpeed'),
    sawMin: readQuantity(entries.sawMin, 'bandSpeed'),
    sawMax: readQuantity(entries.sawMax, 'bandSpeed'),
  };
  // The check is optional: with all three left empty only the recommended range is shown.
  if (Object.values(readings).every((reading) => reading.kind === 'empty')) return base;

  const speedMPerMin = take(readings.speed, 'speed', BAND_SPEED_LABELS.speed, errors);
  const minMPerMin = take(readings.sawMin, 'sawMin', BAND_SPEED_LABELS.sawMin, errors);
  const maxMPerMin = take(readings.sawMax, 'sawMax', BAND_SPEED_LABELS.sawMax, errors);
  const parsed = bandSpeedCheckInputSchema.safeParse({
    materialGroup: material.data,
    speedMPerMin,
    sawRange: { minMPerMin, maxMPerMin },
    unitSystem: system,
  });
  if (!parsed.success) placeIssues(parsed.error.issues, (path) => FIELD_BY_PATH[path.join('.')], errors, system);
  if (!parsed.success || hasErrors(errors)) return base;

  const v = parsed.data;
  const worked = compute(() =>
    checkBandSpeed(v.materialGroup, v.speedMPerMin, v.sawRange, { system: v.unitSystem, settings }),
  );
  return worked.ok ? { ...base, check: worked.value } : { ...base, formError: worked.message };
}
