import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import {
  bladeRunSchema,
  type BladeRun,
  type BladeRunInstallParsed,
  type BladeRunRemoveParsed,
  type BladeRunUpdate,
  type ConfirmCause,
} from '@kerfline/domain/blade-runs/schema';
import { bladeRunInstallResultSchema } from '@kerfline/domain/blade-runs/wire';
import { photoSchema } from '@kerfline/domain/photos/schema';
import { api } from '../../../lib/api-client';
import { uploadForm } from '../../../lib/upload';
import { bladeRunKeys } from './keys';

/** After a write to a run: it replaces its detail entry, and the lists of runs are marked stale. */
function storeSaved(queryClient: QueryClient, run: BladeRun) {
  queryClient.setQueryData(bladeRunKeys.detail(run.id), run);
  return queryClient.invalidateQueries({ queryKey: bladeRunKeys.lists() });
}

/** Dates go as ISO strings with their offset; the schema's output holds Dates. */
const iso = (d: Date | undefined) => d?.toISOString();

/** Puts a blade on a saw; answers the run, the break-in plan and any warnings (not from stock, spec mismatch). */
export function useInstallBladeRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BladeRunInstallParsed) =>
      api.post('/blade-runs', { ...input, installedAt: iso(input.installedAt) }, bladeRunInstallResultSchema),
    onSuccess: (result) => storeSaved(queryClient, result.run),
  });
}

/** Takes a blade off with its reason; a run already off answers 409. */
export function useRemoveBladeRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ runId, input }: { runId: string; input: BladeRunRemoveParsed }) =>
      api.post(
        `/blade-runs/${encodeURIComponent(runId)}/remove`,
        { ...input, removedAt: iso(input.removedAt) },
        bladeRunSchema,
      ),
    onSuccess: (run) => storeSaved(queryClient, run),
  });
}

/** Stores the likely cause a person confirmed for a removed run. */
export function useConfirmCause() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ runId, input }: { runId: string; input: ConfirmCause }) =>
      api.post(`/blade-runs/${encodeURIComponent(runId)}/confirmed-cause`, input, bladeRunSchema),
    onSuccess: async (run) => {
      await storeSaved(queryClient, run);
      await queryClient.invalidateQueries({ queryKey: [...bladeRunKeys.detail(run.id), 'likely-causes'] });
    },
  });
}

/** Attaches one photo to a run, reporting upload progress (0–1) as it goes. */
export function useUploadRunPhoto() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({
      runId,
      file,
      caption,
      onProgress,
    }: {
      runId: string;
      file: File;
      caption?: string;
      onProgress: (fraction: number) => void;
    }) => {
      const form = new FormData();
      form.append('photo', file);
      if (caption) form.append('caption', caption);
      return uploadForm(`/blade-runs/${encodeURIComponent(runId)}/photos`, form, photoSchema, onProgress);
    },
    onSuccess: (_photo, { runId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: bladeRunKeys.photos(runId) }),
        queryClient.invalidateQueries({ queryKey: bladeRunKeys.detail(runId), exact: true }),
        queryClient.invalidateQueries({ queryKey: bladeRunKeys.lists() }),
      ]),
  });
}

/** Corrections to a run (the break-in answer recorded after the blade went on, say). */
export function useUpdateBladeRun() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ runId, input }: { runId: string; input: BladeRunUpdate }) =>
      api.patch(`/blade-runs/${encodeURIComponent(runId)}`, input, bladeRunSchema),
    onSuccess: (run) => storeSaved(queryClient, run),
  });
}

/**
 * Removes a run entered by mistake (kept with the reason, so it can be put back), with its photos. Its detail
 * leaves the cache; the lists are marked stale.
 */
export function useRemoveRunEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ runId, reason }: { runId: string; reason: string }) =>
      api.delete(`/blade-runs/${encodeURIComponent(runId)}`, null, { reason }),
    onSuccess: (_none, { runId }) => {
      queryClient.removeQueries({ queryKey: bladeRunKeys.detail(runId) });
      return queryClient.invalidateQueries({ queryKey: bladeRunKeys.lists() });
    },
  });
}

/** Removes one photo of a run (kept with the reason, so it can be put back). */
export function useRemoveRunPhoto() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ photoId, reason }: { runId: string; photoId: string; reason: string }) =>
      api.delete(`/photos/${encodeURIComponent(photoId)}`, null, { reason }),
    onSuccess: (_none, { runId }) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: bladeRunKeys.photos(runId) }),
        queryClient.invalidateQueries({ queryKey: bladeRunKeys.detail(runId), exact: true }),
        queryClient.invalidateQueries({ queryKey: bladeRunKeys.lists() }),
      ]),
  });
}
