import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import { regionSchema } from '@kerfline/domain/regions/schema';
import { api } from '../../../lib/api-client';
import { regionKeys } from './keys';

const regionPageSchema = pageOf(regionSchema);

/** Every region in the user's scope (a customer has a handful; 500 is the API's page cap). */
export function regionListQuery() {
  return queryOptions({
    queryKey: regionKeys.list(),
    queryFn: ({ signal }) => api.get('/regions', regionPageSchema, { query: { limit: 500, offset: 0 }, signal }),
    staleTime: 5 * 60_000,
  });
}
