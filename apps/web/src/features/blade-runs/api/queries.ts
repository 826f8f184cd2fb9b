import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { bladeRunSchema, type BladeRunListQuery } from '@kerfline/domain/blade-runs/schema';
import { runDiagnosisSchema } from '@kerfline/domain/blade-runs/wire';
import type { FailureMode } from '@kerfline/domain/diagnosis/schema';
import { photoSchema } from '@kerfline/domain/photos/schema';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { bladeRunKeys } from './keys';

const bladeRunPageSchema = pageOf(bladeRunSchema);

export function bladeRunListQuery(q: BladeRunListQuery) {
  return queryOptions({
    queryKey: bladeRunKeys.list(q),
    queryFn: ({ signal }) =>
      api.get('/blade-runs', bladeRunPageSchema, {
        query: { ...q, from: q.from?.toISOString(), to: q.to?.toISOString() },
        signal,
      }),
  });
}

export function bladeRunDetailQuery(id: string) {
  return queryOptions({
    queryKey: bladeRunKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/blade-runs/${encodeURIComponent(id)}`, bladeRunSchema, { signal }),
  });
}

/** The ranked likely causes of a run's failure for a reason (the run's own removal reason when null). */
export function likelyCausesQuery(id: string, reason: FailureMode | null) {
  return queryOptions({
    queryKey: bladeRunKeys.likelyCauses(id, reason),
    queryFn: ({ signal }) =>
      api.get(`/blade-runs/${encodeURIComponent(id)}/likely-causes`, runDiagnosisSchema, {
        query: { reason: reason ?? undefined },
        signal,
      }),
  });
}

export function runPhotosQuery(id: string) {
  return queryOptions({
    queryKey: bladeRunKeys.photos(id),
    queryFn: ({ signal }) => api.get(`/blade-runs/${encodeURIComponent(id)}/photos`, z.array(photoSchema), { signal }),
  });
}
