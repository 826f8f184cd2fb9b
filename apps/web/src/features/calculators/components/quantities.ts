import type { UnitSystem } from '@kerfline/domain/sites/schema';
import {
  DISPLAY_UNITS,
  formatNumber,
  areaFromDisplay,
  areaRateFromDisplay,
  areaRateToDisplay,
  areaToDisplay,
  bandSpeedFromDisplay,
  bandSpeedToDisplay,
  forceFromDisplay,
  forceToDisplay,
  lengthFromDisplay,
  lengthToDisplay,
  parseDisplayNumber,
  stressFromDisplay,
  stressToDisplay,
  type DisplayOptions,
  type DisplayQuantityKind,
  type DisplayValue,
} from '@kerfline/domain/units/display';
import { UNIT_SYSTEMS } from '@kerfline/domain/sites/schema';

/**
 * The calculators' edge between what people type (in their unit system) and what the domain computes with
 * (SI: mm, mm², m/min, N, Pa). Conversions are the domain's own (`units/display.ts`, exact NIST factors).
 */

export type Quantity = DisplayQuantityKind;

const FROM_DISPLAY: Record<Quantity, (value: number, system: UnitSystem) => number> = {
  length: lengthFromDisplay,
  bandSpeed: bandSpeedFromDisplay,
  area: areaFromDisplay,
  areaRate: areaRateFromDisplay,
  force: forceFromDisplay,
  stress: stressFromDisplay,
};

const TO_DISPLAY: Record<Quantity, (si: number, system: UnitSystem, options?: DisplayOptions) => DisplayValue> = {
  length: lengthToDisplay,
  bandSpeed: bandSpeedToDisplay,
  area: areaToDisplay,
  areaRate: areaRateToDisplay,
  force: forceToDisplay,
  stress: stressToDisplay,
};

/** The label printed beside a value of this quantity: mm or in, m/min or fpm, cm² or in²… */
export function unitLabel(quantity: Quantity, system: UnitSystem): string {
  return DISPLAY_UNITS[quantity][system].unit;
}

/** A value typed in the user's unit, in SI (mm, mm², m/min, N or Pa). */
export function toSi(quantity: Quantity, value: number, system: UnitSystem): number {
  return FROM_DISPLAY[quantity](value, system);
}

/** An SI value ready to print in the user's unit; `decimals` overrides the quantity's default. */
export function showQuantity(quantity: Quantity, si: number, system: UnitSystem, decimals?: number): DisplayValue {
  const shown = TO_DISPLAY[quantity](si, system, decimals === undefined ? {} : { decimals });
  // A non-breaking space keeps a value and its unit on one line.
  return { ...shown, text: shown.text.replace(' ', '\u00a0') };
}

/** A figure split for display: the number as printed (thousands grouped) and its unit. */
export interface Figure {
  number: string;
  unit: string;
  /** Number and unit together, joined by a non-breaking space. */
  text: string;
}

/** An SI value as a figure in the user's unit, at the quantity's usual decimals unless `decimals` is given. */
export function figure(quantity: Quantity, si: number, system: UnitSystem, decimals?: number): Figure {
  const places = decimals ?? DISPLAY_UNITS[quantity][system].decimals;
  const shown = showQuantity(quantity, si, system, places);
  return { number: formatNumber(shown.value, places), unit: shown.unit, text: shown.text };
}

/** Two SI values as one range in the user's unit, e.g. `50–90` m/min; one figure when they print alike. */
export function rangeFigure(
  quantity: Quantity,
  minSi: number,
  maxSi: number,
  system: UnitSystem,
  decimals?: number,
): Figure {
  const low = figure(quantity, minSi, system, decimals);
  const high = figure(quantity, maxSi, system, decimals);
  if (low.number === high.number) return low;
  const number = `${low.number}–${high.number}`;
  return { number, unit: low.unit, text: `${number}\u00a0${low.unit}` };
}

/**
 * Decimals kept when a typed value is carried over to the other unit system: fine enough that the SI value
 * moves by less than any saw's tolerance (0.0001 in = 0.00254 mm), coarse enough to read.
 */
const CARRY_DECIMALS: Record<Quantity, Record<UnitSystem, number>> = {
  length: { imperial: 4, metric: 2 },
  bandSpeed: { imperial: 1, metric: 1 },
  area: { imperial: 3, metric: 2 },
  areaRate: { imperial: 3, metric: 2 },
  force: { imperial: 2, metric: 1 },
  stress: { imperial: 0, metric: 2 },
};

