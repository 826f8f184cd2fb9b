import { queryOptions } from '@tanstack/react-query';
import { meSchema } from '@kerfline/domain/auth/schema';
import { api } from '../../../lib/api-client';
import { meKeys } from './keys';

/**
 * Who is signed in, with the rules their ability is built from. Kept for the whole visit: it changes only
 * by signing in or out, and both replace it in the cache.
 */
export function meQuery() {
  return queryOptions({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => api.get('/me', meSchema, { signal }),
    staleTime: Infinity,
  });
}
