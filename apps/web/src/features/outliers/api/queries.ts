import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { FleetQuery, PeriodQuery } from '@kerfline/domain/fleet/schema';
import { outlierReviewSchema, sawOutlierSchema } from '@kerfline/domain/outliers/review-schema';
import { api } from '../../../lib/api-client';
import { outlierKeys } from './keys';

export function outlierReviewQuery(q: FleetQuery) {
  return queryOptions({
    queryKey: outlierKeys.review(q),
    queryFn: ({ signal }) =>
      api.get('/outliers', outlierReviewSchema, {
        query: { from: q.from, to: q.to, sites: q.sites?.join(',') },
        signal,
      }),
    placeholderData: keepPreviousData,
  });
}

export function sawOutlierQuery(sawId: string, q: PeriodQuery) {
  return queryOptions({
    queryKey: outlierKeys.saw(sawId, q),
    queryFn: ({ signal }) =>
      api.get(`/outliers/saws/${encodeURIComponent(sawId)}`, sawOutlierSchema, { query: q, signal }),
    placeholderData: keepPreviousData,
  });
}
