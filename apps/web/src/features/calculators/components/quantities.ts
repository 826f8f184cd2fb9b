import type { UnitSystem } from '@kerfline/domain/sites/schema';
import {
  DISPLAY_UNITS,
  OTHER_SYSTEM,
  parseDisplayNumber,
  quantityFromDisplay,
  quantityNumber,
  quantityToDisplay,
  type DisplayQuantityKind,
  type DisplayValue,
} from '@kerfline/domain/units/display';
import { MM2_PER_IN2, MM_PER_INCH, M_PER_FOOT, N_PER_LBF, PA_PER_PSI } from '@kerfline/domain/units/units';
import { UNIT_SYSTEMS } from '@kerfline/domain/sites/schema';

/**
 * The calculators' edge between what people type (in their unit system) and what the domain computes with
 * (SI: mm, mm², m/min, N, Pa). Conversions and the formatting policy are the domain's own (`units/display.ts`,
 * exact NIST factors).
 */

export type Quantity = DisplayQuantityKind;

const NBSP = '\u00a0';

/** The label printed beside a value of this quantity: mm or in, m/min or ft/min, cm² or in²… */
export function unitLabel(quantity: Quantity, system: UnitSystem): string {
  return DISPLAY_UNITS[quantity][system].unit;
}

/** A value typed in the user's unit, in SI (mm, mm², m/min, N or Pa). */
export function toSi(quantity: Quantity, value: number, system: UnitSystem): number {
  return quantityFromDisplay(quantity, value, system);
}

/** An SI value ready to print in the user's unit, by the policy or with fixed `decimals`. */
export function showQuantity(quantity: Quantity, si: number, system: UnitSystem, decimals?: number): DisplayValue {
  const shown = quantityToDisplay(quantity, si, system, decimals === undefined ? {} : { decimals });
  // A non-breaking space keeps a value and its unit on one line.
  return { ...shown, text: shown.text.replace(' ', NBSP) };
}

/** A figure split for display: the number as printed (thousands grouped) and its unit. */
export interface Figure {
  number: string;
  unit: string;
  /** Number and unit together, joined by a non-breaking space. */
  text: string;
}

/** An SI value as a figure in the user's unit, by the formatting policy unless fixed `decimals` are given. */
export function figure(quantity: Quantity, si: number, system: UnitSystem, decimals?: number): Figure {
  const options = decimals === undefined ? {} : { decimals };
  const number = quantityNumber(quantity, si, system, options);
  const unit = unitLabel(quantity, system);
  return { number, unit, text: `${number}${NBSP}${unit}` };
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
  return { number, unit: low.unit, text: `${number}${NBSP}${low.unit}` };
}

/**
 * Decimals kept when a typed value is carried over to the other unit system: fine enough that the SI value
 * moves by less than any saw's tolerance (0.0001 in = 0.00254 mm), coarse enough to read.
 */
