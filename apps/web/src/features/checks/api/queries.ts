import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  checkCountsSchema,
  checkRecordSchema,
  dueCheckSchema,
  sawChecksSchema,
  siteCheckSchema,
  type CheckRecordListQuery,
  type DueCheckListQuery,
} from '@kerfline/domain/site-checks/schema';
import { api } from '../../../lib/api-client';
import { checkKeys } from './keys';

const siteChecksSchema = z.object({ siteId: z.string(), items: z.array(siteCheckSchema) });

/** A site's list of checks, in its order; retired ones when asked for. */
export function siteChecksQuery(siteId: string, includeRetired = false) {
  return queryOptions({
    queryKey: checkKeys.siteList(siteId, includeRetired),
    queryFn: ({ signal }) =>
      api.get(`/sites/${encodeURIComponent(siteId)}/checks`, siteChecksSchema, {
        query: { includeRetired: includeRetired ? 'true' : undefined },
        signal,
      }),
  });
}

/** A saw's checks: each one's target for the blade on it now, and whether it is due. */
export function sawChecksQuery(sawId: string) {
  return queryOptions({
    queryKey: checkKeys.saw(sawId),
    queryFn: ({ signal }) => api.get(`/saws/${encodeURIComponent(sawId)}/checks`, sawChecksSchema, { signal }),
  });
}

/** A page of a site's pending checks (overdue by default), the longest overdue first. */
export function siteOverdueQuery(siteId: string, q: DueCheckListQuery) {
  return queryOptions({
    queryKey: checkKeys.siteOverdue(siteId, q),
    queryFn: ({ signal }) =>
      api.get(`/sites/${encodeURIComponent(siteId)}/checks/overdue`, pageOf(dueCheckSchema), { query: q, signal }),
  });
}

/** Due and overdue counts for every site the user reads (or one site). */
export function checkCountsQuery(siteId?: string) {
  return queryOptions({
    queryKey: checkKeys.counts(siteId),
    queryFn: ({ signal }) =>
      api.get('/check-counts', z.object({ items: z.array(checkCountsSchema) }), { query: { siteId }, signal }),
  });
}

/** One recorded check. */
export function checkRecordQuery(id: string) {
  return queryOptions({
    queryKey: checkKeys.recordDetail(id),
    queryFn: ({ signal }) => api.get(`/check-records/${encodeURIComponent(id)}`, checkRecordSchema, { signal }),
  });
}

/** A page of recorded checks (a site's, a saw's), sorted and filtered on the server. */
export function checkRecordListQuery(q: CheckRecordListQuery) {
  return queryOptions({
    queryKey: checkKeys.recordList(q),
    queryFn: ({ signal }) =>
      api.get('/check-records', pageOf(checkRecordSchema), {
        query: {
          ...q,
          passed: q.passed === undefined ? undefined : String(q.passed),
          from: q.from?.toISOString(),
          to: q.to?.toISOString(),
        },
        signal,
      }),
  });
}
