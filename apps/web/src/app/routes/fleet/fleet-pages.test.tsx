import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { addMonths, defaultPeriod } from '@kerfline/domain/fleet/period';
import type { Practice } from '@kerfline/domain/fleet/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { OTHER_SITE_ID, SITE_ID, makeMe, page } from '../../../test-support/fixtures';
import { makeFigures, makeFleetSite, otherFleetSite, overviewFor } from '../../../test-support/fleet';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderAt(path: string, routes: Parameters<typeof installFakeApi>[0]) {
  const fake = installFakeApi({
    'GET /api/me': { status: 200, body: makeMe('manager') },
    'GET /api/sites': { status: 200, body: page([]) },
    ...routes,
  });
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { ...fake, router, user: userEvent.setup() };
}

/** Whole-app tests load lazy pages through the router; on a busy machine they need more than 5 s. */
const ROUTER_TEST_MS = 20_000;

const queriesTo = (requests: FakeRequest[], path: string) =>
  requests.filter((r) => r.path === path).map((r) => Object.fromEntries([...r.query.entries()]));
const lastQuery = (requests: FakeRequest[], path: string) => queriesTo(requests, path).at(-1)!;
const searchOf = (router: ReturnType<typeof renderAt>['router']) =>
  Object.fromEntries([...new URLSearchParams(router.state.location.search).entries()]);

describe('the fleet overview keeps its filters in the address', () => {
  it(
    'reads the period and sites from the address, writes a change back, and steps back through it',
    async () => {
      const { requests, router, user } = renderAt(`/fleet?from=2026-01&to=2026-06&sites=${SITE_ID}&units=imperial`, {
        'GET /api/fleet/overview': (request) => ({ status: 200, body: overviewFor(request) }),
      });
      await screen.findByRole('region', { name: 'Filters' });
      // Asked afresh each time: the page may put a new filter panel in place as the address changes.
      const filters = () => screen.getByRole('region', { name: 'Filters' });
      expect(lastQuery(requests, '/api/fleet/overview')).toEqual({ from: '2026-01', to: '2026-06', sites: SITE_ID });
      expect(within(filters()).getByLabelText('From')).toHaveValue('2026-01');
      expect(within(filters()).getByLabelText('To')).toHaveValue('2026-06');
      expect(within(filters()).getByText('Showing Jan 2026 – Jun 2026.')).toBeInTheDocument();
      await waitFor(() => expect(within(filters()).getByRole('checkbox', { name: /WSM/ })).not.toBeChecked());
      expect(within(filters()).getByRole('checkbox', { name: /HLT/ })).toBeChecked();
      expect(within(filters()).getByRole('radio', { name: /Imperial/ })).toBeChecked();

      // A quick period writes both ends into the address and keeps the sites and units; the API is asked for it.
      const lastWhole = defaultPeriod(new Date()).to;
      await user.click(within(filters()).getByRole('button', { name: 'Last 3 months' }));
      await waitFor(() =>
        expect(searchOf(router)).toEqual({
          from: addMonths(lastWhole, -2),
          to: lastWhole,
          sites: SITE_ID,
          units: 'imperial',
        }),
      );
      await waitFor(() =>
        expect(lastQuery(requests, '/api/fleet/overview')).toEqual({
          from: addMonths(lastWhole, -2),
          to: lastWhole,
          sites: SITE_ID,
        }),
      );
      await waitFor(() =>
        expect(within(filters()).getByRole('button', { name: 'Last 3 months' })).toHaveAttribute(
          'aria-pressed',
          'true',
        ),
      );

      // Picking the other site too means every site: the address drops `sites` and the API is asked for all.
      await user.click(within(filters()).getByRole('checkbox', { name: /WSM/ }));
      await waitFor(() => expect(searchOf(router)).not.toHaveProperty('sites'));
      await waitFor(() => expect(lastQuery(requests, '/api/fleet/overview')).not.toHaveProperty('sites'));
      await waitFor(() => expect(within(filters()).getByRole('group', { name: /^Sites/ })).toHaveTextContent('(all)'));

      // Leaving one site out names the other.
      await user.click(within(filters()).getByRole('checkbox', { name: /HLT/ }));
      await waitFor(() => expect(searchOf(router).sites).toBe(OTHER_SITE_ID));

      // Back steps through the filters as they were.
      await router.navigate(-1);
      await waitFor(() => expect(searchOf(router)).not.toHaveProperty('sites'));
      await router.navigate(-1);
      await waitFor(() =>
        expect(searchOf(router)).toEqual({
          from: addMonths(lastWhole, -2),
          to: lastWhole,
          sites: SITE_ID,
          units: 'imperial',
        }),
      );
      await router.navigate(-1);
      await waitFor(() => expect(within(filters()).getByLabelText('From')).toHaveValue('2026-01'));
    },
    ROUTER_TEST_MS,
  );

  it(
    'carries the period and units into its links and its exports',
    async () => {
      renderAt('/fleet?from=2026-01&to=2026-06&units=metric', {
        'GET /api/fleet/overview': (request) => ({ status: 200, body: overviewFor(request) }),
      });
      const more = await screen.findByRole('navigation', { name: 'More figures' });
      expect(within(more).getByRole('link', { name: 'Practice compared' })).toHaveAttribute(
        'href',
        '/fleet/practice?from=2026-01&to=2026-06&units=metric',
      );
      expect(within(more).getByRole('link', { name: 'Budgets' })).toHaveAttribute(
        'href',
        '/budgets?from=2026-01&to=2026-06&units=metric',
      );
    },
    ROUTER_TEST_MS,
  );

  it(
    'warns of a missing rate by currency and month, and marks the totals it leaves short',
    async () => {
      renderAt('/fleet?from=2026-01&to=2026-06&units=imperial', {
        'GET /api/fleet/overview': (request) => {
          const body = overviewFor(request);
          body.fleet.current = makeFigures({
            spend: {
              amountMinor: 25_800,
              currency: 'USD',
              complete: false,
              missing: [{ amountMinor: 12_000, currency: 'CAD', month: '2026-04' }],
            },
            costPerAreaComplete: false,
          });
          body.warnings = ['CAD → USD: no rate for 2026-04'];
          return { status: 200, body };
        },
      });
      const note = await screen.findByRole('note');
      expect(note).toHaveTextContent('CAD → USD: no rate for 2026-04');
      expect(note).toHaveTextContent('An administrator can enter the rates.');
      const totals = screen.getByRole('heading', { name: 'All shown sites' }).parentElement!;
      expect(within(totals).getByText('$258.00 *')).toBeInTheDocument();
      expect(within(totals).getByText('No rate *')).toBeInTheDocument();
    },
    ROUTER_TEST_MS,
  );
});

