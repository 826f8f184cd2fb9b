/**
 * Showing and reading quantities in a site's unit system: the one formatting policy of the product (the web's
 * `lib/format.ts` is a thin layer over it). Kerfline keeps SI inside (mm, mm², m/min, N, Pa); these helpers
 * convert at the edge with the exact factors of `units.ts` and print as many decimals as each quantity deserves
 * on the shop floor (1.25 in / 31.8 mm, 246 ft/min / 75 m/min, 0.042 in / 1.07 mm).
 */
import type { UnitSystem } from '../sites/schema.js';
import { numberFormat as cachedNumberFormat } from '../common/number-format.js';
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
  MM2_PER_IN2,
} from './units.js';

export type { UnitSystem };

/**
 * The quantities the product shows, each with one unit per system. `smallLength` is a length read with feeler
 * gauges or a micrometer (band thickness, guide clearance, bearing wear): thousandths of an inch, hundredths of
 * a millimetre.
 */
export const DISPLAY_QUANTITIES = [
  'length',
  'smallLength',
  'bandSpeed',
  'area',
  'largeArea',
  'areaRate',
  'force',
  'stress',
] as const;
export type DisplayQuantityKind = (typeof DISPLAY_QUANTITIES)[number];

export interface DisplayUnit {
  /** The label printed beside the value. */
  unit: string;
  /** Decimals of a fixed-width column of this quantity (`{ decimals }`, `formatNumber`). */
  decimals: number;
}

/**
 * Unit and column decimals for each quantity. Lengths: inches to 0.01 in, millimetres to 0.1 mm; small lengths
 * to 0.001 in or 0.01 mm; band speed in whole ft/min or m/min; areas in in² or cm² (a cut face is easier to read
 * in cm² than in thousands of mm²); force in lbf or N; stress in psi or MPa.
 */
export const DISPLAY_UNITS: Record<DisplayQuantityKind, Record<UnitSystem, DisplayUnit>> = {
  length: { imperial: { unit: 'in', decimals: 2 }, metric: { unit: 'mm', decimals: 1 } },
  smallLength: { imperial: { unit: 'in', decimals: 3 }, metric: { unit: 'mm', decimals: 2 } },
  bandSpeed: { imperial: { unit: 'ft/min', decimals: 0 }, metric: { unit: 'm/min', decimals: 0 } },
  area: { imperial: { unit: 'in²', decimals: 2 }, metric: { unit: 'cm²', decimals: 1 } },
  largeArea: { imperial: { unit: 'ft²', decimals: 1 }, metric: { unit: 'm²', decimals: 2 } },
  areaRate: { imperial: { unit: 'in²/min', decimals: 2 }, metric: { unit: 'cm²/min', decimals: 1 } },
  force: { imperial: { unit: 'lbf', decimals: 0 }, metric: { unit: 'N', decimals: 0 } },
  stress: { imperial: { unit: 'psi', decimals: 0 }, metric: { unit: 'MPa', decimals: 1 } },
};

/** A quantity ready to print: the rounded value in the display unit, the unit label and the formatted text. */
export interface DisplayValue {
  value: number;
  unit: string;
  /** e.g. "1.25 in", "1,250 ft/min"; thousands separated. */
  text: string;
}

export interface DisplayOptions {
  /** Fixed decimals (trailing zeros kept), overriding the formatting policy. */
  decimals?: number;
  /** BCP 47 locale for separators; "en-US" unless given. */
  locale?: string;
}

