import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { REGION_ID, SAW_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
import { makeRun } from '../../../test-support/records';
import { defaultSiteChecks, type CheckRecord } from '@kerfline/domain/site-checks/schema';
import { inToMm, lbfToN } from '@kerfline/domain/units/units';
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

  it(
    'lists the site’s recorded checks with readings in the site’s units, the verdict as word and shape, and filters in the address',
    async () => {
      const checkId = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
      const checks = defaultSiteChecks().map((c, i) => ({
        ...c,
        id: checkId(100 + i),
        siteId: SITE_ID,
        retiredAt: null,
        recordCount: 1,
        createdAt: '2025-01-01T00:00:00.000Z',
        updatedAt: '2025-01-01T00:00:00.000Z',
        updatedById: null,
        updatedByName: null,
      }));
      const record = (overrides: Partial<CheckRecord>): CheckRecord => ({
        id: checkId(500),
        siteId: SITE_ID,
        sawId: SAW_ID,
        sawAssetTag: 'HS-07',
        siteCheckId: checkId(100),
        checkName: 'Guide bearing clearance',
        targetRule: 'guide_clearance',
        quantity: 'length',
        bladeRunId: null,
        checkedAt: '2026-11-30T14:30:00.000Z',
        checkedById: checkId(9),
        checkedByName: 'Dale Pruitt',
        reading: inToMm(0.034),
        answers: null,
        // 0.035 in band + 0.001 in = 0.036 in, passing to 0.037 in (1 in = 25.4 mm, NIST SP 811 B.8).
        target: inToMm(0.036),
        min: inToMm(0.036),
        max: inToMm(0.037),
        passed: false,
        basis: null,
        explanation: 'Tighter than the target.',
        notes: null,
        photoCount: 0,
        createdAt: '2026-11-30T14:30:00.000Z',
        ...overrides,
      });
      const { requests, router, user } = renderAt(`/sites/${SITE_ID}/check-records?verdict=failed&from=2026-11-01`, {
        [`GET /api/sites/${SITE_ID}/checks`]: { status: 200, body: { siteId: SITE_ID, items: checks } },
        'GET /api/check-records': (request) => ({
          status: 200,
          body: {
            items: [
              record({}),
              record({
                id: checkId(501),
                siteCheckId: checkId(102),
                checkName: 'Head down-force',
                quantity: 'force',
                reading: lbfToN(6),
                target: lbfToN(8),
                min: lbfToN(2),
                max: lbfToN(8),
                passed: true,
                checkedByName: null,
              }),
              record({
                id: checkId(502),
                checkName: 'Chip brush',
                quantity: 'condition',
                reading: null,
                answers: { reachesGullets: true, worn: true },
                target: null,
                min: null,
                max: null,
              }),
            ],
            total: 3,
            limit: Number(request.query.get('limit')),
            offset: Number(request.query.get('offset')),
          },
        }),
      });
      const table = await screen.findByRole('region', { name: 'Checks recorded' }, { timeout: 5000 });
      expect(lastQuery(requests, '/api/check-records')).toMatchObject({
        siteId: SITE_ID,
        passed: 'false',
        from: '2026-11-01T00:00:00.000Z',
        sort: '-checkedAt',
        limit: '25',
        offset: '0',
      });
      const rows = within(table).getAllByRole('row').slice(1);
      // makeSite() is imperial: feeler readings in thousandths of an inch, force in lbf.
      expect(rows[0]).toHaveTextContent('0.034 in');
      expect(rows[0]).toHaveTextContent(/0\.036 in \(0\.036 in to 0\.037 in passes\)/);
      expect(within(rows[0]!).getByText('Failed').closest('[data-shape]')).toHaveAttribute('data-shape', 'square');
      expect(rows[0]).toHaveTextContent('Dale Pruitt');
      expect(rows[1]).toHaveTextContent('6 lbf');
      expect(within(rows[1]!).getByText('Passed').closest('[data-shape]')).toHaveAttribute('data-shape', 'circle');
      expect(rows[1]).toHaveTextContent('someone no longer listed');
      expect(rows[2]).toHaveTextContent('reaches the gullets; worn');
      expect(screen.getByRole('combobox', { name: 'Verdict' })).toHaveValue('failed');
      expect(within(table).getByRole('columnheader', { name: /When/ })).toHaveAttribute('aria-sort', 'descending');

      // A filter on the check goes into the address and to the server, from the first page.
      await user.selectOptions(screen.getByRole('combobox', { name: 'Check' }), checkId(102));
      await waitFor(() => expect(new URLSearchParams(router.state.location.search).get('check')).toBe(checkId(102)));
      await waitFor(() =>
        expect(lastQuery(requests, '/api/check-records')).toMatchObject({ siteCheckId: checkId(102), passed: 'false' }),
      );
      // The site's records navigation leads here.
      expect(screen.getByRole('link', { name: 'Checks recorded' })).toHaveAttribute(
        'href',
        `/sites/${SITE_ID}/check-records`,
      );
    },
    ROUTER_TEST_MS,
  );

  it(
    'offers a site admin the table as CSV with the same filters and sort, and every row rather than the page',
    async () => {
      const { requests, user } = renderAt(`/sites/${SITE_ID}/blade-runs?reason=broken&state=off&offset=25`, {
        'GET /api/blade-runs': { status: 200, body: page([makeRun()]) },
        'GET /api/blade-runs/export': {
          status: 503,
          body: { error: { code: 'UNAVAILABLE', message: 'The database is restarting; try again in a minute.' } },
        },
      });
      const table = await screen.findByRole('region', { name: 'Blade runs' }, { timeout: 5000 });
      await user.click(within(table).getByRole('button', { name: 'Export CSV' }));
      await waitFor(() => expect(requests.some((r) => r.path === '/api/blade-runs/export')).toBe(true));
      expect(lastQuery(requests, '/api/blade-runs/export')).toEqual({
        siteId: SITE_ID,
        reason: 'broken',
        open: 'false',
        sort: '-installedAt',
      });
      // A refusal or failure is said in the server's words, never a file that looks complete.
      expect(await within(table).findByRole('alert')).toHaveTextContent(
        'The database is restarting; try again in a minute.',
      );
    },
    ROUTER_TEST_MS,
  );

  it(
    'offers a technician no export: they read their site’s records but do not export them',
    async () => {
      renderAt(`/sites/${SITE_ID}/stops`, {
        'GET /api/me': { status: 200, body: makeMe('technician') },
        'GET /api/stops': { status: 200, body: page([]) },
      });
      const table = await screen.findByRole('region', { name: 'Stops' }, { timeout: 5000 });
      expect(within(table).queryByRole('button', { name: 'Export CSV' })).not.toBeInTheDocument();
    },
    ROUTER_TEST_MS,
  );
});
