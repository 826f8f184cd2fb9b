import { queryOptions } from '@tanstack/react-query';
import {
  siteSummariesSchema,
  siteSummaryQuerySchema,
  type SiteSummaryQuery,
} from '@kerfline/domain/site-summaries/schema';
import { api } from '../../../lib/api-client';
import { siteSummaryKeys } from './keys';

export function parseSiteSummaryQuery(input: Partial<Record<keyof SiteSummaryQuery, unknown>> = {}) {
  return siteSummaryQuerySchema.parse(input);
}

/** What each site's tile shows: saws down now, blades on saws, the spec that runs out first. */
export function siteSummaryListQuery(q: SiteSummaryQuery = parseSiteSummaryQuery()) {
  return queryOptions({
    queryKey: siteSummaryKeys.list(q),
    queryFn: ({ signal }) =>
      api.get('/site-summaries', siteSummariesSchema, {
        query: { ...q, includeRetired: q.includeRetired ? 'true' : undefined },
        signal,
      }),
  });
}
