import type { SawListQuery } from '@kerfline/domain/saws/schema';

/** Query keys for saws; the first segment is the API path segment (`/api/saws`). */
export const sawKeys = {
  all: ['saws'] as const,
  lists: () => [...sawKeys.all, 'list'] as const,
  /** `q` is the parsed query with its defaults, so equal filters give equal keys. */
  list: (q: SawListQuery) => [...sawKeys.lists(), q] as const,
  details: () => [...sawKeys.all, 'detail'] as const,
  detail: (id: string) => [...sawKeys.details(), id] as const,
};
