import { useMutation, useQueryClient } from '@tanstack/react-query';
import { exchangeRateSchema, exchangeRatesSchema } from '@kerfline/domain/money/schema';
import { api } from '../../../lib/api-client';
import { rateKeys } from './keys';

/** Rates feed every money figure: after a change the rate lists and every fleet figure are refetched. */
function useRefresh() {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([
      queryClient.invalidateQueries({ queryKey: rateKeys.all }),
      queryClient.invalidateQueries({ queryKey: ['fleet'] }),
      queryClient.invalidateQueries({ queryKey: ['budgets'] }),
      queryClient.invalidateQueries({ queryKey: ['outliers'] }),
    ]);
}

export function usePutRate() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: ({ currency, month, rate }: { currency: string; month: string; rate: number }) =>
      api.put(`/exchange-rates/${currency}/${month}`, { rate }, exchangeRateSchema),
    onSuccess: refresh,
  });
}

export function usePutReportingCurrency() {
  const refresh = useRefresh();
  return useMutation({
    mutationFn: (currency: string) => api.put('/reporting-currency', { currency }, exchangeRatesSchema),
    onSuccess: refresh,
  });
}
