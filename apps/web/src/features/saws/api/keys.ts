import type { SawListQuery } from '@kerfline/domain/saws/schema';
import type { BreakInAdviceQuery } from '@kerfline/domain/blade-runs/schema';

/** Query keys for saws; the first segment is the API path segment (`/api/saws`). */
export const sawKeys = {
  all: ['saws'] as const,
  lists: () => [...sawKeys.all, 'list'] as const,
  /** `q` is the parsed query with its defaults, so equal filters give equal keys. */
  list: (q: SawListQuery) => [...sawKeys.lists(), q] as const,
  details: () => [...sawKeys.all, 'detail'] as const,
  detail: (id: string) => [...sawKeys.details(), id] as const,
  /** Under the saw's detail, so a write that refreshes the saw refreshes its timeline too. */
  timeline: (id: string) => [...sawKeys.detail(id), 'timeline'] as const,
  breakInPlan: (id: string, q: BreakInAdviceQuery) => [...sawKeys.detail(id), 'break-in-plan', q] as const,
};
