import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  fleetOverviewSchema,
  fleetQuerySchema,
  fleetRunSchema,
  periodQuerySchema,
  periodRunsQuerySchema,
  practiceSchema,
  sawFiguresSchema,
  siteFiguresSchema,
  type FleetQuery,
  type PeriodQuery,
  type PeriodRunsQuery,
} from '@kerfline/domain/fleet/schema';
import { defaultPeriod } from '@kerfline/domain/fleet/period';
import { api } from '../../../lib/api-client';
import { fleetKeys } from './keys';

/** The fleet filters as they sit in the URL (`from`, `to`, `sites`), parsed; a bad value falls back to the default. */
export function fleetQueryFromSearch(search: URLSearchParams, months = 12): FleetQuery {
  const parsed = fleetQuerySchema.safeParse({
    from: search.get('from') ?? undefined,
    to: search.get('to') ?? undefined,
    sites: search.get('sites') ?? undefined,
  });
  if (parsed.success && (search.get('from') || search.get('to'))) return parsed.data;
  const period = defaultPeriod(new Date(), months);
  return { ...period, sites: parsed.success ? parsed.data.sites : undefined };
}

export function periodQueryFromSearch(search: URLSearchParams): PeriodQuery {
  const q = fleetQueryFromSearch(search);
  return periodQuerySchema.parse({ from: q.from, to: q.to });
}

const toParams = (q: FleetQuery) => ({ from: q.from, to: q.to, sites: q.sites?.join(',') });

export function fleetOverviewQuery(q: FleetQuery) {
  return queryOptions({
    queryKey: fleetKeys.overview(q),
    queryFn: ({ signal }) => api.get('/fleet/overview', fleetOverviewSchema, { query: toParams(q), signal }),
    placeholderData: keepPreviousData,
  });
}

export function practiceQuery(q: FleetQuery) {
  return queryOptions({
    queryKey: fleetKeys.practice(q),
    queryFn: ({ signal }) => api.get('/fleet/practice', practiceSchema, { query: toParams(q), signal }),
    placeholderData: keepPreviousData,
  });
}

export function siteFiguresQuery(siteId: string, q: PeriodQuery) {
  return queryOptions({
    queryKey: fleetKeys.site(siteId, q),
    queryFn: ({ signal }) =>
      api.get(`/fleet/sites/${encodeURIComponent(siteId)}`, siteFiguresSchema, { query: q, signal }),
    placeholderData: keepPreviousData,
  });
}

export function sawFiguresQuery(sawId: string, q: PeriodQuery) {
  return queryOptions({
    queryKey: fleetKeys.saw(sawId, q),
    queryFn: ({ signal }) =>
      api.get(`/fleet/saws/${encodeURIComponent(sawId)}`, sawFiguresSchema, { query: q, signal }),
    placeholderData: keepPreviousData,
  });
}

const runPageSchema = pageOf(fleetRunSchema);

export function sawRunsQuery(sawId: string, q: PeriodRunsQuery) {
  return queryOptions({
    queryKey: fleetKeys.sawRuns(sawId, q),
    queryFn: ({ signal }) =>
      api.get(`/fleet/saws/${encodeURIComponent(sawId)}/runs`, runPageSchema, { query: q, signal }),
    placeholderData: keepPreviousData,
  });
}

export function fleetRunQuery(runId: string) {
  return queryOptions({
    queryKey: fleetKeys.run(runId),
    queryFn: ({ signal }) => api.get(`/fleet/runs/${encodeURIComponent(runId)}`, fleetRunSchema, { signal }),
  });
}

export { periodRunsQuerySchema };
