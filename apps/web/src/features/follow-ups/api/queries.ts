import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  followUpAssigneeSchema,
  followUpListQuerySchema,
  followUpSchema,
  type FollowUpListQuery,
} from '@kerfline/domain/follow-ups/schema';
import { api } from '../../../lib/api-client';
import { followUpKeys } from './keys';

const pageSchema = pageOf(followUpSchema);

export function parseFollowUpListQuery(input: Partial<Record<keyof FollowUpListQuery, unknown>>): FollowUpListQuery {
  return followUpListQuerySchema.parse(input);
}

export function followUpListQuery(q: FollowUpListQuery) {
  return queryOptions({
    queryKey: followUpKeys.list(q),
    queryFn: ({ signal }) => api.get('/follow-ups', pageSchema, { query: q, signal }),
  });
}

export function followUpDetailQuery(id: string) {
  return queryOptions({
    queryKey: followUpKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/follow-ups/${encodeURIComponent(id)}`, followUpSchema, { signal }),
  });
}

export function followUpAssigneesQuery(siteId: string) {
  return queryOptions({
    queryKey: followUpKeys.assignees(siteId),
    queryFn: ({ signal }) =>
      api.get('/follow-ups/assignees', z.array(followUpAssigneeSchema), { query: { siteId }, signal }),
    staleTime: 5 * 60_000,
  });
}
