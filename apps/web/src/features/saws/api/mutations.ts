import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { sawSchema, type Saw, type SawCreateParsed, type SawUpdate } from '@kerfline/domain/saws/schema';
import { api } from '../../../lib/api-client';
import { sawKeys } from './keys';

/** After any write: the saved saw replaces its detail entry, and every saw list is marked stale. */
function storeSaved(queryClient: QueryClient, saw: Saw) {
  queryClient.setQueryData(sawKeys.detail(saw.id), saw);
  return queryClient.invalidateQueries({ queryKey: sawKeys.lists() });
}

export function useCreateSaw() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SawCreateParsed) => api.post('/saws', input, sawSchema),
    onSuccess: (saw) => storeSaved(queryClient, saw),
  });
}

/** Sends only the fields that changed, so values the user did not touch are never re-rounded. */
export function useUpdateSaw(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SawUpdate) => api.patch(`/saws/${encodeURIComponent(id)}`, input, sawSchema),
    onSuccess: (saw) => storeSaved(queryClient, saw),
  });
}

/** Retiring keeps the saw and its history; it only leaves the lists of saws in use. */
export function useRetireSaw(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post(`/saws/${encodeURIComponent(id)}/retire`, undefined, sawSchema),
    onSuccess: (saw) => storeSaved(queryClient, saw),
  });
}

/** Brings a retired saw back into service (one retired by mistake); its history never left. */
export function useRestoreSaw(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post(`/saws/${encodeURIComponent(id)}/restore`, undefined, sawSchema),
    onSuccess: (saw) => storeSaved(queryClient, saw),
  });
}
