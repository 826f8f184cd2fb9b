import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  followUpSchema,
  type FollowUp,
  type FollowUpCreate,
  type FollowUpUpdate,
} from '@kerfline/domain/follow-ups/schema';
import { api } from '../../../lib/api-client';
import { followUpKeys } from './keys';

/** After a write: the saved follow-up replaces its detail entry and every follow-up list is marked stale. */
function useStore() {
  const queryClient = useQueryClient();
  return (saved: FollowUp) => {
    queryClient.setQueryData(followUpKeys.detail(saved.id), saved);
    return queryClient.invalidateQueries({ queryKey: followUpKeys.lists() });
  };
}

export function useCreateFollowUp() {
  const store = useStore();
  return useMutation({
    mutationFn: (input: FollowUpCreate) => api.post('/follow-ups', input, followUpSchema),
    onSuccess: store,
  });
}

export function useUpdateFollowUp(id: string) {
  const store = useStore();
  return useMutation({
    mutationFn: (patch: FollowUpUpdate) => api.patch(`/follow-ups/${encodeURIComponent(id)}`, patch, followUpSchema),
    onSuccess: store,
  });
}
