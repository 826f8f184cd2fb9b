import type { HeadFeed, Saw, SawCreate, SawCreateParsed, SawKind } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { lbfToN, nToLbf } from '@kerfline/domain/units/units';
import { lengthFromMm, lengthToMm, speedFromMPerMin, speedToMPerMin } from '../../../lib/format';

/**
 * The saw form holds what the user typed, in the site's units. Its measurement fields are named without a
 * unit because their unit is the site's (mm or in, m/min or ft/min); each maps to one SI field of the
 * domain schema, and the values are converted on the way in and out.
 */
export const LENGTH_FIELDS = {
  wheelDiameter: 'wheelDiameterMm',
  centreDistance: 'centreDistanceMm',
  bandWidth: 'bandWidthMm',
  bandThickness: 'bandThicknessMm',
  bandLength: 'bandLengthMm',
  capacityRound: 'capacityRoundMm',
  capacityRectWidth: 'capacityRectWidthMm',
  capacityRectHeight: 'capacityRectHeightMm',
} as const satisfies Record<string, keyof SawCreateParsed>;

export const SPEED_FIELDS = {
  bandSpeedMin: 'bandSpeedMinMPerMin',
  bandSpeedMax: 'bandSpeedMaxMPerMin',
} as const satisfies Record<string, keyof SawCreateParsed>;

/** A gravity- or spring-fed head's own spring-balance limits; blank means the site's `head_force` setting. */
export const FORCE_FIELDS = {
  minHeadForce: 'minHeadForceN',
  maxHeadForce: 'maxHeadForceN',
} as const satisfies Record<string, keyof SawCreateParsed>;

export type LengthField = keyof typeof LENGTH_FIELDS;
export type SpeedField = keyof typeof SPEED_FIELDS;
export type ForceField = keyof typeof FORCE_FIELDS;
export type MeasureField = LengthField | SpeedField | ForceField;

/** Newtons to the site's force unit (N or lbf), unrounded. */
export function forceFromN(newtons: number, system: UnitSystem): number {
  return system === 'imperial' ? nToLbf(newtons) : newtons;
}

/** A force typed in the site's unit, in newtons, rounded to 0.0001 N (so 8 lbf reads back as 8). */
export function forceToN(value: number, system: UnitSystem): number {
  return Math.round((system === 'imperial' ? lbfToN(value) : value) * 10_000) / 10_000;
}

export const MEASURE_LABELS: Record<MeasureField, string> = {
  wheelDiameter: 'Wheel diameter',
  centreDistance: 'Wheel centre distance',
  bandWidth: 'Band width',
  bandThickness: 'Band thickness',
  bandLength: 'Band length',
  capacityRound: 'Round stock capacity',
  capacityRectWidth: 'Rectangle capacity, width',
  capacityRectHeight: 'Rectangle capacity, height',
  bandSpeedMin: 'Lowest band speed',
  bandSpeedMax: 'Highest band speed',
  minHeadForce: 'Least head force',
  maxHeadForce: 'Largest head force',
};

/** Capacity may be left blank; every other measurement is required. */
const OPTIONAL_FIELDS = new Set<MeasureField>([
  'capacityRound',
  'capacityRectWidth',
  'capacityRectHeight',
  'minHeadForce',
  'maxHeadForce',
]);

export type SawFormValues = {
  assetTag: string;
  name: string;
  kind: SawKind | '';
  headFeed: HeadFeed;
  make: string;
  model: string;
} & Record<MeasureField, string>;

export type SawFormField = keyof SawFormValues;

const TEXT_FIELDS = ['assetTag', 'name', 'kind', 'headFeed', 'make', 'model'] as const;

const FORM_FIELD_BY_PATH: Record<string, SawFormField> = Object.fromEntries([
  ...TEXT_FIELDS.map((field) => [field, field]),
  ...Object.entries(LENGTH_FIELDS).map(([form, si]) => [si, form]),
  ...Object.entries(SPEED_FIELDS).map(([form, si]) => [si, form]),
  ...Object.entries(FORCE_FIELDS).map(([form, si]) => [si, form]),
]);

/** The form field an error path of the domain schema (or of the server's answer) belongs to. */
export function formFieldForPath(path: string): SawFormField | undefined {
  return FORM_FIELD_BY_PATH[path];
}

/** The domain schema's field a form field is sent as. */
export function schemaFieldFor(field: SawFormField): keyof SawCreateParsed {
  if (field in LENGTH_FIELDS) return LENGTH_FIELDS[field as LengthField];
  if (field in SPEED_FIELDS) return SPEED_FIELDS[field as SpeedField];
  if (field in FORCE_FIELDS) return FORCE_FIELDS[field as ForceField];
  return field as keyof SawCreateParsed;
}

