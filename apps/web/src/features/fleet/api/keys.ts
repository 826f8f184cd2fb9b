import type { FleetQuery, PeriodQuery, PeriodRunsQuery } from '@kerfline/domain/fleet/schema';

/** Query keys for the fleet figures; the first segment is the API path segment (`/api/fleet`). */
export const fleetKeys = {
  all: ['fleet'] as const,
  overview: (q: FleetQuery) => [...fleetKeys.all, 'overview', q] as const,
  practice: (q: FleetQuery) => [...fleetKeys.all, 'practice', q] as const,
  site: (siteId: string, q: PeriodQuery) => [...fleetKeys.all, 'site', siteId, q] as const,
  saw: (sawId: string, q: PeriodQuery) => [...fleetKeys.all, 'saw', sawId, q] as const,
  sawRuns: (sawId: string, q: PeriodRunsQuery) => [...fleetKeys.all, 'saw-runs', sawId, q] as const,
  run: (runId: string) => [...fleetKeys.all, 'run', runId] as const,
};
