import type { BladeRunListQuery } from '@kerfline/domain/blade-runs/schema';
import type { FailureMode } from '@kerfline/domain/diagnosis/schema';

/** Query keys for blade runs; the first segment is the API path segment (`/api/blade-runs`). */
export const bladeRunKeys = {
  all: ['blade-runs'] as const,
  lists: () => [...bladeRunKeys.all, 'list'] as const,
  /** `q` is the parsed query with its defaults, so equal filters give equal keys. */
  list: (q: BladeRunListQuery) => [...bladeRunKeys.lists(), q] as const,
  details: () => [...bladeRunKeys.all, 'detail'] as const,
  detail: (id: string) => [...bladeRunKeys.details(), id] as const,
  likelyCauses: (id: string, reason: FailureMode | null) =>
    [...bladeRunKeys.detail(id), 'likely-causes', reason] as const,
  photos: (id: string) => [...bladeRunKeys.detail(id), 'photos'] as const,
};
