import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { FleetQuery } from '@kerfline/domain/fleet/schema';
import { budgetStatusSchema } from '@kerfline/domain/budgets/schema';
import { api } from '../../../lib/api-client';
import { budgetKeys } from './keys';

export function budgetStatusQuery(q: FleetQuery) {
  return queryOptions({
    queryKey: budgetKeys.status(q),
    queryFn: ({ signal }) =>
      api.get('/budgets', budgetStatusSchema, { query: { from: q.from, to: q.to, sites: q.sites?.join(',') }, signal }),
    placeholderData: keepPreviousData,
  });
}
