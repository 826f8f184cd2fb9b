import { useMutation, useQueryClient } from '@tanstack/react-query';
import { cutLogSchema, type CutLogCreateParsed } from '@kerfline/domain/cut-logs/schema';
import { api } from '../../../lib/api-client';
import { cutLogKeys } from './keys';

/** Logs a cut; the answer carries the cut area, the teeth in the work and any warnings. */
export function useLogCut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CutLogCreateParsed) =>
      api.post('/cut-logs', { ...input, cutAt: input.cutAt?.toISOString() }, cutLogSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: cutLogKeys.lists() }),
  });
}
