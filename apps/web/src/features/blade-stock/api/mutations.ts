import { useMutation, useQueryClient } from '@tanstack/react-query';
import {
  stockLineSchema,
  stockReceiptSchema,
  type StockLevelsInput,
  type StockReceiptCreateParsed,
} from '@kerfline/domain/blade-stock/schema';
import { api } from '../../../lib/api-client';
import { siteStockKeys, stockReceiptKeys } from './keys';

/** Receives blades into a site's stock (site admins); the site's stock and movements are refreshed. */
export function useReceiveStock() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: StockReceiptCreateParsed) => api.post('/stock-receipts', input, stockReceiptSchema),
    onSuccess: (receipt) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: stockReceiptKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: siteStockKeys.all(receipt.siteId) }),
      ]),
  });
}

/** Sets a spec's lead time and safety stock at a site (site admins). */
export function useSetStockLevels(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ bladeSpecId, input }: { bladeSpecId: string; input: StockLevelsInput }) =>
      api.put(
        `/sites/${encodeURIComponent(siteId)}/stock/${encodeURIComponent(bladeSpecId)}/levels`,
        input,
        stockLineSchema.nullable(),
      ),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...siteStockKeys.all(siteId), 'levels'] }),
  });
}
