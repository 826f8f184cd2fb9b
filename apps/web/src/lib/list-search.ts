import type { SortingState } from '@tanstack/react-table';
import type { z } from 'zod';

/**
 * A record table's state lives in the URL: its filters by name, `sort` as the API spells it (`-installedAt`)
 * and `offset`. These read the URL into the API's list query (parsed with the domain schema, so defaults apply
 * and equal filters give equal query keys) and write a change back, starting again from the first page.
 */

/** Rows per page of a record table: enough for a shift's work, few enough to read on a phone. */
export const TABLE_PAGE_SIZE = 25;

/**
 * Parses a list query built from the URL with its domain schema. A value the schema refuses (a hand-edited
 * address, a saw id that is not one) is dropped, so the list shows unfiltered rather than failing.
 */
export function parseListQuery<S extends z.ZodType<Record<string, unknown>, Record<string, unknown>>>(
  schema: S,
  candidate: Record<string, unknown>,
): z.output<S> {
  const values = Object.fromEntries(
    Object.entries(candidate).filter(([, value]) => value !== undefined && value !== ''),
  );
  for (let attempt = 0; attempt < 10; attempt += 1) {
    const parsed = schema.safeParse(values);
    if (parsed.success) return parsed.data;
    const bad = new Set(parsed.error.issues.map((issue) => String(issue.path[0] ?? '')));
    const before = Object.keys(values).length;
    for (const key of bad) delete values[key];
    if (Object.keys(values).length === before) break;
  }
  return schema.parse({});
}

/** The text of a filter in the URL, or undefined when absent or blank. */
export function searchValue(params: URLSearchParams, key: string): string | undefined {
  const value = params.get(key)?.trim();
  return value ? value : undefined;
}

/** The page offset in the URL: a whole number ≥ 0, else 0. */
export function offsetOf(params: URLSearchParams): number {
  const offset = Number(params.get('offset') ?? '0');
  return Number.isInteger(offset) && offset >= 0 ? offset : 0;
}

/** The table's sorting state for an API sort (`-installedAt` → installedAt, descending). */
export function sortingOf(sort: string): SortingState {
  return sort.startsWith('-') ? [{ id: sort.slice(1), desc: true }] : [{ id: sort, desc: false }];
}

/** The API sort for a sorting state, or undefined when the table is back to no sort. */
export function sortOf(sorting: SortingState): string | undefined {
  const first = sorting[0];
  return first ? `${first.desc ? '-' : ''}${first.id}` : undefined;
}

/**
 * The URL after changing some filters (or the sort): blank values are removed, and the offset goes, since the
 * first page of a different list is the one to show.
 */
export function withFilters(params: URLSearchParams, changes: Record<string, string | undefined>): URLSearchParams {
  const next = new URLSearchParams(params);
  for (const [key, value] of Object.entries(changes)) {
    if (value === undefined || value === '') next.delete(key);
    else next.set(key, value);
  }
  next.delete('offset');
  return next;
}
