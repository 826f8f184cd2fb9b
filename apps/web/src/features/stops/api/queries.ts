import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { stopSchema, type StopListQuery } from '@kerfline/domain/stops/schema';
import { api } from '../../../lib/api-client';
import { stopKeys } from './keys';

const stopPageSchema = pageOf(stopSchema);

export function stopListQuery(q: StopListQuery) {
  return queryOptions({
    queryKey: stopKeys.list(q),
    queryFn: ({ signal }) =>
      api.get('/stops', stopPageSchema, {
        query: { ...q, from: q.from?.toISOString(), to: q.to?.toISOString() },
        signal,
      }),
  });
}

export function stopDetailQuery(id: string) {
  return queryOptions({
    queryKey: stopKeys.detail(id),
    queryFn: ({ signal }) => api.get(`/stops/${encodeURIComponent(id)}`, stopSchema, { signal }),
  });
}
