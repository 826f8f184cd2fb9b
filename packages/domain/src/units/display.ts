/**
 * Showing and reading quantities in a site's unit system. Kerfline keeps SI inside (mm, mm², m/min, N, Pa);
 * these helpers convert at the edge with the exact factors of `units.ts` and round to a number of decimals
 * that suits each quantity on the shop floor (1.25 in / 31.8 mm, 246 fpm / 75 m/min).
 */
import type { UnitSystem } from '../sites/schema.js';
import {
  fpmToMPerMin,
  in2ToMm2,
  inToMm,
  lbfToN,
  mm2ToIn2,
  mmToIn,
  mPerMinToFpm,
  nToLbf,
  paToPsi,
  psiToPa,
  cm2ToMm2,
  mm2ToCm2,
} from './units.js';

export type { UnitSystem };

/** The quantities the product shows, each with one unit and a default number of decimals per system. */
export const DISPLAY_QUANTITIES = ['length', 'bandSpeed', 'area', 'areaRate', 'force', 'stress'] as const;
export type DisplayQuantityKind = (typeof DISPLAY_QUANTITIES)[number];

export interface DisplayUnit {
  /** The label printed beside the value. */
  unit: string;
  /** Decimals shown by default. */
  decimals: number;
}

/**
 * Unit and default decimals for each quantity. Lengths: inches to 0.01 in, millimetres to 0.1 mm; band speed in
 * whole fpm or m/min; areas in in² or cm² (a cut face is easier to read in cm² than in thousands of mm²);
 * stress in psi or MPa.
 */
export const DISPLAY_UNITS: Record<DisplayQuantityKind, Record<UnitSystem, DisplayUnit>> = {
  length: { imperial: { unit: 'in', decimals: 2 }, metric: { unit: 'mm', decimals: 1 } },
  bandSpeed: { imperial: { unit: 'ft/min', decimals: 0 }, metric: { unit: 'm/min', decimals: 0 } },
  area: { imperial: { unit: 'in²', decimals: 2 }, metric: { unit: 'cm²', decimals: 1 } },
  areaRate: { imperial: { unit: 'in²/min', decimals: 2 }, metric: { unit: 'cm²/min', decimals: 1 } },
  force: { imperial: { unit: 'lbf', decimals: 0 }, metric: { unit: 'N', decimals: 0 } },
  stress: { imperial: { unit: 'psi', decimals: 0 }, metric: { unit: 'MPa', decimals: 1 } },
};

/** A quantity ready to print: the rounded value in the display unit, the unit label and the formatted text. */
export interface DisplayValue {
  value: number;
  unit: string;
  /** e.g. "1.25 in", "1,250 fpm"; thousands separated. */
  text: string;
}

export interface DisplayOptions {
  /** Overrides the quantity's default decimals. */
  decimals?: number;
  /** BCP 47 locale for separators; "en-US" unless given. */
  locale?: string;
}

function roundTo(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  const rounded = Math.round(value * factor) / factor;
  // Math.round(-0.4) is -0; a printed "-0" would read as a negative quantity.
  return Object.is(rounded, -0) ? 0 : rounded;
}

/** Formats a number with a fixed number of decimals and thousands separators. */
export function formatNumber(value: number, decimals: number, locale = 'en-US'): string {
  return new Intl.NumberFormat(locale, {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  }).format(roundTo(value, decimals));
}

function toDisplay(kind: DisplayQuantityKind, valueInDisplayUnit: number, system: UnitSystem, options: DisplayOptions) {
  const { unit, decimals: defaultDecimals } = DISPLAY_UNITS[kind][system];
  const decimals = options.decimals ?? defaultDecimals;
  return {
    value: roundTo(valueInDisplayUnit, decimals),
    unit,
    text: `${formatNumber(valueInDisplayUnit, decimals, options.locale)} ${unit}`,
  };
}