/** What a user typed into a field, and the unit system it was typed in. */
export interface Entry {
  text: string;
  system: UnitSystem;
}

/**
 * The text a field shows in `system`. A value typed in the other system is shown converted, while the entry
 * keeps what was typed: switching units back and forth never drifts, and the result is computed from the
 * value exactly as entered.
 */
export function entryText(entry: Entry, quantity: Quantity | null, system: UnitSystem): string {
  if (quantity === null || entry.system === system) return entry.text;
  const parsed = parseDisplayNumber(entry.text);
  if (!parsed.ok) return entry.text;
  const si = toSi(quantity, parsed.value, entry.system);
  return String(showQuantity(quantity, si, system, CARRY_DECIMALS[quantity][system]).value);
}

export type Reading = { kind: 'empty' } | { kind: 'invalid'; message: string } | { kind: 'value'; value: number };

/** Reads a plain number (a count, a TPI) as typed; fractions such as 1 1/4 are accepted. */
export function readNumber(text: string): Reading {
  if (text.trim() === '') return { kind: 'empty' };
  const parsed = parseDisplayNumber(text);
  return parsed.ok ? { kind: 'value', value: parsed.value } : { kind: 'invalid', message: parsed.message };
}

/** Reads a field's entry as an SI value, converting from the system it was typed in. */
export function readQuantity(entry: Entry, quantity: Quantity): Reading {
  const reading = readNumber(entry.text);
  return reading.kind === 'value' ? { kind: 'value', value: toSi(quantity, reading.value, entry.system) } : reading;
}

/** The units the domain's messages are written in, each with the quantity it measures and its factor to SI. */
const SI_UNITS: { unit: string; quantity: Quantity; toSi: number }[] = [
  { unit: 'mm²/min', quantity: 'areaRate', toSi: 1 },
  { unit: 'mm²', quantity: 'area', toSi: 1 },
  { unit: 'mm', quantity: 'length', toSi: 1 },
  { unit: 'm/min', quantity: 'bandSpeed', toSi: 1 },
  { unit: 'MPa', quantity: 'stress', toSi: 1e6 },
  { unit: 'N', quantity: 'force', toSi: 1 },
];

const escape = (text: string) => text.replace(/[/]/g, '\\/');
// A figure (thousands grouped by commas or spaces, as the domain writes them) followed by one of its units.
const FIGURE_WITH_UNIT = new RegExp(
  `(\\d{1,3}(?:[ ,]\\d{3})+(?:\\.\\d+)?|\\d+(?:\\.\\d+)?)[ \\u00a0](${SI_UNITS.map((u) => escape(u.unit)).join('|')})(?![\\w²/])`,
  'g',
);

/**
 * A domain message (written in SI) made readable in the user's system: each figure keeps its SI unit and, where
 * the user works in another unit, gains its equivalent in brackets — "at most 3000 mm" reads "at most 3,000 mm
 * (118.11 in)" to an imperial user. Figures are regrouped with commas and long float tails rounded.
 */
export function messageInUnits(message: string, system: UnitSystem): string {
  return message.replace(FIGURE_WITH_UNIT, (_whole, figure: string, unit: string) => {
    const info = SI_UNITS.find((u) => u.unit === unit)!;
    const value = Number(figure.replace(/[ ,]/g, ''));
    const written = `${new Intl.NumberFormat('en-US', { maximumFractionDigits: 4 }).format(value)} ${unit}`;
    const shownUnit = unitLabel(info.quantity, system);
    // Zero is zero in every unit: "greater than 0 mm" needs no "(0.00 in)".
    if (shownUnit === unit || value === 0) return written;
    const si = value * info.toSi;
    let converted = showQuantity(info.quantity, si, system);
    // A small limit (a few hundredths of a millimetre) would print as 0.00 in at the default decimals.
    if (converted.value === 0 && si !== 0) converted = showQuantity(info.quantity, si, system, 4);
    return `${written} (${converted.text})`;
  });
}

/** `?units=` as the calculators write it; anything else counts as not given. */
export function unitSystemParam(value: string | null): UnitSystem | null {
  return value !== null && (UNIT_SYSTEMS as readonly string[]).includes(value) ? (value as UnitSystem) : null;
}
