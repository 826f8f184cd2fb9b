import type { CutLogListQuery } from '@kerfline/domain/cut-logs/schema';

/** Query keys for cut logs; the first segment is the API path segment (`/api/cut-logs`). */
export const cutLogKeys = {
  all: ['cut-logs'] as const,
  lists: () => [...cutLogKeys.all, 'list'] as const,
  list: (q: CutLogListQuery) => [...cutLogKeys.lists(), q] as const,
};
