import type { CheckRecordListQuery, DueCheckListQuery } from '@kerfline/domain/site-checks/schema';

/**
 * Query keys for maintenance checks, first segment the API path segment: a site's list and its overdue list
 * live under `sites` (`/api/sites/:id/checks…`), a saw's checks under `saws`, records under `check-records`
 * and the tiles' counts under `check-counts`.
 */
export const checkKeys = {
  siteLists: () => ['sites', 'checks'] as const,
  siteList: (siteId: string, includeRetired: boolean) => ['sites', 'checks', siteId, { includeRetired }] as const,
  siteOverdue: (siteId: string, q: DueCheckListQuery) => ['sites', 'checks', siteId, 'overdue', q] as const,
  saw: (sawId: string) => ['saws', 'checks', sawId] as const,
  sawsAll: () => ['saws', 'checks'] as const,
  counts: (siteId?: string) => ['check-counts', siteId ?? 'all'] as const,
  countsAll: () => ['check-counts'] as const,
  records: () => ['check-records'] as const,
  recordList: (q: CheckRecordListQuery) => ['check-records', 'list', q] as const,
  recordDetail: (id: string) => ['check-records', 'detail', id] as const,
};
