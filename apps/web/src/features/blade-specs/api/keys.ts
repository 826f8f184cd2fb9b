import type { BladeSpecListQuery } from '@kerfline/domain/blade-specs/schema';

/** Query keys for the blade-spec catalogue; the first segment is the API path segment (`/api/blade-specs`). */
export const bladeSpecKeys = {
  all: ['blade-specs'] as const,
  lists: () => [...bladeSpecKeys.all, 'list'] as const,
  list: (q: BladeSpecListQuery) => [...bladeSpecKeys.lists(), q] as const,
  details: () => [...bladeSpecKeys.all, 'detail'] as const,
  detail: (id: string) => [...bladeSpecKeys.details(), id] as const,
};
