import { UNITS, unitFromText, type Quantity } from './units.js';
import { zoneOffsetMs } from '../common/zone-clock.js';

/**
 * Reading one cell of a legacy file: numbers with a decimal point or comma (and thousands separators, and the
 * inch trade's fractions such as 1-1/4), dates in the orders people write them, yes/no answers and the words a
 * shop uses for a category. Each reader returns a value or a message saying what it could not read.
 */

/** A cell as a reader hands it over: CSV gives text; a workbook also gives numbers and booleans. */
export type Cell = string | number | boolean | null;

export type Read<T> = { ok: true; value: T } | { ok: false; message: string };
const ok = <T>(value: T): Read<T> => ({ ok: true, value });
const fail = <T>(message: string): Read<T> => ({ ok: false, message });

export const DECIMAL_MARKS = ['.', ','] as const;
export type DecimalMark = (typeof DECIMAL_MARKS)[number];

/** Text of a cell, trimmed; null for an empty cell. */
export function cellText(cell: Cell): string | null {
  if (cell === null) return null;
  const text = String(cell)
    .replace(/[\u00a0\u2007\u202f]/g, ' ')
    .trim();
  return text === '' ? null : text;
}

/** "1 1/4", "1-1/4", "3/8": the way inch widths are written. */
const FRACTION = /^(?:(\d+)[\s-]+)?(\d+)\/(\d+)$/;

/**
 * A plain number from text, with `mark` as the decimal mark. Spaces and apostrophes group thousands; the other
 * mark groups thousands only in groups of three (`1.234,5` with a comma mark). Returns null for text that is not
 * a number.
 */
