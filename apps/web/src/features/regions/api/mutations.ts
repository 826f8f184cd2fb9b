import { useMutation, useQueryClient } from '@tanstack/react-query';
import { regionSchema, type RegionCreate, type RegionUpdate } from '@kerfline/domain/regions/schema';
import { api } from '../../../lib/api-client';
import { regionKeys } from './keys';

/**
 * Adds a region (administrators only); a name another region already has answers 409. The region lists are
 * refetched before the returned promise settles, so a form can offer the new region straight away.
 */
export function useCreateRegion() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RegionCreate) => api.post('/regions', input, regionSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: regionKeys.lists() }),
  });
}

/** Renames a region (administrators only); a name another region has answers 409. */
export function useRenameRegion(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RegionUpdate) => api.patch(`/regions/${encodeURIComponent(id)}`, input, regionSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: regionKeys.lists() }),
  });
}
