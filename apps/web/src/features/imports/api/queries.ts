import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  importBatchSchema,
  importContextSchema,
  importListQuerySchema,
  type ImportContextQuery,
  type ImportListQuery,
} from '@kerfline/domain/imports/schema';
import { api } from '../../../lib/api-client';
import { importKeys } from './keys';

const importPageSchema = pageOf(importBatchSchema);

export function parseImportListQuery(input: Partial<Record<keyof ImportListQuery, unknown>> = {}): ImportListQuery {
  return importListQuerySchema.parse({ limit: 50, ...input });
}

export function importListQuery(q: ImportListQuery) {
  return queryOptions({
    queryKey: importKeys.list(q),
    queryFn: ({ signal }) => api.get('/imports', importPageSchema, { query: q, signal }),
  });
}

export function importDetailQuery(id: string) {
  return queryOptions({
    queryKey: importKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/imports/${encodeURIComponent(id)}`, importBatchSchema, { signal }),
  });
}

/** The site's saws, specs, units, remembered mapping and the limits, for one kind of file. */
export function importContextQuery(q: ImportContextQuery) {
  return queryOptions({
    queryKey: importKeys.context(q),
    queryFn: ({ signal }) => api.get('/imports/context', importContextSchema, { query: q, signal }),
    staleTime: 60_000,
  });
}

/** Where the rejected rows of an import are downloaded from. */
export const rejectedRowsHref = (id: string) => `/api/imports/${encodeURIComponent(id)}/rejected.csv`;
