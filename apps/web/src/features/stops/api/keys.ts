import type { StopListQuery } from '@kerfline/domain/stops/schema';

/** Query keys for stops; the first segment is the API path segment (`/api/stops`). */
export const stopKeys = {
  all: ['stops'] as const,
  lists: () => [...stopKeys.all, 'list'] as const,
  /** `q` is the parsed query with its defaults, so equal filters give equal keys. */
  list: (q: StopListQuery) => [...stopKeys.lists(), q] as const,
  details: () => [...stopKeys.all, 'detail'] as const,
  detail: (id: string) => [...stopKeys.details(), id] as const,
};