/** Length in millimetres → inches (imperial) or millimetres (metric). */
export function lengthToDisplay(lengthMm: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('length', system === 'imperial' ? mmToIn(lengthMm) : lengthMm, system, options);
}

/** A length typed in the site's unit (inches or millimetres) → millimetres. */
export function lengthFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? inToMm(value) : value;
}

/** Band speed in m/min → feet per minute (imperial) or metres per minute (metric). */
export function bandSpeedToDisplay(
  speedMPerMin: number,
  system: UnitSystem,
  options: DisplayOptions = {},
): DisplayValue {
  return toDisplay('bandSpeed', system === 'imperial' ? mPerMinToFpm(speedMPerMin) : speedMPerMin, system, options);
}

/** A band speed typed in fpm or m/min → m/min. */
export function bandSpeedFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? fpmToMPerMin(value) : value;
}

/** Area in mm² → in² (imperial) or cm² (metric). */
export function areaToDisplay(areaMm2: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('area', system === 'imperial' ? mm2ToIn2(areaMm2) : mm2ToCm2(areaMm2), system, options);
}

/** An area typed in in² or cm² → mm². */
export function areaFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? in2ToMm2(value) : cm2ToMm2(value);
}

/** Cutting rate in mm²/min → in²/min (imperial) or cm²/min (metric). */
export function areaRateToDisplay(
  rateMm2PerMin: number,
  system: UnitSystem,
  options: DisplayOptions = {},
): DisplayValue {
  return toDisplay(
    'areaRate',
    system === 'imperial' ? mm2ToIn2(rateMm2PerMin) : mm2ToCm2(rateMm2PerMin),
    system,
    options,
  );
}

/** A cutting rate typed in in²/min or cm²/min → mm²/min. */
export function areaRateFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? in2ToMm2(value) : cm2ToMm2(value);
}

/** Force in newtons → pounds-force (imperial) or newtons (metric). */
export function forceToDisplay(forceN: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('force', system === 'imperial' ? nToLbf(forceN) : forceN, system, options);
}

/** A force typed in lbf or N → N. */
export function forceFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? lbfToN(value) : value;
}

/** Stress in pascals → psi (imperial) or MPa (metric). */
export function stressToDisplay(stressPa: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('stress', system === 'imperial' ? paToPsi(stressPa) : stressPa / 1e6, system, options);
}

/** A stress typed in psi or MPa → Pa. */
export function stressFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? psiToPa(value) : value * 1e6;
}

export type ParsedNumber = { ok: true; value: number } | { ok: false; message: string };

const DECIMAL = /^[+-]?(?:\d{1,3}(?:,\d{3})+|\d+)?(?:\.\d+)?$/;
const FRACTION = /^(?:(\d+)[\s-]+)?(\d+)\/(\d+)$/;

/**
 * Reads a number as people type it into a shop form: "1250", "1,250.5", ".75", and — because imperial shops size
 * stock in fractions — "3/4", "1 1/4" or "1-1/4". Commas are read as thousands separators only (groups of three),
 * so "1,5" is refused rather than guessed. Returns a message instead of throwing.
 */
export function parseDisplayNumber(text: string): ParsedNumber {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: false, message: 'Enter a number' };
  const fraction = FRACTION.exec(trimmed);
  if (fraction) {
    const whole = fraction[1] === undefined ? 0 : Number(fraction[1]);
    const denominator = Number(fraction[3]);
    if (denominator === 0) return { ok: false, message: 'A fraction cannot have 0 below the line' };
    return { ok: true, value: whole + Number(fraction[2]) / denominator };
  }
  if (!DECIMAL.test(trimmed) || !/\d/.test(trimmed)) {
    return {
      ok: false,
      message: `"${trimmed}" is not a number: use digits with a point for decimals, e.g. 1250.5 or 1 1/4`,
    };
  }
  return { ok: true, value: Number(trimmed.replaceAll(',', '')) };
}