/**
 * Two plants, January to June 2026. Blade lives are areas cut per blade: 2,580,640 mm² = 4,000 in² (1 in² =
 * 645.16 mm² exactly, NIST SP 811 B.8) = 27.8 ft²; 1,935,480 mm² = 3,000 in² = 20.8 ft²; in metric 2.58 m² and
 * 1.94 m².
 */
function practice(): Practice {
  return {
    period: { from: '2026-01', to: '2026-06' },
    sites: [
      {
        site: makeFleetSite(),
        breakInRecorded: 40,
        breakInFollowed: 30,
        breakInShare: 0.75,
        medianLifeFollowedMm2: 2_580_640,
        medianLifeSkippedMm2: 1_935_480,
        bladesFollowed: 28,
        bladesSkipped: 9,
        checksDue: 120,
        checksOnTime: 96,
        checksOnTimeShare: 0.8,
        medianLifeChecksOnTimeMm2: 2_580_640,
        medianLifeChecksLateMm2: 1_935_480,
      },
      {
        site: otherFleetSite(),
        breakInRecorded: 10,
        breakInFollowed: 2,
        breakInShare: 0.2,
        medianLifeFollowedMm2: null,
        medianLifeSkippedMm2: 1_935_480,
        bladesFollowed: 1,
        bladesSkipped: 7,
        checksDue: null,
        checksOnTime: null,
        checksOnTimeShare: null,
        medianLifeChecksOnTimeMm2: null,
        medianLifeChecksLateMm2: null,
      },
    ],
  };
}

describe('practice compared', () => {
  it(
    'sets break-in followed and checks on time side by side per site, in a table with its units',
    async () => {
      const { requests, user } = renderAt('/fleet/practice?from=2026-01&to=2026-06&units=imperial', {
        'GET /api/fleet/practice': { status: 200, body: practice() },
      });
      expect(await screen.findByRole('heading', { name: 'Practice compared' })).toBeInTheDocument();
      expect(lastQuery(requests, '/api/fleet/practice')).toEqual({ from: '2026-01', to: '2026-06' });
      expect(screen.getByText('In per cent of the blades whose break-in was recorded.')).toBeInTheDocument();
      expect(screen.getByRole('list', { name: 'Legend' })).toHaveTextContent('HLT Holt Bar Works');

      await user.click(screen.getByRole('button', { name: 'Table' }));
      const table = screen.getByRole('table', {
        name: /Break-in followed, share of blades put on, in per cent of the blades whose break-in was recorded/,
      });
      expect(
        within(table)
          .getAllByRole('columnheader')
          .map((h) => h.textContent),
      ).toEqual([
        'Site',
        'Break-in followed',
        'Blade life, followed',
        'Blade life, skipped',
        'Checks on time',
        'Blade life, checks on time',
        'Blade life, checks late',
      ]);
      const holt = within(table).getByRole('row', { name: /HLT Holt Bar Works/ });
      // 30 of 40 = 75 %; 96 of 120 = 80 %.
      expect(
        within(holt)
          .getAllByRole('cell')
          .map((c) => c.textContent),
      ).toEqual([
        '75\u00a0% (30 of 40)',
        '27.8\u00a0ft² (28)',
        '20.8\u00a0ft² (9)',
        '80\u00a0% (96 of 120)',
        '27.8\u00a0ft²',
        '20.8\u00a0ft²',
      ]);
      const wrenmoor = within(table).getByRole('row', { name: /WSM Wrenmoor Steel/ });
      expect(wrenmoor).toHaveTextContent('Not recorded');

      // What it meant: 4,000 ÷ 3,000 − 1 = 33 % longer, and where the figures come from.
      const meaning = screen.getByRole('heading', { name: 'What it meant for blade life' }).parentElement!;
      expect(meaning).toHaveTextContent('Blades broken in lasted 33 % longer (median 27.8 ft² against 20.8 ft²)');
      expect(meaning).toHaveTextContent('Too few blades of one kind or the other to compare their life.');
      expect(meaning).toHaveTextContent('Checks on time: maintenance checks are not recorded here yet.');
      expect(meaning).toHaveTextContent('A median compares blades taken off in the period');
    },
    ROUTER_TEST_MS,
  );

  it(
    'states blade life in metric when the address asks for it',
    async () => {
      const { user } = renderAt('/fleet/practice?from=2026-01&to=2026-06&units=metric', {
        'GET /api/fleet/practice': { status: 200, body: practice() },
      });
      await user.click(await screen.findByRole('button', { name: 'Table' }));
      const holt = screen.getByRole('row', { name: /HLT Holt Bar Works/ });
      expect(holt).toHaveTextContent('2.58 m² (28)');
    },
    ROUTER_TEST_MS,
  );
});
