import type { ImportContextQuery, ImportListQuery } from '@kerfline/domain/imports/schema';

/** Query keys for imports; the first segment is the API path segment (`/api/imports`). */
export const importKeys = {
  all: ['imports'] as const,
  lists: () => [...importKeys.all, 'list'] as const,
  list: (q: ImportListQuery) => [...importKeys.lists(), q] as const,
  details: () => [...importKeys.all, 'detail'] as const,
  detail: (id: string) => [...importKeys.details(), id] as const,
  context: (q: ImportContextQuery) => [...importKeys.all, 'context', q] as const,
};