/*
 * The formatting policy, one for the whole product. Without `{ decimals }`, a figure shows as many decimals
 * as its size deserves in its unit, and no trailing zeros:
 *   length        in: below 10 → 3, below 100 → 2, below 1,000 → 1, else 0  (0.042 in, 1.25 in, 52.87 in, 162 in)
 *                 mm: below 10 → 2, below 1,000 → 1, else 0                   (0.9 mm, 31.8 mm, 3,505 mm)
 *   smallLength   in: 3 decimals, zeros kept (0.035 in, 0.050 in); mm: 2 decimals, zeros kept (0.89 mm, 1.10 mm)
 *   bandSpeed     whole ft/min and m/min (the resolution of a saw's speed dial)
 *   area, rate    in²: below 100 → 2, below 10,000 → 1, else 0; cm²: below 10 → 2, below 1,000 → 1, else 0
 *   force         below 100 → 1, else 0 (8 lbf, 35.6 N, 1,000 lbf)
 *   stress        psi: whole; MPa: below 1,000 → 1 (30,000 psi, 206.8 MPa)
 * A figure below 1 keeps at least two significant digits (up to 4 decimals), so a tolerance of 0.001 in or
 * 0.0254 mm never prints as 0. Money per area: see `moneyPerAreaToDisplay`.
 */
interface Precision {
  /** [below this size, decimals] in increasing order of size. */
  steps: readonly (readonly [number, number])[];
  /** Decimals at and above the last step. */
  otherwise: number;
  /** Keep trailing zeros (gauges are written 0.050 in). */
  keepZeros?: boolean;
}

const POLICY: Record<DisplayQuantityKind, Record<UnitSystem, Precision>> = {
  length: {
    imperial: {
      steps: [
        [10, 3],
        [100, 2],
        [1000, 1],
      ],
      otherwise: 0,
    },
    metric: {
      steps: [
        [10, 2],
        [1000, 1],
      ],
      otherwise: 0,
    },
  },
  smallLength: {
    imperial: { steps: [], otherwise: 3, keepZeros: true },
    metric: { steps: [], otherwise: 2, keepZeros: true },
  },
  bandSpeed: { imperial: { steps: [], otherwise: 0 }, metric: { steps: [], otherwise: 0 } },
  area: {
    imperial: {
      steps: [
        [100, 2],
        [10000, 1],
      ],
      otherwise: 0,
    },
    metric: {
      steps: [
        [10, 2],
        [1000, 1],
      ],
      otherwise: 0,
    },
  },
  largeArea: {
    imperial: {
      steps: [
        [10, 2],
        [1000, 1],
      ],
      otherwise: 0,
    },
    metric: {
      steps: [
        [10, 2],
        [1000, 1],
      ],
      otherwise: 0,
    },
  },
  areaRate: {
    imperial: {
      steps: [
        [100, 2],
        [10000, 1],
      ],
      otherwise: 0,
    },
    metric: {
      steps: [
        [10, 2],
        [1000, 1],
      ],
      otherwise: 0,
    },
  },
  force: { imperial: { steps: [[100, 1]], otherwise: 0 }, metric: { steps: [[100, 1]], otherwise: 0 } },
  stress: { imperial: { steps: [], otherwise: 0 }, metric: { steps: [[1000, 1]], otherwise: 0 } },
};

/** Most decimals the policy ever shows (for two significant digits of a small figure). */
const MAX_DECIMALS = 4;

/** Decimals that keep two significant digits of a figure below 1 (0.0254 → 3), capped at `MAX_DECIMALS`. */
function significantDecimals(value: number): number {
  const size = Math.abs(value);
  if (size === 0 || size >= 1 || !Number.isFinite(size)) return 0;
  return Math.min(MAX_DECIMALS, 1 - Math.floor(Math.log10(size)));
}

/** The decimals the policy gives a value of this quantity, already in its display unit: [fewest, most]. */
export function policyDecimals(
  kind: DisplayQuantityKind,
  valueInDisplayUnit: number,
  system: UnitSystem,
): { min: number; max: number } {
  const precision = POLICY[kind][system];
  const size = Math.abs(valueInDisplayUnit);
  const step = precision.steps.find(([below]) => size < below);
  const decimals = step ? step[1] : precision.otherwise;
  const max = Math.max(decimals, significantDecimals(valueInDisplayUnit));
  return { min: precision.keepZeros ? decimals : 0, max };
}