const CARRY_DECIMALS: Record<Quantity, Record<UnitSystem, number>> = {
  length: { imperial: 4, metric: 2 },
  smallLength: { imperial: 4, metric: 3 },
  bandSpeed: { imperial: 1, metric: 1 },
  area: { imperial: 3, metric: 2 },
  largeArea: { imperial: 2, metric: 3 },
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

/** The units a message may write a figure in: its quantity, its system and its factor to SI. */
const MESSAGE_UNITS: { unit: string; quantity: Quantity; system: UnitSystem; toSi: number }[] = [
  { unit: 'mm²/min', quantity: 'areaRate', system: 'metric', toSi: 1 },
  { unit: 'cm²/min', quantity: 'areaRate', system: 'metric', toSi: 100 },
  { unit: 'in²/min', quantity: 'areaRate', system: 'imperial', toSi: MM2_PER_IN2 },
  { unit: 'mm²', quantity: 'area', system: 'metric', toSi: 1 },
  { unit: 'cm²', quantity: 'area', system: 'metric', toSi: 100 },
  { unit: 'in²', quantity: 'area', system: 'imperial', toSi: MM2_PER_IN2 },
  { unit: 'mm', quantity: 'length', system: 'metric', toSi: 1 },
  { unit: 'in', quantity: 'length', system: 'imperial', toSi: MM_PER_INCH },
  { unit: 'm/min', quantity: 'bandSpeed', system: 'metric', toSi: 1 },
  { unit: 'ft/min', quantity: 'bandSpeed', system: 'imperial', toSi: M_PER_FOOT },
  { unit: 'fpm', quantity: 'bandSpeed', system: 'imperial', toSi: M_PER_FOOT },
  { unit: 'MPa', quantity: 'stress', system: 'metric', toSi: 1e6 },
  { unit: 'psi', quantity: 'stress', system: 'imperial', toSi: PA_PER_PSI },
  { unit: 'lbf', quantity: 'force', system: 'imperial', toSi: N_PER_LBF },
  { unit: 'N', quantity: 'force', system: 'metric', toSi: 1 },
];
/** The SI units the domain writes its messages in: a figure in one of these may stand alone. */
const SI_MESSAGE_UNITS = new Set(['mm²/min', 'mm²', 'mm', 'm/min', 'MPa', 'N']);

const escape = (text: string) => text.replace(/[/]/g, '\\/');
const UNIT_PATTERN = MESSAGE_UNITS.map((u) => escape(u.unit)).join('|');
// A figure as the domain writes it: thousands grouped by commas or spaces, or not at all; maybe negative.
const NUMBER = '-?(?:\\d{1,3}(?:[ ,]\\d{3})+(?:\\.\\d+)?|\\d+(?:\\.\\d+)?)';
// A figure or a range ("207–241") with its unit, optionally followed by the same in another unit in brackets.
const FIGURE_WITH_UNIT = new RegExp(
  `(${NUMBER})(?:–(${NUMBER}))?[ \\u00a0](${UNIT_PATTERN})(?![\\w²/])` +
    `(?: \\((${NUMBER})(?:–(${NUMBER}))?[ \\u00a0](${UNIT_PATTERN})(?![\\w²/])\\))?`,
  'g',
);

const readFigure = (text: string) => Number(text.replace(/[ ,]/g, ''));

/** SI figures of one quantity in a system's unit, as a figure or a range with one unit. */
function figuresIn(quantity: Quantity, values: number[], system: UnitSystem): string {
  const numbers = values.map((si) => quantityNumber(quantity, si, system));
  const distinct = numbers.length === 2 && numbers[0] === numbers[1] ? [numbers[0]!] : numbers;
  return `${distinct.join('–')}${NBSP}${unitLabel(quantity, system)}`;
}

/**
 * A domain message made readable in the user's system, by the product's one formatting policy. Each figure
 * reads in the user's unit first; where the message gave it in two systems, or the user works in other units
 * than the SI the domain writes in, the other system's figure follows in brackets: "at most 3000 mm" reads
 * "at most 118.11 in (3,000 mm)" to an imperial user, and "1.092 mm (0.0430 in)" reads "0.043 in (1.09 mm)".
 */
export function messageInUnits(message: string, system: UnitSystem): string {
  return message.replace(FIGURE_WITH_UNIT, (whole: string, ...groups: (string | undefined)[]) => {
    const [low, high, unit, low2, high2, unit2] = groups as [
      string,
      string | undefined,
      string,
      string | undefined,
      string | undefined,
      string?,
    ];
    const info = MESSAGE_UNITS.find((u) => u.unit === unit)!;
    const second = unit2 === undefined ? undefined : MESSAGE_UNITS.find((u) => u.unit === unit2);
    const paired = second !== undefined && second.quantity === info.quantity && second.system !== info.system;
    // An imperial unit alone is left as written: "in" is also a word ("3 in a row").
    if (!paired && !SI_MESSAGE_UNITS.has(unit)) return whole;
    const siValues = (texts: (string | undefined)[], toSi: number) =>
      texts.filter((v): v is string => v !== undefined).map((v) => readFigure(v) * toSi);
    const values = siValues([low, high], info.toSi);
    // Each system's figure is printed from the figure the message wrote in it, so nothing is rounded twice.
    const valuesIn = (target: UnitSystem) =>
      paired && second.system === target ? siValues([low2, high2], second.toSi) : values;
    const first = figuresIn(info.quantity, valuesIn(system), system);
    const rest = unit2 !== undefined && !paired ? whole.slice(whole.indexOf(' (')) : '';
    // Zero is zero in every unit: "greater than 0 mm" needs no "(0 in)".
    const allZero = values.every((v) => v === 0);
    const showOther = !allZero && (paired || info.system !== system);
    const other = OTHER_SYSTEM[system];
    return showOther ? `${first} (${figuresIn(info.quantity, valuesIn(other), other)})${rest}` : `${first}${rest}`;
  });
}

/** `?units=` as the calculators write it; anything else counts as not given. */
export function unitSystemParam(value: string | null): UnitSystem | null {
  return value !== null && (UNIT_SYSTEMS as readonly string[]).includes(value) ? (value as UnitSystem) : null;
}
