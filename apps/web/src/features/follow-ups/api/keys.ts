import type { FollowUpListQuery } from '@kerfline/domain/follow-ups/schema';

/** Query keys for follow-ups; the first segment is the API path segment (`/api/follow-ups`). */
export const followUpKeys = {
  all: ['follow-ups'] as const,
  lists: () => [...followUpKeys.all, 'list'] as const,
  list: (q: FollowUpListQuery) => [...followUpKeys.lists(), q] as const,
  detail: (id: string) => [...followUpKeys.all, 'detail', id] as const,
  assignees: (siteId: string) => [...followUpKeys.all, 'assignees', siteId] as const,
};