function roundTo(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  const rounded = Math.round(value * factor) / factor;
  // Math.round(-0.4) is -0; a printed "-0" would read as a negative quantity.
  return Object.is(rounded, -0) ? 0 : rounded;
}

const formats = new Map<string, Intl.NumberFormat>();
function numberFormat(locale: string, min: number, max: number): Intl.NumberFormat {
  const key = `${locale}|${min}|${max}`;
  let format = formats.get(key);
  if (!format) {
    format = new Intl.NumberFormat(locale, { minimumFractionDigits: min, maximumFractionDigits: max });
    formats.set(key, format);
  }
  return format;
}

/** Formats a number with a fixed number of decimals and thousands separators. */
export function formatNumber(value: number, decimals: number, locale = 'en-US'): string {
  return numberFormat(locale, decimals, decimals).format(roundTo(value, decimals));
}

/** A value in a display unit → the number as the policy prints it (or with fixed `decimals`) and its rounded value. */
function printed(kind: DisplayQuantityKind, valueInDisplayUnit: number, system: UnitSystem, options: DisplayOptions) {
  const { min, max } =
    options.decimals === undefined
      ? policyDecimals(kind, valueInDisplayUnit, system)
      : { min: options.decimals, max: options.decimals };
  const value = roundTo(valueInDisplayUnit, max);
  return { value, number: numberFormat(options.locale ?? 'en-US', min, max).format(value) };
}

function toDisplay(
  kind: DisplayQuantityKind,
  valueInDisplayUnit: number,
  system: UnitSystem,
  options: DisplayOptions,
): DisplayValue {
  const { unit } = DISPLAY_UNITS[kind][system];
  const { value, number } = printed(kind, valueInDisplayUnit, system, options);
  return { value, unit, text: `${number} ${unit}` };
}

/** Length in millimetres → inches (imperial) or millimetres (metric). */
export function lengthToDisplay(lengthMm: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('length', system === 'imperial' ? mmToIn(lengthMm) : lengthMm, system, options);
}

/** A length typed in the site's unit (inches or millimetres) → millimetres. */
export function lengthFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? inToMm(value) : value;
}

/** A small length (band gauge, clearance, wear) in millimetres → thousandths of an inch or hundredths of a mm. */
export function smallLengthToDisplay(lengthMm: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('smallLength', system === 'imperial' ? mmToIn(lengthMm) : lengthMm, system, options);
}

/** A small length typed in inches or millimetres → millimetres. */
export const smallLengthFromDisplay = lengthFromDisplay;

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

/** 1 ft² = 0.3048² m² = 92 903.04 mm² exactly (NIST SP 811 B.8: 1 ft = 0.3048 m). */
const MM2_PER_FT2 = 92_903.04;

/**
 * A large area (the area a blade cut in its life, a site's month of cutting) in mm² → ft² (imperial) or m²
 * (metric): 4 500 000 mm² reads 48.4 ft² or 4.50 m², not 6,975 in² or 45,000 cm².
 */
export function largeAreaToDisplay(areaMm2: number, system: UnitSystem, options: DisplayOptions = {}): DisplayValue {
  return toDisplay('largeArea', system === 'imperial' ? areaMm2 / MM2_PER_FT2 : areaMm2 / 1e6, system, options);
}

