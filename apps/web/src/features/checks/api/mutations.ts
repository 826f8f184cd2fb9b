import { useMutation, useQueryClient } from '@tanstack/react-query';
import { photoSchema } from '@kerfline/domain/photos/schema';
import {
  checkRecordSchema,
  siteCheckSchema,
  type CheckRecordCreateParsed,
  type SiteCheckCreate,
  type SiteCheckUpdate,
} from '@kerfline/domain/site-checks/schema';
import { api, ApiError } from '../../../lib/api-client';
import { errorBodySchema } from '@kerfline/domain/errors';
import { checkKeys } from './keys';

/** A change of a site's list refreshes that site's lists and every saw's checks (targets and due states). */
function useRefreshChecks() {
  const queryClient = useQueryClient();
  return (siteId: string) =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: ['sites', 'checks', siteId] }),
      queryClient.invalidateQueries({ queryKey: checkKeys.sawsAll() }),
      queryClient.invalidateQueries({ queryKey: checkKeys.countsAll() }),
    ]);
}

export function useAddSiteCheck(siteId: string) {
  const refresh = useRefreshChecks();
  return useMutation({
    mutationFn: (input: SiteCheckCreate) =>
      api.post(`/sites/${encodeURIComponent(siteId)}/checks`, input, siteCheckSchema),
    onSuccess: () => refresh(siteId),
  });
}

export function useChangeSiteCheck(siteId: string) {
  const refresh = useRefreshChecks();
  return useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: SiteCheckUpdate }) =>
      api.patch(`/site-checks/${encodeURIComponent(id)}`, patch, siteCheckSchema),
    onSuccess: () => refresh(siteId),
  });
}

/** Retire (off the list, records kept), bring back, or delete a check never recorded. */
export function useSiteCheckAction(siteId: string) {
  const refresh = useRefreshChecks();
  return useMutation({
    mutationFn: ({ id, action }: { id: string; action: 'retire' | 'restore' | 'delete' }) =>
      action === 'delete'
        ? api.delete(`/site-checks/${encodeURIComponent(id)}`, null)
        : api.post(`/site-checks/${encodeURIComponent(id)}/${action}`, {}, siteCheckSchema),
    onSuccess: () => refresh(siteId),
  });
}

/**
 * Sends one photo of a recorded check (multipart, field `photo`). The browser's fetch sets the boundary; the
 * server recognises the type from the content.
 */
async function uploadCheckPhoto(recordId: string, file: File) {
  const body = new FormData();
  body.append('photo', file);
  const response = await fetch(`/api/check-records/${encodeURIComponent(recordId)}/photos`, {
    method: 'POST',
    body,
    credentials: 'same-origin',
    headers: { Accept: 'application/json' },
  });
  const json: unknown = await response.json().catch(() => undefined);
  if (!response.ok) {
    const parsed = errorBodySchema.safeParse(json);
    throw new ApiError({
      code: parsed.success ? parsed.data.error.code : 'INTERNAL',
      status: response.status,
      message: parsed.success ? parsed.data.error.message : 'The photo was not saved. Try again.',
      details: parsed.success ? parsed.data.error.details : [],
    });
  }
  return photoSchema.parse(json);
}

/**
 * Records a check on a saw (the server works out the target and the verdict), then sends the photo if one was
 * taken. A photo that fails does not undo the record: the answer says so.
 */
export function useRecordCheck(sawId: string, siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: async ({ input, photo }: { input: CheckRecordCreateParsed; photo: File | null }) => {
      const record = await api.post(
        '/check-records',
        { ...input, checkedAt: input.checkedAt?.toISOString() },
        checkRecordSchema,
      );
      let photoError: string | null = null;
      if (photo) {
        try {
          await uploadCheckPhoto(record.id, photo);
        } catch (err) {
          photoError = err instanceof Error ? err.message : 'The photo was not saved.';
        }
      }
      return { record, photoError };
    },
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: checkKeys.saw(sawId) }),
        queryClient.invalidateQueries({ queryKey: ['sites', 'checks', siteId] }),
        queryClient.invalidateQueries({ queryKey: checkKeys.countsAll() }),
        queryClient.invalidateQueries({ queryKey: checkKeys.records() }),
      ]),
  });
}

/**
 * Removes a recorded check entered by mistake, with its photos (kept with the reason, so it can be put back). The
 * saw's checks and the due counts change with it.
 */
export function useRemoveCheckRecord(sawId: string, siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ recordId, reason }: { recordId: string; reason: string }) =>
      api.delete(`/check-records/${encodeURIComponent(recordId)}`, null, { reason }),
    onSuccess: (_none, { recordId }) => {
      queryClient.removeQueries({ queryKey: checkKeys.recordDetail(recordId) });
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: checkKeys.saw(sawId) }),
        queryClient.invalidateQueries({ queryKey: ['sites', 'checks', siteId] }),
        queryClient.invalidateQueries({ queryKey: checkKeys.countsAll() }),
        queryClient.invalidateQueries({ queryKey: checkKeys.records() }),
      ]);
    },
  });
}
