import { QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/** Answers a retry cannot change: the request itself is wrong, or the user may not have it. */
function isFinal(error: unknown): boolean {
  return error instanceof ApiError && error.status >= 400 && error.status < 500;
}

/**
 * One cache per browser tab. The router decides when to load (loaders call `ensureQueryData`); the cache
 * owns the data. Lists stay fresh for 30 s so moving between pages does not refetch on every click.
 */
export function createQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: (failureCount, error) => !isFinal(error) && failureCount < 2,
      },
      mutations: { retry: false },
    },
  });
}
