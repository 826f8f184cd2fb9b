import type { SiteListQuery } from '@kerfline/domain/sites/schema';

/** Query keys for sites; the first segment is the API path segment (`/api/sites`). */
export const siteKeys = {
  all: ['sites'] as const,
  lists: () => [...siteKeys.all, 'list'] as const,
  /** `q` is the parsed query with its defaults, so equal filters give equal keys. */
  list: (q: SiteListQuery) => [...siteKeys.lists(), q] as const,
  details: () => [...siteKeys.all, 'detail'] as const,
  detail: (id: string) => [...siteKeys.details(), id] as const,
};
