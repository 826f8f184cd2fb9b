import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { mPerMinToFpm, mmToIn } from '@kerfline/domain/units/units';
import {
  areaToDisplay,
  bandSpeedFromDisplay,
  bandSpeedToDisplay,
  forceToDisplay,
  lengthFromDisplay,
  lengthToDisplay,
  moneyPerAreaToDisplay,
  OTHER_SYSTEM,
  quantityNumber,
  quantityToDisplay,
  smallLengthToDisplay,
  stressToDisplay,
  type DisplayQuantityKind,
  type DisplayValue,
} from '@kerfline/domain/units/display';

/**
 * Display formatting at the edge. Values arrive in SI (millimetres, metres per minute, ISO timestamps in
 * UTC) and leave as text in the site's unit system and time zone. Quantities follow the domain's one
 * formatting policy (`@kerfline/domain/units/display`); this file only joins figure and unit with a
 * non-breaking space. One locale everywhere, so the decimal point shown is the one the forms accept.
 */
export const APP_LOCALE = 'en-US';

/** Keeps a value and its unit on one line. */
const NBSP = '\u00a0';

const numberFormats = new Map<number, Intl.NumberFormat>();
function numberFormat(maxFractionDigits: number): Intl.NumberFormat {
  let format = numberFormats.get(maxFractionDigits);
  if (!format) {
    format = new Intl.NumberFormat(APP_LOCALE, { maximumFractionDigits: maxFractionDigits, useGrouping: true });
    numberFormats.set(maxFractionDigits, format);
  }
  return format;
}

/** A number with thousands separators and at most `maxFractionDigits` decimals (trailing zeros dropped). */
export function formatNumber(value: number, maxFractionDigits = 0): string {
  return numberFormat(maxFractionDigits).format(value);
}

export function lengthUnit(system: UnitSystem): 'mm' | 'in' {
  return system === 'imperial' ? 'in' : 'mm';
}

export function speedUnit(system: UnitSystem): 'm/min' | 'ft/min' {
  return system === 'imperial' ? 'ft/min' : 'm/min';
}

/** Millimetres to the site's length unit (mm or inches), unrounded. */
export function lengthFromMm(mm: number, system: UnitSystem): number {
  return system === 'imperial' ? mmToIn(mm) : mm;
}

/**
 * A length typed in the site's unit, in millimetres. Rounded to 0.0001 mm: far below any saw's tolerance,
 * and it keeps 1.25 in from being stored as 31.750000000000004 mm.
 */
export function lengthToMm(value: number, system: UnitSystem): number {
  return Math.round(lengthFromDisplay(value, system) * 10_000) / 10_000;
}

/** Metres per minute to the site's speed unit (m/min or ft/min), unrounded. */
export function speedFromMPerMin(mPerMin: number, system: UnitSystem): number {
  return system === 'imperial' ? mPerMinToFpm(mPerMin) : mPerMin;
}

/** A band speed typed in the site's unit, in metres per minute, rounded to 0.001 m/min. */
export function speedToMPerMin(value: number, system: UnitSystem): number {
  return Math.round(bandSpeedFromDisplay(value, system) * 1000) / 1000;
}

/** A policy figure with its unit joined by a non-breaking space, so the two never part at a line end. */
function withUnit(shown: DisplayValue): string {
  return shown.text.replace(' ', NBSP);
}

/** Any quantity (in SI: mm, m/min, mm², N, Pa) in the site's unit, by the domain's one formatting policy. */
export function formatQuantity(kind: DisplayQuantityKind, si: number, system: UnitSystem): string {
  return withUnit(quantityToDisplay(kind, si, system));
}

/** Just the figure of a length in the site's unit, e.g. `1.25` for 31.75 mm on an imperial site. */
export function formatLengthValue(mm: number, system: UnitSystem): string {
  return quantityNumber('length', mm, system);
}

/** A length with its unit, e.g. `31.8 mm` or `1.25 in`. */
export function formatLength(mm: number, system: UnitSystem): string {
  return withUnit(lengthToDisplay(mm, system));
}

/** A band gauge, clearance or wear in thousandths of an inch or hundredths of a millimetre: `0.042 in`, `1.07 mm`. */
export function formatSmallLength(mm: number, system: UnitSystem): string {
  return withUnit(smallLengthToDisplay(mm, system));
}

/** Just the figure of a band speed in the site's unit, in whole ft/min or m/min. */
export function formatSpeedValue(mPerMin: number, system: UnitSystem): string {
  return quantityNumber('bandSpeed', mPerMin, system);
}

/** A band speed with its unit, e.g. `75 m/min` or `246 ft/min`. */
export function formatSpeed(mPerMin: number, system: UnitSystem): string {
  return withUnit(bandSpeedToDisplay(mPerMin, system));
}

/** A band speed range with one unit, e.g. `20–120 m/min`. */
export function formatSpeedRange(minMPerMin: number, maxMPerMin: number, system: UnitSystem): string {
  return `${formatSpeedValue(minMPerMin, system)}–${formatSpeedValue(maxMPerMin, system)}${NBSP}${speedUnit(system)}`;
}

/** A force, e.g. `8 lbf` or `35.6 N`. */
export function formatForce(newtons: number, system: UnitSystem): string {
  return withUnit(forceToDisplay(newtons, system));
}

/** A stress, e.g. `30,000 psi` or `206.8 MPa`. */
export function formatStress(pascals: number, system: UnitSystem): string {
  return withUnit(stressToDisplay(pascals, system));
}

/** An area, e.g. `12.57 in²` or `81.1 cm²`. */
export function formatArea(mm2: number, system: UnitSystem): string {
  return withUnit(areaToDisplay(mm2, system));
}

/** A large area (a blade's life, a month's cutting), e.g. `48.4 ft²` or `4.5 m²`. */
export function formatLargeArea(mm2: number, system: UnitSystem): string {
  return withUnit(quantityToDisplay('largeArea', mm2, system));
}

/** A figure in the site's unit first and the other system's second: `0.043 in (1.09 mm)`. */
export function formatDual(kind: DisplayQuantityKind, si: number, system: UnitSystem): string {
  // A plain space before the bracket: on a narrow screen the second figure may wrap to the next line.
  return `${formatQuantity(kind, si, system)} (${formatQuantity(kind, si, OTHER_SYSTEM[system])})`;
}

/** Cost per area cut (minor units of `currency` per mm²), e.g. `$0.012/in²` or `€0.0019/cm²`. */
export function formatMoneyPerArea(minorUnitsPerMm2: number, currency: string, system: UnitSystem): string {
  return moneyPerAreaToDisplay(minorUnitsPerMm2, currency, system).text;
}

/**
 * A moment shown as the clock on the wall at the site, e.g. `Mar 12, 2025, 2:05 PM`; with `withZone` the
 * zone's short name follows, for screens that mix sites in different zones.
 */
export function formatDateTime(iso: string, timeZone: string, withZone = false): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '—';
  // dateStyle/timeStyle cannot be combined with timeZoneName, so the fields are spelled out.
  return new Intl.DateTimeFormat(APP_LOCALE, {
    year: 'numeric',
    month: 'short',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
    timeZone,
    ...(withZone ? { timeZoneName: 'short' as const } : {}),
  }).format(date);
}

/** The calendar day at the site, e.g. `Mar 12, 2025`. */
export function formatDate(iso: string, timeZone: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return '—';
  return new Intl.DateTimeFormat(APP_LOCALE, { dateStyle: 'medium', timeZone }).format(date);
}
