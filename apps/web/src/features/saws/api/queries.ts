import { infiniteQueryOptions, queryOptions } from '@tanstack/react-query';
import type { BreakInAdviceQuery } from '@kerfline/domain/blade-runs/schema';
import { breakInAdviceSchema } from '@kerfline/domain/blade-runs/wire';
import { sawTimelineSchema } from '@kerfline/domain/saw-timeline/schema';
import { pageOf } from '@kerfline/domain/common/schema';
import { sawSchema, type SawListQuery } from '@kerfline/domain/saws/schema';
import { api } from '../../../lib/api-client';
import { sawKeys } from './keys';

const sawPageSchema = pageOf(sawSchema);

export function sawListQuery(q: SawListQuery) {
  return queryOptions({
    queryKey: sawKeys.list(q),
    queryFn: ({ signal }) => api.get('/saws', sawPageSchema, { query: q, signal }),
  });
}

export function sawDetailQuery(id: string) {
  return queryOptions({
    queryKey: sawKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/saws/${encodeURIComponent(id)}`, sawSchema, { signal }),
  });
}

/** Entries per page of a saw's timeline on screen. */
export const TIMELINE_PAGE_SIZE = 15;

/** A saw's timeline, newest first, one page at a time: each page continues from the previous page's cursor. */
export function sawTimelineQuery(id: string) {
  return infiniteQueryOptions({
    queryKey: sawKeys.timeline(id),
    queryFn: ({ pageParam, signal }) =>
      api.get(`/saws/${encodeURIComponent(id)}/timeline`, sawTimelineSchema, {
        query: { limit: TIMELINE_PAGE_SIZE, before: pageParam },
        signal,
      }),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });
}

/** The break-in plan for this saw, a blade spec and the material it will cut first. */
export function sawBreakInPlanQuery(id: string, q: BreakInAdviceQuery) {
  return queryOptions({
    queryKey: sawKeys.breakInPlan(id, q),
    queryFn: ({ signal }) =>
      api.get(`/saws/${encodeURIComponent(id)}/break-in-plan`, breakInAdviceSchema, { query: q, signal }),
  });
}
