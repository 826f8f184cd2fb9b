import type { FleetQuery } from '@kerfline/domain/fleet/schema';

/** Query keys for budgets; the first segment is the API path segment (`/api/budgets`). */
export const budgetKeys = {
  all: ['budgets'] as const,
  statuses: () => [...budgetKeys.all, 'status'] as const,
  status: (q: FleetQuery) => [...budgetKeys.statuses(), q] as const,
};
