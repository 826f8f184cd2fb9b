import { z } from 'zod';
import { idSchema, isPlainText } from '../common/schema.js';

/**
 * Pieces shared by the records a site keeps (blade runs, stops, cut logs, stock receipts, photos): times,
 * notes, sorting and date-range filters. Defined once so every record answers bad input in the same words.
 */

/**
 * How far ahead of the server's clock a time may be and still count as "now": a phone whose clock runs a
 * little fast must not be refused. Five minutes is our choice, not a standard.
 */
export const CLOCK_SKEW_MS = 5 * 60 * 1000;

/** Nothing a site records happened before this: a year typed as 0202 or 1902 is a slip, not history. */
export const EARLIEST_RECORD_TIME = new Date('1990-01-01T00:00:00Z');

/**
 * A moment a record happened: an ISO 8601 date-time with its offset (`2026-03-04T07:30:00Z`), not in the future
 * (within `CLOCK_SKEW_MS`) and not before 1990. Parsed to a Date.
 */
export const recordTimeSchema = (label: string) =>
  z.iso
    .datetime({ offset: true, message: `${label} must be a date and time such as 2026-03-04T07:30:00Z` })
    .transform((value) => new Date(value))
    .refine((d) => d.getTime() <= Date.now() + CLOCK_SKEW_MS, {
      message: `${label} must not be in the future`,
    })
    .refine((d) => d.getTime() >= EARLIEST_RECORD_TIME.getTime(), {
      message: `${label} must be on or after 1 January 1990`,
    });

/** A free-text note on a record: line breaks allowed, at most 2 000 characters, empty means none. */
export const notesSchema = z
  .string()
  .trim()
  .max(2000, { message: 'Notes must be at most 2000 characters' })
  // Line breaks and tabs stay; other controls, invisible formatting characters and lone surrogates do not.
  .refine((v) => isPlainText(v, { multiline: true }), {
    message: 'Notes must not contain control characters or invisible characters (such as direction marks)',
  })
  .transform((v) => (v === '' ? null : v))
  .nullable();

/** A date-time filter of a list query (`from` inclusive, `to` exclusive); a bare date means its midnight UTC. */
export const rangeBoundSchema = (label: string) =>
  z
    .union([z.iso.datetime({ offset: true }), z.iso.date()], {
      message: `${label} must be a date (2026-03-04) or a date and time with its offset`,
    })
    .transform((value) => new Date(value.length === 10 ? `${value}T00:00:00Z` : value))
    // An offset can move year 1 or year 9999 past the calendar the database and the answers write out.
    .refine((d) => d.getUTCFullYear() >= 1 && d.getUTCFullYear() <= 9999, {
      message: `${label} must fall between the years 1 and 9999 (in UTC)`,
    });

/** `true`/`false` in a query string. */
export const queryFlagSchema = z
  .enum(['true', 'false'], { message: 'must be true or false' })
  .transform((v) => v === 'true');

/** The date-range part of every record list query, with the rule that `to` comes after `from`. */
export const dateRangeQueryFields = {
  from: rangeBoundSchema('From').optional(),
  to: rangeBoundSchema('To').optional(),
};

/** For `.superRefine` on a list query with `dateRangeQueryFields`: `to` must come after `from`. */
export function refineDateRange(q: { from?: Date | undefined; to?: Date | undefined }, ctx: z.RefinementCtx): void {
  if (q.from && q.to && q.to.getTime() <= q.from.getTime())
    ctx.addIssue({ code: 'custom', path: ['to'], message: 'To must be after From' });
}

/** Who did something, as lists show it: the id and the name at the time of reading. */
export const personRefSchema = z.object({ id: idSchema, name: z.string() }).nullable();
export type PersonRef = z.infer<typeof personRefSchema>;

/** A warning returned with a record: the record was stored, but something is outside the trade's limits. */
export const recordWarningSchema = z.object({ code: z.string(), message: z.string() });
export type RecordWarning = z.infer<typeof recordWarningSchema>;

/** Money as stored: integer minor units (cents) and the ISO 4217 currency beside it. */
export const moneyMinorSchema = (label: string) =>
  z
    .number({ message: `${label} must be a number of minor units (e.g. cents)` })
    .int({ message: `${label} must be a whole number of minor units (e.g. cents)` })
    .min(0, { message: `${label} must not be negative` })
    .max(100_000_000, { message: `${label} must be at most 100,000,000 minor units (1,000,000.00)` });

/**
 * `?units=` on a record table's CSV export: the numbers' unit system. Left out, the export uses the site's own
 * (metric for an export across several sites, as the SI the records keep).
 */
export const exportUnitsField = {
  units: z.enum(['metric', 'imperial'], { message: 'Units must be metric or imperial' }).optional(),
};
