import type { UserListQuery } from '@kerfline/domain/users/schema';

/** Query keys for people; the first segment is the API path segment (`/api/users`). */
export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
  /** `q` is the parsed query with its defaults, so equal filters give equal keys. */
  list: (q: UserListQuery) => [...userKeys.lists(), q] as const,
  details: () => [...userKeys.all, 'detail'] as const,
  detail: (id: string) => [...userKeys.details(), id] as const,
};
