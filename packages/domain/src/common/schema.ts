import { z } from 'zod';

// One wording for a missing field everywhere (API answers and browser forms alike), instead of zod's
// "expected string, received undefined".
z.config({
  customError: (issue) => (issue.code === 'invalid_type' && issue.input === undefined ? 'is required' : undefined),
});

export const idSchema = z.uuid({ message: 'must be an id (UUID)' });

/** Paging shared by every list endpoint; `limit` is capped so no request can ask for a whole table. */
export const pageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({
    items: z.array(item),
    total: z.number().int().min(0),
    limit: z.number().int(),
    offset: z.number().int(),
  });
}
export type Page<T> = { items: T[]; total: number; limit: number; offset: number };

/**
 * Characters that let text pass for other text, or that nothing should store (PostgreSQL cannot store NUL):
 * Unicode categories Cc (C0 and C1 controls: NUL, escape, line breaks, U+0085), Cf (invisible formatting:
 * bidirectional overrides such as U+202E that show "gpj.exe" as "exe.jpg", zero-width spaces and joiners, the
 * byte-order mark, soft hyphens), Zl and Zp (U+2028 and U+2029, line and paragraph separators). A name or tag
 * with any of them could look like another one on screen, in an export or in a mail.
 */
const NOT_IN_NAMES = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}\p{Cs}]/u;

/**
 * The same for free-text notes, except the line breaks and tabs a note may have (LF, CR, TAB). Notes still
 * refuse every other control (C1 included), every Cf character and U+2028/U+2029: a pasted line separator is
 * rare, and turning it into a line break quietly would change what was typed.
 */
const NOT_IN_NOTES = /[\p{Cf}\p{Zl}\p{Zp}\p{Cs}]|(?![\t\n\r])\p{Cc}/u;

/**
 * True when text holds none of the characters above, nor a lone surrogate (half of a UTF-16 pair, which no
 * encoding can store; with the `u` flag `\p{Cs}` matches only unpaired halves). `multiline` allows a note's
 * line breaks.
 */
export function isPlainText(value: string, options: { multiline?: boolean } = {}): boolean {
  return !(options.multiline ? NOT_IN_NOTES : NOT_IN_NAMES).test(value);
}

export const PLAIN_TEXT_MESSAGE =
  'must not contain control characters, line breaks or invisible characters (such as direction marks or zero-width spaces)';

/** A trimmed, non-empty, single-line piece of text with a maximum length: every name and tag. */
export const text = (max: number) =>
  z
    .string()
    .trim()
    .min(1, { message: 'must not be empty' })
    .max(max, { message: `must be at most ${max} characters` })
    .refine((value) => isPlainText(value), { message: PLAIN_TEXT_MESSAGE });
