import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { defaultPeriod } from '@kerfline/domain/fleet/period';
import { askEarly } from '../../../lib/api-client';
import { fleetKeys } from '../../../features/fleet/api/keys';
import { forgetFailedChartCode, loadChartCode } from '../../../features/fleet/components/chart-code';

/**
 * The overview's loader, kept out of the page's chunk so it runs the moment the address matches: the figures'
 * request (the same query options, from the same address, as the page reads), the page's code and the chart code
 * are then all on their way together, beside `/api/me`, instead of one after the other. It waits for none of
 * them: the page shows its own loading, empty and error states, and the root loader still sends a signed-out
 * visitor to sign in (the figures' request then only gets a 401 that nothing shows).
 */
/**
 * Asks for the overview's figures by the address the page's query will use: the period asked for, or the last
 * twelve whole months. Asking twice for one address within the early answer's lifetime sends one request.
 */
export function askOverviewEarly(search: URLSearchParams, now = new Date()): void {
  const period = search.has('from') || search.has('to') ? null : defaultPeriod(now);
  askEarly('/fleet/overview', {
    from: period?.from ?? search.get('from'),
    to: period?.to ?? search.get('to'),
    sites: search.get('sites'),
  });
}

export function overviewLoader(queryClient: QueryClient) {
  return ({ request }: LoaderFunctionArgs) => {
    const search = new URL(request.url).searchParams;
    // On a first visit the figures are asked for at once, by the same address the page's query will use (the
    // period asked for, or the last twelve whole months), before the query code below has arrived; that query then
    // takes this answer rather than asking again. A period the query reads differently just goes unused.
    if (queryClient.getQueryCache().findAll({ queryKey: [...fleetKeys.all, 'overview'] }).length === 0)
      askOverviewEarly(search);
    // The queries and their schemas (zod) come in their own small chunk, so the first page's JavaScript stays light.
    void import('../../../features/fleet/api/queries').then(({ fleetOverviewQuery, fleetQueryFromSearch }) =>
      queryClient.prefetchQuery(fleetOverviewQuery(fleetQueryFromSearch(search))),
    );
    // A load that failed earlier in the visit is tried again on a new visit to the page; a failure now is shown
    // by the chart panels, with their own "Try again".
    forgetFailedChartCode();
    loadChartCode().catch(() => undefined);
    return null;
  };
}
