import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { siteListQuerySchema, siteSchema, type SiteListQuery } from '@kerfline/domain/sites/schema';
import { api } from '../../../lib/api-client';
import { siteKeys } from './keys';

const sitePageSchema = pageOf(siteSchema);

/** The list query with its defaults; a whole customer (60 sites at most so far) fits in one page of 500. */
export function parseSiteListQuery(input: Partial<Record<keyof SiteListQuery, unknown>> = {}): SiteListQuery {
  return siteListQuerySchema.parse({ limit: 500, ...input });
}

export function siteListQuery(q: SiteListQuery = parseSiteListQuery()) {
  return queryOptions({
    queryKey: siteKeys.list(q),
    queryFn: ({ signal }) => api.get('/sites', sitePageSchema, { query: q, signal }),
  });
}

export function siteDetailQuery(id: string) {
  return queryOptions({
    queryKey: siteKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/sites/${encodeURIComponent(id)}`, siteSchema, { signal }),
  });
}
