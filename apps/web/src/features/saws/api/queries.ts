import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { sawSchema, type SawListQuery } from '@kerfline/domain/saws/schema';
import { api } from '../../../lib/api-client';
import { sawKeys } from './keys';

const sawPageSchema = pageOf(sawSchema);

export function sawListQuery(q: SawListQuery) {
  return queryOptions({
    queryKey: sawKeys.list(q),
    queryFn: ({ signal }) => api.get('/saws', sawPageSchema, { query: q, signal }),
  });
}

export function sawDetailQuery(id: string) {
  return queryOptions({
    queryKey: sawKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/saws/${encodeURIComponent(id)}`, sawSchema, { signal }),
  });
}
