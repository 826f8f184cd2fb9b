import { useMutation, useQueryClient } from '@tanstack/react-query';
import { budgetSchema } from '@kerfline/domain/budgets/schema';
import { api } from '../../../lib/api-client';
import { budgetKeys } from './keys';

/** Sets (or with null clears) a site's budget for a month; the budget tables are refreshed. */
export function useSetBudget() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ siteId, month, amountMinor }: { siteId: string; month: string; amountMinor: number | null }) =>
      amountMinor === null
        ? api.delete(`/budgets/${encodeURIComponent(siteId)}/${month}`, null)
        : api.put(`/budgets/${encodeURIComponent(siteId)}/${month}`, { amountMinor }, budgetSchema),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: budgetKeys.statuses() }),
  });
}
