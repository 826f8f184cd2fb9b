import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  bladeSpecListQuerySchema,
  bladeSpecSchema,
  type BladeSpecListQuery,
} from '@kerfline/domain/blade-specs/schema';
import { api } from '../../../lib/api-client';
import { bladeSpecKeys } from './keys';

const bladeSpecPageSchema = pageOf(bladeSpecSchema);

/** The list query with its defaults; a site's catalogue fits one page of 500. */
export function parseBladeSpecListQuery(input: Partial<Record<keyof BladeSpecListQuery, unknown>> = {}) {
  return bladeSpecListQuerySchema.parse({ limit: 500, ...input });
}

export function bladeSpecListQuery(q: BladeSpecListQuery) {
  return queryOptions({
    queryKey: bladeSpecKeys.list(q),
    queryFn: ({ signal }) => api.get('/blade-specs', bladeSpecPageSchema, { query: q, signal }),
  });
}

export function bladeSpecDetailQuery(id: string) {
  return queryOptions({
    queryKey: bladeSpecKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/blade-specs/${encodeURIComponent(id)}`, bladeSpecSchema, { signal }),
  });
}
