import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { stopSchema, type Stop, type StopCreateParsed } from '@kerfline/domain/stops/schema';
import { api } from '../../../lib/api-client';
import { stopKeys } from './keys';

function storeSaved(queryClient: QueryClient, stop: Stop) {
  queryClient.setQueryData(stopKeys.detail(stop.id), stop);
  return queryClient.invalidateQueries({ queryKey: stopKeys.lists() });
}

/** Logs a stop; without an end the saw is down from its start. An overlap answers 409 naming the other stop. */
export function useLogStop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: StopCreateParsed) =>
      api.post(
        '/stops',
        { ...input, startedAt: input.startedAt?.toISOString(), endedAt: input.endedAt?.toISOString() ?? null },
        stopSchema,
      ),
    onSuccess: (stop) => storeSaved(queryClient, stop),
  });
}

/** Ends an open stop at `endedAt` (now when left out). */
export function useEndStop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ stopId, endedAt }: { stopId: string; endedAt?: Date | undefined }) =>
      api.post(`/stops/${encodeURIComponent(stopId)}/end`, { endedAt: endedAt?.toISOString() }, stopSchema),
    onSuccess: (stop) => storeSaved(queryClient, stop),
  });
}

/** Removes a stop entered by mistake (kept with the reason, so it can be put back). */
export function useRemoveStopEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ stopId, reason }: { stopId: string; reason: string }) =>
      api.delete(`/stops/${encodeURIComponent(stopId)}`, null, { reason }),
    onSuccess: (_none, { stopId }) => {
      queryClient.removeQueries({ queryKey: stopKeys.detail(stopId) });
      return queryClient.invalidateQueries({ queryKey: stopKeys.lists() });
    },
  });
}
