import { z } from 'zod';

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

/** A trimmed, non-empty piece of text with a maximum length. */
export const text = (max: number) =>
  z
    .string()
    .trim()
    .min(1, { message: 'must not be empty' })
    .max(max, { message: `must be at most ${max} characters` });
