import { queryOptions } from '@tanstack/react-query';
import { exchangeRatesSchema } from '@kerfline/domain/money/schema';
import { api } from '../../../lib/api-client';
import { rateKeys } from './keys';

export function exchangeRatesQuery(q: { from?: string; to?: string } = {}) {
  return queryOptions({
    queryKey: rateKeys.list(q),
    queryFn: ({ signal }) => api.get('/exchange-rates', exchangeRatesSchema, { query: q, signal }),
  });
}
