import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  importBatchSchema,
  importCommitResultSchema,
  importSummarySchema,
  type ImportPlan,
} from '@kerfline/domain/imports/schema';
import { api } from '../../../lib/api-client';
import { importKeys } from './keys';

function formOf(file: File, plan: ImportPlan): FormData {
  const form = new FormData();
  form.set('plan', JSON.stringify(plan));
  form.set('file', file, file.name);
  return form;
}

/** The server reads the file with the plan and settles every row against the site's records, writing nothing. */
export function useCheckImport() {
  return useMutation({
    mutationFn: ({ file, plan }: { file: File; plan: ImportPlan }) =>
      api.postForm('/imports/check', formOf(file, plan), importSummarySchema),
  });
}

export function useCommitImport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, plan }: { file: File; plan: ImportPlan }) =>
      api.postForm('/imports', formOf(file, plan), importCommitResultSchema),
    onSuccess: async (result) => {
      queryClient.setQueryData(importKeys.detail(result.batch.id), result.batch);
      await queryClient.invalidateQueries({ queryKey: importKeys.lists() });
      // The remembered mapping changed with the commit.
      await queryClient.invalidateQueries({ queryKey: [...importKeys.all, 'context'] });
    },
    // A failed commit leaves a failed batch in the list.
    onError: () => queryClient.invalidateQueries({ queryKey: importKeys.lists() }),
  });
}

export function useUndoImport(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post(`/imports/${encodeURIComponent(id)}/undo`, undefined, importBatchSchema),
    onSuccess: async (batch) => {
      queryClient.setQueryData(importKeys.detail(batch.id), batch);
      await queryClient.invalidateQueries({ queryKey: importKeys.lists() });
    },
  });
}
