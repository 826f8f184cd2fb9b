import type { SiteSummaryQuery } from '@kerfline/domain/site-summaries/schema';

/** Query keys for site summaries; the first segment is the API path segment (`/api/site-summaries`). */
export const siteSummaryKeys = {
  all: ['site-summaries'] as const,
  lists: () => [...siteSummaryKeys.all, 'list'] as const,
  list: (q: SiteSummaryQuery) => [...siteSummaryKeys.lists(), q] as const,
};