/** A large area typed in ft² or m² → mm². */
export function largeAreaFromDisplay(value: number, system: UnitSystem): number {
  return system === 'imperial' ? value * MM2_PER_FT2 : value * 1e6;
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

/**
 * The SI unit each quantity is handed over in: mm, mm, m/min, mm², mm²/min, N, Pa. (The display functions
 * take and give these.)
 */
export const SI_UNITS: Record<DisplayQuantityKind, string> = {
  length: 'mm',
  smallLength: 'mm',
  bandSpeed: 'm/min',
  area: 'mm²',
  largeArea: 'mm²',
  areaRate: 'mm²/min',
  force: 'N',
  stress: 'Pa',
};

const TO_DISPLAY: Record<
  DisplayQuantityKind,
  (si: number, system: UnitSystem, options?: DisplayOptions) => DisplayValue
> = {
  length: lengthToDisplay,
  smallLength: smallLengthToDisplay,
  bandSpeed: bandSpeedToDisplay,
  area: areaToDisplay,
  largeArea: largeAreaToDisplay,
  areaRate: areaRateToDisplay,
  force: forceToDisplay,
  stress: stressToDisplay,
};

const FROM_DISPLAY: Record<DisplayQuantityKind, (value: number, system: UnitSystem) => number> = {
  length: lengthFromDisplay,
  smallLength: smallLengthFromDisplay,
  bandSpeed: bandSpeedFromDisplay,
  area: areaFromDisplay,
  largeArea: largeAreaFromDisplay,
  areaRate: areaRateFromDisplay,
  force: forceFromDisplay,
  stress: stressFromDisplay,
};

/** Any quantity, in SI (see `SI_UNITS`), shown in a unit system by the policy. */
export function quantityToDisplay(
  kind: DisplayQuantityKind,
  si: number,
  system: UnitSystem,
  options: DisplayOptions = {},
): DisplayValue {
  return TO_DISPLAY[kind](si, system, options);
}

/** Any quantity typed in a unit system's unit → SI (see `SI_UNITS`). */
export function quantityFromDisplay(kind: DisplayQuantityKind, value: number, system: UnitSystem): number {
  return FROM_DISPLAY[kind](value, system);
}

/** The number of a displayed figure without its unit ("1,250"), as the policy prints it. */
export function quantityNumber(
  kind: DisplayQuantityKind,
  si: number,
  system: UnitSystem,
  options: DisplayOptions = {},
): string {
  const shown = quantityToDisplay(kind, si, system, options);
  return shown.text.slice(0, shown.text.length - shown.unit.length - 1);
}

export const OTHER_SYSTEM: Record<UnitSystem, UnitSystem> = { metric: 'imperial', imperial: 'metric' };

/**
 * A figure in the site's own unit first and the other system's second, e.g. "0.043 in (1.09 mm)" on an
 * imperial site and "1.09 mm (0.043 in)" on a metric one. Where one unit serves both (none today) the figure
 * shows once.
 */
export function dualText(
  kind: DisplayQuantityKind,
  si: number,
  system: UnitSystem,
  options: Omit<DisplayOptions, 'decimals'> = {},
): string {
  const first = quantityToDisplay(kind, si, system, options);
  const second = quantityToDisplay(kind, si, OTHER_SYSTEM[system], options);
  return first.unit === second.unit ? first.text : `${first.text} (${second.text})`;
}

/** Decimals of an amount of money in a currency (2 for USD, 0 for JPY), from the platform's currency data. */
function currencyDigits(currency: string): number {
  return cachedNumberFormat('en-US', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/**
 * Cost per area cut: minor units of `currency` (cents) per mm² → major units per in² (imperial) or per cm²
 * (metric), e.g. "$0.012/in²" and "€0.0019/cm²". Money keeps at least its currency's decimals and at least two
 * significant digits, since a cost per square inch is usually a fraction of a cent or a few cents.
 */
export function moneyPerAreaToDisplay(
  minorUnitsPerMm2: number,
  currency: string,
  system: UnitSystem,
  options: Pick<DisplayOptions, 'locale'> = {},
): DisplayValue {
  const digits = currencyDigits(currency);
  const perUnit = minorUnitsPerMm2 / 10 ** digits;
  const value = system === 'imperial' ? perUnit * MM2_PER_IN2 : perUnit * 100;
  const unit = system === 'imperial' ? 'in²' : 'cm²';
  const decimals = Math.max(digits, significantDecimals(value));
  const rounded = roundTo(value, decimals);
  const money = cachedNumberFormat(options.locale ?? 'en-US', {
    style: 'currency',
    currency,
    minimumFractionDigits: digits,
    maximumFractionDigits: decimals,
  }).format(rounded);
  return { value: rounded, unit: `${currency}/${unit}`, text: `${money}/${unit}` };
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
