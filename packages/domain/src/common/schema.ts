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

// Control characters (NUL, escape, line breaks) have no place in a name or tag; PostgreSQL cannot store NUL.
// eslint-disable-next-line no-control-regex
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/;

/** A trimmed, non-empty, single-line piece of text with a maximum length. */
export const text = (max: number) =>
  z
    .string()
    .trim()
    .min(1, { message: 'must not be empty' })
    .max(max, { message: `must be at most ${max} characters` })
    .refine((value) => !CONTROL_CHARACTERS.test(value), {
      message: 'must not contain control characters or line breaks',
    });
