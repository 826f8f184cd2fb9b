import type { FleetQuery, PeriodQuery } from '@kerfline/domain/fleet/schema';

/** Query keys for outliers; the first segment is the API path segment (`/api/outliers`). */
export const outlierKeys = {
  all: ['outliers'] as const,
  review: (q: FleetQuery) => [...outlierKeys.all, 'review', q] as const,
  saw: (sawId: string, q: PeriodQuery) => [...outlierKeys.all, 'saw', sawId, q] as const,
};
