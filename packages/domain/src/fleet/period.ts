import { z } from 'zod';
import { zoneOffsetMs } from '../common/zone-clock.js';

/**
 * Reporting periods are whole calendar months, written `YYYY-MM`, each read in the site's own time zone (a
 * month at a Toronto plant starts at midnight in Toronto). A period runs from its first month to its last,
 * both included.
 */
export const MONTH_PATTERN = /^(\d{4})-(0[1-9]|1[0-2])$/;

export const monthSchema = z
  .string()
  .trim()
  .regex(MONTH_PATTERN, { message: 'must be a month written YYYY-MM, such as 2026-03' })
  .refine((m) => Number(m.slice(0, 4)) >= 1990 && Number(m.slice(0, 4)) <= 2200, {
    message: 'must be a month between 1990 and 2200',
  });

export type Month = string;

/** A period of whole months, first and last included. */
export type MonthPeriod = { from: Month; to: Month };

/** Longest period a request may ask for: five years, the history the product is sized for. */
export const MAX_PERIOD_MONTHS = 60;

const index = (m: Month): number => Number(m.slice(0, 4)) * 12 + Number(m.slice(5, 7)) - 1;
const fromIndex = (i: number): Month => `${Math.floor(i / 12)}-${String((i % 12) + 1).padStart(2, '0')}`;

/** `month` moved by `n` months (negative: back). */
export function addMonths(month: Month, n: number): Month {
  return fromIndex(index(month) + n);
}

/** Months from `from` to `to`, both included; empty when `to` is before `from`. */
export function monthsOf(period: MonthPeriod): Month[] {
  const out: Month[] = [];
  for (let i = index(period.from); i <= index(period.to); i++) out.push(fromIndex(i));
  return out;
}

export function periodLength(period: MonthPeriod): number {
  return index(period.to) - index(period.from) + 1;
}

/** The period of the same length just before this one: what "change against the previous period" compares with. */
export function previousPeriod(period: MonthPeriod): MonthPeriod {
  const n = periodLength(period);
  return { from: addMonths(period.from, -n), to: addMonths(period.from, -1) };
}

/** The calendar month of an instant in a time zone (UTC by default). */
export function monthOf(at: Date, timeZone = 'UTC'): Month {
  // UTC needs no time-zone data: the ISO form is exact and skips building a formatter, whose first use loads
  // the zone tables (tens of milliseconds in a browser, on the way to the fleet overview's first request).
  if (timeZone === 'UTC') return at.toISOString().slice(0, 7);
  const parts = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit' }).formatToParts(at);
  const year = parts.find((p) => p.type === 'year')!.value;
  const month = parts.find((p) => p.type === 'month')!.value;
  return `${year}-${month}`;
}

/** The first day of the month as a date (`2026-03-01`). */
export const monthStart = (month: Month): string => `${month}-01`;

/**
 * The default reporting period: the twelve whole months before the month of `now` (the month in progress is
 * left out, so a fresh month does not drag every figure down).
 */
export function defaultPeriod(now: Date, months = 12): MonthPeriod {
  const last = addMonths(monthOf(now), -1);
  return { from: addMonths(last, -(months - 1)), to: last };
}

/** "Mar 2026" for a month; "Mar 2026 – Feb 2027" for a period. */
export function monthLabel(month: Month): string {
  const [y, m] = month.split('-');
  const name = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'][Number(m) - 1];
  return `${name} ${y}`;
}

export function periodLabel(period: MonthPeriod): string {
  return period.from === period.to ? monthLabel(period.from) : `${monthLabel(period.from)} – ${monthLabel(period.to)}`;
}

/**
 * The instant a month begins in a time zone (local midnight on its first day), as PostgreSQL's
 * `'2026-03-01 00:00'::timestamp AT TIME ZONE zone` gives it: 1 March 2026 in Berlin is 2026-02-28T23:00Z.
 */
export function monthStartInstant(month: Month, timeZone: string): Date {
  const key = `${month}|${timeZone}`;
  let at = monthStarts.get(key);
  if (at === undefined) {
    const wall = Date.parse(`${month}-01T00:00:00Z`);
    at = wall - zoneOffsetMs(wall, timeZone);
    // Once more with the offset at the first guess, for zones whose offset changes near midnight.
    at = wall - zoneOffsetMs(at, timeZone);
    // A fleet's screens ask for the same few months in the same few zones hundreds of times a request.
    if (monthStarts.size >= 10_000) monthStarts.clear();
    monthStarts.set(key, at);
  }
  return new Date(at);
}
const monthStarts = new Map<string, number>();
