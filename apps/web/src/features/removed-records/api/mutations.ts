import { useMutation, useQueryClient } from '@tanstack/react-query';
import { restoredRecordSchema } from '@kerfline/domain/removed-records/schema';
import { api } from '../../../lib/api-client';
import { removedRecordKeys } from './keys';

/**
 * Puts a removed record back. A record that no longer fits answers 409 with what is in the way; the page shows
 * it beside the record. The records' own lists are refreshed by the page that composes this.
 */
export function usePutBack() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) =>
      api.post(`/removed-records/${encodeURIComponent(id)}/restore`, {}, restoredRecordSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: removedRecordKeys.lists() }),
  });
}

/** After a record is removed somewhere, the list of removed records is stale. */
export function useRefreshRemovedRecords() {
  const queryClient = useQueryClient();
  return () => queryClient.invalidateQueries({ queryKey: removedRecordKeys.lists() });
}
