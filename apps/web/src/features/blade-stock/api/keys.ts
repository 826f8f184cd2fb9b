import type {
  SiteStockQuery,
  StockMovementListQuery,
  StockReceiptListQuery,
} from '@kerfline/domain/blade-stock/schema';

/**
 * Query keys for blade stock. Receipts live at `/api/stock-receipts`; a site's stock and its movements at
 * `/api/sites/:id/stock…`, so their keys start with that path's segments, under the site's detail.
 */
export const stockReceiptKeys = {
  all: ['stock-receipts'] as const,
  lists: () => [...stockReceiptKeys.all, 'list'] as const,
  list: (q: StockReceiptListQuery) => [...stockReceiptKeys.lists(), q] as const,
};

export const siteStockKeys = {
  all: (siteId: string) => ['sites', 'detail', siteId, 'stock'] as const,
  levels: (siteId: string, q: SiteStockQuery) => [...siteStockKeys.all(siteId), 'levels', q] as const,
  movements: (siteId: string, q: StockMovementListQuery) => [...siteStockKeys.all(siteId), 'movements', q] as const,
};
