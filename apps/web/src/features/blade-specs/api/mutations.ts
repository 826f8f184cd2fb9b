import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import {
  bladeSpecSchema,
  type BladeSpec,
  type BladeSpecCreateParsed,
  type BladeSpecUpdate,
} from '@kerfline/domain/blade-specs/schema';
import { api } from '../../../lib/api-client';
import { bladeSpecKeys } from './keys';

function storeSaved(queryClient: QueryClient, spec: BladeSpec) {
  queryClient.setQueryData(bladeSpecKeys.detail(spec.id), spec);
  return queryClient.invalidateQueries({ queryKey: bladeSpecKeys.lists() });
}

export function useCreateBladeSpec() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BladeSpecCreateParsed) => api.post('/blade-specs', input, bladeSpecSchema),
    onSuccess: (spec) => storeSaved(queryClient, spec),
  });
}

export function useUpdateBladeSpec(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BladeSpecUpdate) => api.patch(`/blade-specs/${encodeURIComponent(id)}`, input, bladeSpecSchema),
    onSuccess: (spec) => storeSaved(queryClient, spec),
  });
}