export function parsePlainNumber(text: string, mark: DecimalMark): number | null {
  let t = text.replace(/[\s'’]/g, '');
  if (t.startsWith('+')) t = t.slice(1);
  const fraction = FRACTION.exec(text.trim());
  if (fraction) {
    const whole = fraction[1] ? Number(fraction[1]) : 0;
    const den = Number(fraction[3]);
    if (den === 0) return null;
    return whole + Number(fraction[2]) / den;
  }
  const other = mark === '.' ? ',' : '.';
  const grouped = new RegExp(`^-?\\d{1,3}(\\${other}\\d{3})+(\\${mark}\\d+)?$`);
  if (grouped.test(t)) t = t.split(other).join('');
  if (t.includes(other)) return null;
  if (mark === ',') t = t.replace(',', '.');
  if (!/^-?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(t)) return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
}

/**
 * A quantity in the column's unit, converted to the stored unit. A unit written in the cell itself (`34 mm`,
 * `1.25"`) wins over the column's unit, so a column of mixed units still reads right.
 */
export function readQuantity(cell: Cell, quantity: Quantity, unitId: string, mark: DecimalMark): Read<number | null> {
  if (typeof cell === 'number') return ok(convert(cell, quantity, unitId));
  const text = cellText(cell);
  if (text === null) return ok(null);
  const match = /^(.*?\d)\s*([a-zA-Z"'²][a-zA-Z0-9"'²^/. ]*)?$/.exec(text);
  let numberPart = text;
  let unit = unitId;
  if (match && match[2]) {
    const written = unitFromText(quantity, match[2]);
    if (!written) return fail(`"${text}" has a unit Kerfline does not know for this column`);
    numberPart = match[1]!;
    unit = written.id;
  }
  const n = parsePlainNumber(numberPart, mark);
  if (n === null) return fail(`"${text}" is not a number`);
  return ok(convert(n, quantity, unit));
}

function convert(value: number, quantity: Quantity, unitId: string): number {
  const option = UNITS[quantity].options.find((o) => o.id === unitId);
  if (!option) throw new Error(`Unknown unit ${unitId} for ${quantity}`);
  // Twelve significant digits drop the binary noise of the product (1.5 × 25.4 = 38.099999999999994) and keep
  // far more than any measurement carries.
  return Number((value * option.toStored).toPrecision(12));
}

/** A plain number without a unit (a count, a quantity of blades). */
export function readNumber(cell: Cell, mark: DecimalMark): Read<number | null> {
  if (typeof cell === 'number') return ok(cell);
  const text = cellText(cell);
  if (text === null) return ok(null);
  const n = parsePlainNumber(text, mark);
  return n === null ? fail(`"${text}" is not a number`) : ok(n);
}

/** Digits after the decimal point of a currency's minor unit (2 for EUR, 0 for JPY). */
export function minorDigits(currency: string): number {
  try {
    return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  } catch {
    return 2;
  }
}

const CURRENCY_MARKS = /^(?:[A-Z]{3}|[$€£¥]|US\$|C\$|MX\$)\s*|\s*(?:[A-Z]{3}|[$€£¥])$/;

/**
 * An amount of money in major units (`89.50`, `89,50 €`, `CAD 1,204.00`) as integer minor units of `currency`.
 * A currency code written in the cell must be the expected one.
 */
export function readMoney(cell: Cell, currency: string, mark: DecimalMark): Read<number | null> {
  const digits = minorDigits(currency);
  if (typeof cell === 'number') return ok(Math.round(cell * 10 ** digits));
  const text = cellText(cell);
  if (text === null) return ok(null);
  const code = /\b([A-Z]{3})\b/.exec(text)?.[1];
  if (code && code !== currency) return fail(`"${text}" is in ${code}, but this import is in ${currency}`);
  const bare = text.replace(CURRENCY_MARKS, '').replace(CURRENCY_MARKS, '');
  const n = parsePlainNumber(bare, mark);
  if (n === null) return fail(`"${text}" is not an amount of money`);
  return ok(Math.round(n * 10 ** digits));
}

// ---------------------------------------------------------------------------------------------------------------
// Dates

/** How the day, month and year of a numeric date are ordered: 31/12/2021, 12/31/2021 or 2021-12-31. */
export const DATE_ORDERS = ['dmy', 'mdy', 'ymd'] as const;
export type DateOrder = (typeof DATE_ORDERS)[number];

/** A date and time as written: the wall clock, with its offset from UTC when the text gave one. */
export type WallTime = {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
  /** Minutes east of UTC, when the text carried an offset (`Z`, `+02:00`). */
  offsetMinutes: number | null;
  /** False when the text held only a date. */
  hasTime: boolean;
};

/** Month names in English, German, French and Spanish, without accents, lower case, by month number. */
const MONTHS: Record<string, number> = {};
[
  ['jan', 'january', 'januar', 'janvier', 'ene', 'enero', 'janv', 'jän', 'jaen', 'janner'],
  ['feb', 'february', 'februar', 'fevrier', 'fev', 'febrero'],
  ['mar', 'march', 'marz', 'maerz', 'mars', 'marzo', 'mrz'],
  ['apr', 'april', 'avril', 'avr', 'abr', 'abril'],
  ['may', 'mai', 'mayo'],
  ['jun', 'june', 'juni', 'juin', 'junio'],
  ['jul', 'july', 'juli', 'juillet', 'juil', 'julio'],
  ['aug', 'august', 'aout', 'ago', 'agosto'],
  ['sep', 'sept', 'september', 'septembre', 'septiembre', 'set', 'setiembre'],
  ['oct', 'october', 'oktober', 'okt', 'octobre', 'octubre'],
  ['nov', 'november', 'novembre', 'noviembre'],
  ['dec', 'december', 'dezember', 'dez', 'decembre', 'dic', 'diciembre'],
].forEach((names, i) => names.forEach((n) => (MONTHS[n] = i + 1)));

const stripAccents = (s: string) => s.normalize('NFD').replace(/[\u0300-\u036f]/g, '');

const TIME = String.raw`(?:[T\s,]+(\d{1,2})[:.h](\d{2})(?:[:.](\d{2})(?:[.,]\d+)?)?\s*(am|pm|a\.m\.|p\.m\.)?)?`;
const OFFSET = String.raw`\s*(Z|UTC|GMT|[+-]\d{2}:?\d{2})?`;
const ISO_LIKE = new RegExp(String.raw`^(\d{4})-(\d{1,2})-(\d{1,2})${TIME}${OFFSET}$`, 'i');
const NUMERIC = new RegExp(String.raw`^(\d{1,4})[./-](\d{1,2})[./-](\d{1,4})${TIME}${OFFSET}$`, 'i');
const DAY_MONTH_NAME = new RegExp(
  String.raw`^(\d{1,2})(?:st|nd|rd|th)?[.\s-]+(?:de\s+)?([a-z]+)\.?[.\s-]+(?:de\s+)?(\d{2,4})${TIME}${OFFSET}$`,
  'i',
);
const MONTH_NAME_DAY = new RegExp(
  String.raw`^([a-z]+)\.?\s+(\d{1,2})(?:st|nd|rd|th)?,?\s+(\d{2,4})${TIME}${OFFSET}$`,
  'i',
);

function fullYear(y: number, written: string): number {
  if (written.length > 2) return y;
  // Two-digit years: this century up to the current year, the last century after it.
  const now = new Date().getUTCFullYear() % 100;
  return y <= now ? 2000 + y : 1900 + y;
}

function offsetOf(text: string | undefined): number | null {
  if (!text) return null;
  const t = text.toUpperCase();
  if (t === 'Z' || t === 'UTC' || t === 'GMT') return 0;
  const m = /^([+-])(\d{2}):?(\d{2})$/.exec(t);
  if (!m) return null;
  const minutes = Number(m[2]) * 60 + Number(m[3]);
  return m[1] === '-' ? -minutes : minutes;
}

function buildWall(
  year: number,
  month: number,
  day: number,
  time: (string | undefined)[],
  offsetText: string | undefined,
): Read<WallTime> {
  const [hh, mm, ss, ampm] = time;
  let hour = hh ? Number(hh) : 0;
  const minute = mm ? Number(mm) : 0;
  const second = ss ? Number(ss) : 0;
  if (ampm) {
    const pm = ampm.toLowerCase().startsWith('p');
    if (hour < 1 || hour > 12) return fail('has an hour that does not fit am/pm');
    hour = (hour % 12) + (pm ? 12 : 0);
  }
  if (month < 1 || month > 12) return fail(`has no month ${month}`);
  const daysInMonth = new Date(Date.UTC(year, month, 0)).getUTCDate();
  if (day < 1 || day > daysInMonth) return fail(`has no day ${day} in that month`);
  if (hour > 23 || minute > 59 || second > 59) return fail('has a time of day that does not exist');
  return ok({ year, month, day, hour, minute, second, offsetMinutes: offsetOf(offsetText), hasTime: Boolean(hh) });
}

/** The parts of a numeric date `a/b/c`, for detecting the order a column uses. */
export function numericDateParts(text: string): [number, number, number, string] | null {
  const m = NUMERIC.exec(text.trim());
  if (!m) return null;
  return [Number(m[1]), Number(m[2]), Number(m[3]), m[1]!];
}

/** Days from 1899-12-30 (the spreadsheet epoch that accounts for the 1900 leap-year slip) to 1970-01-01. */
const SPREADSHEET_EPOCH_DAYS = 25569;

/**
 * A date, or a date and time, as written in a legacy file. `order` settles numeric dates such as 03/04/2021;
 * ISO dates (2021-04-03) and dates with month names read the same in every order. A number is taken as a
 * spreadsheet serial date (days since 1899-12-30) when it is in a plausible range.
 */
export function parseWallTime(cell: Cell, order: DateOrder): Read<WallTime | null> {
  if (typeof cell === 'number') {
    if (cell < 10000 || cell > 80000) return fail(`${cell} is a number, not a date`);
    const ms = Math.round((cell - SPREADSHEET_EPOCH_DAYS) * 86_400_000);
    const d = new Date(ms);
    return ok({
      year: d.getUTCFullYear(),
      month: d.getUTCMonth() + 1,
      day: d.getUTCDate(),
      hour: d.getUTCHours(),
      minute: d.getUTCMinutes(),
      second: d.getUTCSeconds(),
      offsetMinutes: null,
      hasTime: ms % 86_400_000 !== 0,
    });
  }
  if (typeof cell === 'boolean') return fail(`${String(cell)} is not a date`);
  const text = cellText(cell);
  if (text === null) return ok(null);
  const named = (r: Read<WallTime>): Read<WallTime | null> => (r.ok ? r : fail(`"${text}" ${r.message}`));

  let m = ISO_LIKE.exec(text);
  if (m) return named(buildWall(Number(m[1]), Number(m[2]), Number(m[3]), [m[4], m[5], m[6], m[7]], m[8]));

  m = NUMERIC.exec(text);
  if (m) {
    const [a, b, c] = [Number(m[1]), Number(m[2]), Number(m[3])];
    if (m[1]!.length === 4) return named(buildWall(a, b, c, [m[4], m[5], m[6], m[7]], m[8]));
    if (order === 'ymd') return fail(`"${text}" does not start with a four-digit year`);
    const year = fullYear(c, m[3]!);
    const [day, month] = order === 'dmy' ? [a, b] : [b, a];
    return named(buildWall(year, month, day, [m[4], m[5], m[6], m[7]], m[8]));
  }

  const plain = stripAccents(text.toLowerCase());
  m = DAY_MONTH_NAME.exec(plain);
  if (m && MONTHS[m[2]!] !== undefined)
    return named(
      buildWall(fullYear(Number(m[3]), m[3]!), MONTHS[m[2]!]!, Number(m[1]), [m[4], m[5], m[6], m[7]], m[8]),
    );
  m = MONTH_NAME_DAY.exec(plain);
  if (m && MONTHS[m[1]!] !== undefined)
    return named(
      buildWall(fullYear(Number(m[3]), m[3]!), MONTHS[m[1]!]!, Number(m[2]), [m[4], m[5], m[6], m[7]], m[8]),
    );

  return fail(`"${text}" is not a date Kerfline can read (write it as 2021-03-04 or 04/03/2021 14:30)`);
}

/** A calendar date `YYYY-MM-DD` from a cell (a time, if any, is ignored). */
export function readDate(cell: Cell, order: DateOrder): Read<string | null> {
  const r = parseWallTime(cell, order);
  if (!r.ok || r.value === null) return r as Read<string | null>;
  const w = r.value;
  return ok(`${w.year}-${pad(w.month)}-${pad(w.day)}`);
}

const pad = (n: number) => String(n).padStart(2, '0');

function exactOffsetMinutes(timeZone: string, utcMs: number): number {
  return Math.round(zoneOffsetMs(utcMs, timeZone) / 60_000);
}

/**
 * Minutes east of UTC that `timeZone` observes at the instant `utcMs`. Formatting is slow and a file of years of
 * logs asks for every day, so a UTC day whose start and end share an offset is kept as one entry; a day with a
 * clock change is worked out to the instant.
 */
const dayOffsets = new Map<string, number | null>();
function zoneOffsetMinutes(timeZone: string, utcMs: number): number {
  const dayStart = Math.floor(utcMs / 86_400_000) * 86_400_000;
  const key = `${timeZone}|${dayStart}`;
  let whole = dayOffsets.get(key);
  if (whole === undefined) {
    const a = exactOffsetMinutes(timeZone, dayStart);
    const b = exactOffsetMinutes(timeZone, dayStart + 86_400_000 - 1000);
    whole = a === b ? a : null;
    if (dayOffsets.size > 100_000) dayOffsets.clear();
    dayOffsets.set(key, whole);
  }
  return whole ?? exactOffsetMinutes(timeZone, utcMs);
}

/**
 * The instant a wall-clock time names: with its own offset when the text gave one, otherwise read in the
 * site's time zone (legacy logs are written in local time). In the hour skipped when clocks go forward the
 * later offset is used; in the hour repeated when they go back, the first.
 */
export function wallTimeToInstant(w: WallTime, timeZone: string): Date {
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  if (w.offsetMinutes !== null) return new Date(asUtc - w.offsetMinutes * 60_000);
  const first = asUtc - zoneOffsetMinutes(timeZone, asUtc) * 60_000;
  const second = asUtc - zoneOffsetMinutes(timeZone, first) * 60_000;
  return new Date(Math.min(first, second));
}

// ---------------------------------------------------------------------------------------------------------------
// Words: yes/no answers and categories

/** How a category's value is compared: lower case, no accents, single spaces, no punctuation at the ends. */
export function normaliseWord(text: string): string {
  return stripAccents(text.toLowerCase())
    .replace(/ß/g, 'ss')
    .replace(/[_\s]+/g, ' ')
    .replace(/^[\s.,;:!?()"'-]+|[\s.,;:!?()"'-]+$/g, '')
    .trim();
}

/** Unit-free headers: lower case, no accents, units in brackets left out, punctuation as spaces. */
export function normaliseHeader(text: string): string {
  return normaliseWord(text.replace(/[([{].*?[)\]}]/g, ' '))
    .replace(/[^a-z0-9#%°]+/g, ' ')
    .trim();
}

/** The unit a header names, in brackets (`Width (in)`) or as its last word (`Width mm`, `Speed in ft/min`). */
export function unitInHeader(header: string, quantity: Quantity): string | null {
  const bracketed = /[([{]\s*([^)\]}]+?)\s*[)\]}]/.exec(header)?.[1];
  if (bracketed) {
    const u = unitFromText(quantity, bracketed);
    if (u) return u.id;
  }
  const words = header.trim().replace(/"$/, ' "').split(/\s+/);
  if (words.length < 2) return null;
  const last = words[words.length - 1]!;
  const beforeLast = words[words.length - 2]!.toLowerCase();
  // "Speed in ft/min", "Breite in mm": the unit after "in"; "Band speed sq in" style two-word units next.
  const candidates =
    ['in', 'en', 'em'].includes(beforeLast) && words.length > 2 ? [last] : [`${beforeLast}${last}`, last];
  for (const tail of candidates) {
    const u = unitFromText(quantity, tail);
    if (u) return u.id;
  }
  return null;
}
