/** Query keys for exchange rates; the first segment is the API path segment (`/api/exchange-rates`). */
export const rateKeys = {
  all: ['exchange-rates'] as const,
  list: (q: { from?: string; to?: string }) => [...rateKeys.all, 'list', q] as const,
};