export function emptySawFormValues(): SawFormValues {
  return {
    assetTag: '',
    name: '',
    kind: '',
    // Most production saws feed hydraulically; the form says what the other choice means.
    headFeed: 'hydraulic',
    make: '',
    model: '',
    wheelDiameter: '',
    centreDistance: '',
    bandWidth: '',
    bandThickness: '',
    bandLength: '',
    bandSpeedMin: '',
    bandSpeedMax: '',
    capacityRound: '',
    capacityRectWidth: '',
    capacityRectHeight: '',
    minHeadForce: '',
    maxHeadForce: '',
  };
}

/** Up to `digits` decimals, without trailing zeros: what a person would type. */
function plain(value: number, digits: number): string {
  return String(Number(value.toFixed(digits)));
}

/** A stored saw as form values in the site's units (4 decimals of an inch or millimetre, 3 of a speed). */
export function sawFormValuesFromSaw(saw: Saw, system: UnitSystem): SawFormValues {
  const values = emptySawFormValues();
  values.assetTag = saw.assetTag;
  values.name = saw.name;
  values.kind = saw.kind;
  values.headFeed = saw.headFeed;
  values.make = saw.make ?? '';
  values.model = saw.model ?? '';
  for (const [field, si] of Object.entries(LENGTH_FIELDS) as [LengthField, (typeof LENGTH_FIELDS)[LengthField]][]) {
    const mm = saw[si];
    values[field] = mm === null ? '' : plain(lengthFromMm(mm, system), 4);
  }
  for (const [field, si] of Object.entries(SPEED_FIELDS) as [SpeedField, (typeof SPEED_FIELDS)[SpeedField]][]) {
    values[field] = plain(speedFromMPerMin(saw[si], system), 3);
  }
  for (const [field, si] of Object.entries(FORCE_FIELDS) as [ForceField, (typeof FORCE_FIELDS)[ForceField]][]) {
    const newtons = saw[si];
    values[field] = newtons === null ? '' : plain(forceFromN(newtons, system), 3);
  }
  return values;
}

/**
 * A decimal number as typed: digits with an optional point (`1.25`, `.042`, `14`). Blank gives undefined,
 * anything else (commas, fractions, units) NaN, so the form can say which of the two happened.
 */
export function parseDecimal(text: string): number | undefined {
  const trimmed = text.trim();
  if (trimmed === '') return undefined;
  return /^\+?(\d+\.?\d*|\.\d+)$/.test(trimmed) ? Number(trimmed) : Number.NaN;
}

/**
 * Form values to the domain's create input in SI units, plus the errors only the form can word well
 * (a blank required measurement, text that is not a number). Everything else is left to the schema.
 */
export function sawInputFromForm(
  values: SawFormValues,
  siteId: string,
  system: UnitSystem,
): { input: SawCreate; fieldErrors: Partial<Record<SawFormField, string>> } {
  const fieldErrors: Partial<Record<SawFormField, string>> = {};
  const measures: Partial<Record<keyof SawCreateParsed, number | null | undefined>> = {};

  const read = (field: MeasureField, toSi: (value: number) => number, si: keyof SawCreateParsed) => {
    const value = parseDecimal(values[field]);
    const label = MEASURE_LABELS[field];
    if (value === undefined) {
      if (OPTIONAL_FIELDS.has(field)) measures[si] = null;
      else fieldErrors[field] = `Enter the ${label.toLowerCase()}`;
      return;
    }
    if (Number.isNaN(value)) {
      fieldErrors[field] = `${label} must be a number written with a decimal point, such as 1.25`;
      return;
    }
    measures[si] = toSi(value);
  };
  for (const [field, si] of Object.entries(LENGTH_FIELDS) as [LengthField, keyof SawCreateParsed][]) {
    read(field, (value) => lengthToMm(value, system), si);
  }
  for (const [field, si] of Object.entries(SPEED_FIELDS) as [SpeedField, keyof SawCreateParsed][]) {
    read(field, (value) => speedToMPerMin(value, system), si);
  }
  for (const [field, si] of Object.entries(FORCE_FIELDS) as [ForceField, keyof SawCreateParsed][]) {
    read(field, (value) => forceToN(value, system), si);
  }

  const optionalText = (text: string) => (text.trim() === '' ? null : text);
  const input = {
    siteId,
    assetTag: values.assetTag,
    name: values.name,
    kind: values.kind === '' ? undefined : values.kind,
    headFeed: values.headFeed,
    make: optionalText(values.make),
    model: optionalText(values.model),
    ...measures,
  } as SawCreate;
  return { input, fieldErrors };
}
