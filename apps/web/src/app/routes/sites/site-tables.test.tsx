import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { REGION_ID, SAW_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
import { makeRun } from '../../../test-support/records';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderAt(path: string, routes: Parameters<typeof installFakeApi>[0]) {
  const fake = installFakeApi({
    'GET /api/me': { status: 200, body: makeMe('site_admin') },
    'GET /api/regions': { status: 200, body: page([{ id: REGION_ID, name: 'Great Lakes' }]) },
    [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
    'GET /api/saws': { status: 200, body: page([makeSaw()]) },
    ...routes,
  });
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { ...fake, router, user: userEvent.setup() };
}

const lastQuery = (requests: FakeRequest[], path: string) =>
  Object.fromEntries([
    ...requests
      .filter((r) => r.path === path)
      .at(-1)!
      .query.entries(),
  ]);

/** Whole-app tests load lazy pages through the router; under coverage on a busy machine they need more than 5 s. */
const ROUTER_TEST_MS = 20_000;

describe('a site’s record tables keep their state in the address', () => {
  it(
    'asks the server for the page, sort and filters the URL names, and writes a change back, from the first page',
    async () => {
      const runs = Array.from({ length: 25 }, (_, i) =>
        makeRun({
          id: `8e4c3d5f-6a7b-4c8d-ab9e-0f1a2b3c4d${String(i).padStart(2, '0')}`,
          removedAt: '2026-03-02T10:00:00.000Z',
          removalReason: 'broken',
        }),
      );
      const { requests, router, user } = renderAt(`/sites/${SITE_ID}/blade-runs?reason=broken&offset=25`, {
        'GET /api/blade-runs': (request) => ({
          status: 200,
          body: {
            items: runs,
            total: 130,
            limit: Number(request.query.get('limit')),
            offset: Number(request.query.get('offset')),
          },
        }),
      });
      const table = await screen.findByRole('region', { name: 'Blade runs' }, { timeout: 5000 });
      expect(lastQuery(requests, '/api/blade-runs')).toMatchObject({
        siteId: SITE_ID,
        reason: 'broken',
        sort: '-installedAt',
        limit: '25',
        offset: '25',
      });
      expect(within(table).getByText('26–50 of 130 blade runs')).toBeInTheDocument();
      expect(screen.getByRole('combobox', { name: 'Why it came off' })).toHaveValue('broken');
      expect(within(table).getByRole('columnheader', { name: /Put on/ })).toHaveAttribute('aria-sort', 'descending');

      // Sorting by removal asks the server (newest first), keeps the filter and goes back to the first page.
      await user.click(within(table).getByRole('button', { name: /Taken off/ }));
      await waitFor(() => expect(router.state.location.search).toBe('?reason=broken&sort=-removedAt'));
      await waitFor(() =>
        expect(lastQuery(requests, '/api/blade-runs')).toMatchObject({ sort: '-removedAt', offset: '0' }),
      );
      await user.click(within(table).getByRole('button', { name: /Taken off/ }));
      await waitFor(() => expect(new URLSearchParams(router.state.location.search).get('sort')).toBe('removedAt'));

      // A filter changes the address too.
      await user.selectOptions(screen.getByRole('combobox', { name: 'Saw' }), SAW_ID);
      await waitFor(() => expect(new URLSearchParams(router.state.location.search).get('saw')).toBe(SAW_ID));
      await waitFor(() =>
        expect(lastQuery(requests, '/api/blade-runs')).toMatchObject({ sawId: SAW_ID, reason: 'broken' }),
      );

      // Paging forward is a link to the next offset with everything else kept.
      const nextHref = () =>
        new URLSearchParams(within(table).getByRole('link', { name: 'Next' }).getAttribute('href')!.split('?')[1]);
      await waitFor(() =>
        expect(nextHref()).toEqual(new URLSearchParams(`reason=broken&sort=removedAt&saw=${SAW_ID}&offset=25`)),
      );
    },
    ROUTER_TEST_MS,
  );

  it(
    'says so when nothing matches the filters, and reads stops the same way',
    async () => {
      const { requests } = renderAt(`/sites/${SITE_ID}/stops?state=open&category=hydraulic&planned=false`, {
        'GET /api/stops': { status: 200, body: page([]) },
      });
      expect(
        await screen.findByText('No stops match these filters.', undefined, { timeout: 5000 }),
      ).toBeInTheDocument();
      expect(lastQuery(requests, '/api/stops')).toMatchObject({
        siteId: SITE_ID,
        open: 'true',
        category: 'hydraulic',
        planned: 'false',
        sort: '-startedAt',
      });
    },
    ROUTER_TEST_MS,
  );
});
