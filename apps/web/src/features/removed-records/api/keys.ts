import type { RemovedRecordListQuery } from '@kerfline/domain/removed-records/schema';

/** Query keys for removed (kept) records; the first segment is the API path segment (`/api/removed-records`). */
export const removedRecordKeys = {
  all: ['removed-records'] as const,
  lists: () => [...removedRecordKeys.all, 'list'] as const,
  list: (q: RemovedRecordListQuery) => [...removedRecordKeys.lists(), q] as const,
};
