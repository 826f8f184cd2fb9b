import { describe, expect, it } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import { createMemoryRouter } from 'react-router-dom';
import { defaultPeriod } from '@kerfline/domain/fleet/period';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeResponse } from '../../../test-support/fake-api';
import { SITE_ID, makeMe } from '../../../test-support/fixtures';
import { overviewFor } from '../../../test-support/fleet';
import { fleetKeys } from '../../../features/fleet/api/keys';
import { loadedChartCode } from '../../../features/fleet/components/chart-code';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

/*
 * The overview's first load: the route's loader asks for the figures and the chart code as the address matches.
 * These tests show the order of requests and what the cache holds, never how long anything takes.
 */

/** Whole-app tests load lazy pages (and here the chart library) through the router; a busy machine needs time. */
const ROUTER_TEST_MS = 30_000;

/** An answer the test releases when it chooses, to see what was asked for while it was still pending. */
function held() {
  let release: () => void = () => undefined;
  const released = new Promise<void>((resolve) => {
    release = resolve;
  });
  return { release, after: (answer: () => FakeResponse) => released.then(answer) };
}

function renderAt(path: string, routes: Parameters<typeof installFakeApi>[0]) {
  const fake = installFakeApi({ 'GET /api/sites': { status: 200, body: { items: [] } }, ...routes });
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  const overviewRequests = () => fake.requests.filter((r) => r.path === '/api/fleet/overview');
  const overviewQueries = () => queryClient.getQueryCache().findAll({ queryKey: [...fleetKeys.all, 'overview'] });
  return { ...fake, queryClient, overviewRequests, overviewQueries };
}

describe('the fleet overview’s first load', () => {
  // First in this file: the chart code is loaded once per visit, and a later test would find it already here.
  it(
    'starts loading the chart code before the figures arrive, and draws the charts from it',
    async () => {
      expect(loadedChartCode()).toBeUndefined();
      const figures = held();
      const { overviewRequests } = renderAt('/fleet?from=2026-01&to=2026-06', {
        'GET /api/me': { status: 200, body: makeMe('manager') },
        'GET /api/fleet/overview': (request) => figures.after(() => ({ status: 200, body: overviewFor(request) })),
      });
      await waitFor(() => expect(overviewRequests()).toHaveLength(1));
      // The figures are still held back, yet the chart code is already here.
      await waitFor(() => expect(loadedChartCode()).toBeDefined(), { timeout: ROUTER_TEST_MS });
      expect((await screen.findAllByText('Loading the figures…')).length).toBeGreaterThan(0);

      figures.release();
      // The stop-hours chart has figures: its panel draws the chart, with no "Loading the chart…" left behind.
      const stops = await screen.findByRole('region', { name: 'Stop hours by category' });
      await waitFor(() => expect(stops.querySelector('figure')).not.toBeNull());
      expect(screen.queryByText('Loading the chart…')).toBeNull();
      expect(overviewRequests()).toHaveLength(1);
    },
    ROUTER_TEST_MS,
  );

  it(
    'asks for the figures beside /api/me, not after it, under the key the page reads, so the page never asks again',
    async () => {
      const me = held();
      const { overviewRequests, overviewQueries, requests } = renderAt(
        `/fleet?from=2026-01&to=2026-06&sites=${SITE_ID}&units=imperial`,
        {
          'GET /api/me': () => me.after(() => ({ status: 200, body: makeMe('manager') })),
          'GET /api/fleet/overview': (request) => ({ status: 200, body: overviewFor(request) }),
        },
      );
      // /api/me has not answered, and the figures are already asked for, with the address's period and sites.
      await waitFor(() => expect(overviewRequests()).toHaveLength(1));
      expect(requests.map((r) => r.path)).toContain('/api/me');
      expect(Object.fromEntries(overviewRequests()[0]!.query)).toEqual({
        from: '2026-01',
        to: '2026-06',
        sites: SITE_ID,
      });

      me.release();
      await screen.findByRole('heading', { name: 'Fleet overview' });
      await screen.findByRole('heading', { name: 'All shown sites' });
      // The page read what the loader put in the cache: one query, one request, and the same key.
      expect(overviewRequests()).toHaveLength(1);
      expect(overviewQueries().map((q) => q.queryKey)).toEqual([
        fleetKeys.overview({ from: '2026-01', to: '2026-06', sites: [SITE_ID] }),
      ]);
    },
    ROUTER_TEST_MS,
  );

  it(
    'with no period in the address, the loader and the page agree on the default one',
    async () => {
      const { overviewRequests, overviewQueries } = renderAt('/fleet', {
        'GET /api/me': { status: 200, body: makeMe('manager') },
        'GET /api/fleet/overview': (request) => ({ status: 200, body: overviewFor(request) }),
      });
      await screen.findByRole('heading', { name: 'All shown sites' });
      const { from, to } = defaultPeriod(new Date());
      expect(overviewRequests().map((r) => Object.fromEntries(r.query))).toEqual([{ from, to }]);
      expect(overviewQueries()).toHaveLength(1);
    },
    ROUTER_TEST_MS,
  );

  it(
    'draws the four charts one at a time, never two in the same turn, the first first',
    async () => {
      const titles = [
        'Blade spend by month',
        'Cost per area cut by month',
        'Stop hours by category',
        'Blade life by site (median)',
      ];
      // Each time the page changes, which panels have just left their loading state (drawn their chart, or said
      // there is nothing to draw): a turn that drew two would show here.
      const arrivals: string[][] = [];
      const drawn = new Set<string>();
      const ready = (title: string) => {
        const panel = screen.queryByRole('region', { name: title });
        return panel !== null && !/Loading the (figures|chart)/.test(panel.textContent ?? '');
      };
      const observer = new MutationObserver(() => {
        const now = titles.filter((t) => !drawn.has(t) && ready(t));
        now.forEach((t) => drawn.add(t));
        if (now.length) arrivals.push(now);
      });
      observer.observe(document.body, { childList: true, subtree: true });
      try {
        renderAt('/fleet?from=2026-01&to=2026-06', {
          'GET /api/me': { status: 200, body: makeMe('manager') },
          'GET /api/fleet/overview': (request) => ({ status: 200, body: overviewFor(request) }),
        });
        await waitFor(() => expect([...drawn]).toHaveLength(4), { timeout: 5000 });
      } finally {
        observer.disconnect();
      }
      expect(arrivals).toEqual(titles.map((t) => [t]));
    },
    ROUTER_TEST_MS,
  );
});
