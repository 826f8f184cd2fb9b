import { queryOptions } from '@tanstack/react-query';
import { pageOf } from '@kerfline/domain/common/schema';
import {
  siteStockQuerySchema,
  siteStockSchema,
  stockMovementSchema,
  type SiteStockQuery,
  type StockMovementListQuery,
} from '@kerfline/domain/blade-stock/schema';
import { api } from '../../../lib/api-client';
import { siteStockKeys } from './keys';

const movementPageSchema = pageOf(stockMovementSchema);

/** A site's stock per spec: on hand, use rate, days left and reorder point (the usage window's default applied). */
export function siteStockQuery(siteId: string, q: SiteStockQuery = siteStockQuerySchema.parse({})) {
  return queryOptions({
    queryKey: siteStockKeys.levels(siteId, q),
    queryFn: ({ signal }) =>
      api.get(`/sites/${encodeURIComponent(siteId)}/stock`, siteStockSchema, { query: q, signal }),
  });
}

export function stockMovementsQuery(siteId: string, q: StockMovementListQuery) {
  return queryOptions({
    queryKey: siteStockKeys.movements(siteId, q),
    queryFn: ({ signal }) =>
      api.get(`/sites/${encodeURIComponent(siteId)}/stock/movements`, movementPageSchema, {
        query: { ...q, from: q.from?.toISOString(), to: q.to?.toISOString() },
        signal,
      }),
  });
}
