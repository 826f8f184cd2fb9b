import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import type { BudgetMonth, BudgetStatus } from '@kerfline/domain/budgets/schema';
import type { ExchangeRates } from '@kerfline/domain/money/schema';
import type { Role } from '@kerfline/domain/users/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { SITE_ID, makeMe, page } from '../../../test-support/fixtures';
import { makeFleetSite } from '../../../test-support/fleet';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderAt(role: Role, path: string, routes: Parameters<typeof installFakeApi>[0]) {
  const fake = installFakeApi({
    'GET /api/me': { status: 200, body: makeMe(role) },
    'GET /api/sites': { status: 200, body: page([]) },
    ...routes,
  });
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { ...fake, router, user: userEvent.setup() };
}

/** A regional lead's budgets page for the period, answered with `status`; Holt Bar Works' table once it shows. */
async function holtTableForLead(period: string, status: BudgetStatus) {
  renderAt('regional_lead', `/budgets?${period}`, { 'GET /api/budgets': { status: 200, body: status } });
  return screen.findByRole('table', { name: /Blade budget and spend of Holt Bar Works/ });
}

/** Whole-app tests load lazy pages through the router; on a busy machine they need more than 5 s. */
const ROUTER_TEST_MS = 20_000;

const month = (overrides: Partial<BudgetMonth> & { month: string }): BudgetMonth => ({
  budget: null,
  spentMinor: 0,
  spendComplete: true,
  varianceMinor: null,
  percentUsed: null,
  elapsedFraction: 1,
  projectedMinor: null,
  projectedOverBudget: null,
  ...overrides,
});

const budget = (m: string, amountMinor: number) => ({
  id: `9d1e2f3a-4b5c-4d6e-8f70-81920a1b2c${m.slice(-2)}`,
  siteId: SITE_ID,
  month: m,
  amountMinor,
  currency: 'USD',
  setByName: 'Rosa Threlkeld',
  updatedAt: `${m}-01T09:00:00.000Z`,
});

/**
 * Holt Bar Works, October to December 2026, in US dollars (amounts in cents):
 * - October: budget $4,000, spent $4,350 → variance 4,000 − 4,350 = −$350 (over), used 4,350 ÷ 4,000 = 108.75 %.
 * - November: budget $4,000, spent $3,100 → variance +$900 (under), used 77.5 %.
 * - December, 40 % gone: spent $1,800 so far → projected 1,800 ÷ 0.4 = $4,500 for the month, over its $4,000.
 * Period: budget 12,000, spend 4,350 + 3,100 + 1,800 = 9,250, variance 12,000 − 9,250 = $2,750 under.
 */
function holtStatus(): BudgetStatus {
  return {
    period: { from: '2026-10', to: '2026-12' },
    asOf: '2026-12-13T15:00:00.000Z',
    sites: [
      {
        site: makeFleetSite(),
        months: [
          month({
            month: '2026-10',
            budget: budget('2026-10', 400_000),
            spentMinor: 435_000,
            varianceMinor: -35_000,
            percentUsed: 108.75,
          }),
          month({
            month: '2026-11',
            budget: budget('2026-11', 400_000),
            spentMinor: 310_000,
            varianceMinor: 90_000,
            percentUsed: 77.5,
          }),
          month({
            month: '2026-12',
            budget: budget('2026-12', 400_000),
            spentMinor: 180_000,
            varianceMinor: 220_000,
            percentUsed: 45,
            elapsedFraction: 0.4,
            projectedMinor: 450_000,
            projectedOverBudget: true,
          }),
        ],
        budgetMinor: 1_200_000,
        spentMinor: 925_000,
        spendComplete: true,
        budgetedMonths: 3,
        varianceMinor: 275_000,
      },
    ],
    warnings: [],
  };
}

const lastQuery = (requests: FakeRequest[], path: string) =>
  Object.fromEntries([
    ...requests
      .filter((r) => r.path === path)
      .at(-1)!
      .query.entries(),
  ]);

describe('the budgets page', () => {
  it(
    'lets a manager set a month’s budget in the site’s currency, and words variance and projection',
    async () => {
      const { requests, user } = renderAt('manager', '/budgets?from=2026-10&to=2026-12', {
        'GET /api/budgets': { status: 200, body: holtStatus() },
        [`PUT /api/budgets/${SITE_ID}/2026-12`]: (request) => ({
          status: 200,
          body: { ...budget('2026-12', (request.body as { amountMinor: number }).amountMinor) },
        }),
      });
      const table = await screen.findByRole('table', {
        name: /Blade budget and spend of Holt Bar Works by month, in USD/,
      });
      expect(lastQuery(requests, '/api/budgets')).toMatchObject({ from: '2026-10', to: '2026-12' });
      expect(within(table).getByRole('columnheader', { name: 'Budget (USD)' })).toBeInTheDocument();

      const october = within(table).getByRole('row', { name: /Oct 2026/ });
      // One precision for the whole table: its budgets are thousands, so no amount shows cents, and a row adds up
      // as read ($4,000 − $4,350 = $350 over). A share is shown to the whole per cent (108.75 → 109).
      expect(october).toHaveTextContent('$4,350');
      expect(october).toHaveTextContent('▲ $350 over');
      expect(october).not.toHaveTextContent('.00');
      expect(october).toHaveTextContent('109 %');
      expect(within(table).getByRole('row', { name: /Nov 2026/ })).toHaveTextContent('$900 under');
      const december = within(table).getByRole('row', { name: /Dec 2026/ });
      expect(december).toHaveTextContent('in progress (40 % gone)');
      expect(december).toHaveTextContent('$4,500 (over budget)');
      expect(within(table).getByRole('row', { name: /Period/ })).toHaveTextContent(
        '$2,750 under in the months with a budget',
      );
      expect(screen.getByText(/the blades put on the site’s saws, at the cost fixed when they went on/)).toBeVisible();

      // The manager changes December's budget to $5,000.00: the server gets cents, and the table is asked again.
      const asked = requests.filter((r) => r.path === '/api/budgets').length;
      const input = within(table).getByRole('textbox', { name: 'Budget for Dec 2026 in USD' });
      expect(input).toHaveValue('4000');
      await user.clear(input);
      await user.type(input, '5,000.00');
      await user.click(within(december).getByRole('button', { name: 'Save' }));
      await waitFor(() => expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ amountMinor: 500_000 }));
      expect(requests.find((r) => r.method === 'PUT')?.path).toBe(`/api/budgets/${SITE_ID}/2026-12`);
      await waitFor(() => expect(requests.filter((r) => r.path === '/api/budgets').length).toBeGreaterThan(asked));
    },
    ROUTER_TEST_MS,
  );

  it(
    'refuses text that is not an amount before anything is sent',
    async () => {
      const { requests, user } = renderAt('manager', '/budgets?from=2026-10&to=2026-12', {
        'GET /api/budgets': { status: 200, body: holtStatus() },
      });
      const table = await screen.findByRole('table', { name: /Blade budget and spend/ });
      const input = within(table).getByRole('textbox', { name: 'Budget for Nov 2026 in USD' });
      await user.clear(input);
      await user.type(input, 'four grand');
      expect(input).toHaveAttribute('aria-invalid', 'true');
      expect(within(table).getByText('a number of USD')).toBeInTheDocument();
      expect(within(table).getByRole('button', { name: 'Save' })).toBeDisabled();
      expect(requests.some((r) => r.method === 'PUT')).toBe(false);
    },
    ROUTER_TEST_MS,
  );

  it(
    'shows a regional lead the budgets and the variance, with nothing to change them',
    async () => {
      const table = await holtTableForLead('from=2026-10&to=2026-12', holtStatus());
      expect(within(table).getByRole('row', { name: /Oct 2026/ })).toHaveTextContent('$4,000');
      expect(within(table).getByRole('row', { name: /Oct 2026/ })).toHaveTextContent('$350 over');
      expect(within(table).queryByRole('textbox')).not.toBeInTheDocument();
      // Money alone: a period to choose, no unit system.
      expect(screen.getByRole('button', { name: 'Last 3 months' })).toBeInTheDocument();
      expect(screen.queryByRole('group', { name: 'Units' })).not.toBeInTheDocument();
      expect(within(table).queryByRole('button', { name: 'Save' })).not.toBeInTheDocument();
      expect(screen.getByRole('button', { name: 'Export CSV' })).toBeInTheDocument();
    },
    ROUTER_TEST_MS,
  );

  it(
    'projects the month in progress only once it has a spend',
    async () => {
      const status = holtStatus();
      const site = status.sites[0]!;
      site.months[2] = {
        ...site.months[2]!,
        spentMinor: 0,
        varianceMinor: 400_000,
        percentUsed: 0,
        elapsedFraction: 0.07,
        projectedMinor: 0,
        projectedOverBudget: false,
      };
      const table = await holtTableForLead('from=2026-10&to=2026-12', status);
      const december = within(table).getByRole('row', { name: /Dec 2026/ });
      expect(december).toHaveTextContent('in progress (7 % gone)');
      expect(december).toHaveTextContent('No spend yet');
    },
    ROUTER_TEST_MS,
  );

  it(
    'keeps the cents of a site whose amounts are all under a thousand',
    async () => {
      const status = holtStatus();
      const site = status.sites[0]!;
      site.months = [
        month({
          month: '2026-10',
          budget: budget('2026-10', 50_000),
          spentMinor: 46_668,
          varianceMinor: 3332,
          percentUsed: 93.336,
        }),
      ];
      Object.assign(site, { budgetMinor: 50_000, spentMinor: 46_668, budgetedMonths: 1, varianceMinor: 3332 });
      const table = await holtTableForLead('from=2026-10&to=2026-10', status);
      const october = within(table).getByRole('row', { name: /Oct 2026/ });
      expect(october).toHaveTextContent('$500.00');
      expect(october).toHaveTextContent('$466.68');
      expect(october).toHaveTextContent('$33.32 under');
    },
    ROUTER_TEST_MS,
  );

  it(
    'marks spend left short by a missing rate, and says which rate is missing',
    async () => {
      const status = holtStatus();
      const site = status.sites[0]!;
      site.months[1] = { ...site.months[1]!, spendComplete: false };
      site.spendComplete = false;
      status.warnings = ['CAD → USD: no rate for 2026-11'];
      renderAt('manager', '/budgets?from=2026-10&to=2026-12', { 'GET /api/budgets': { status: 200, body: status } });
      const table = await screen.findByRole('table', { name: /Blade budget and spend/ });
      expect(within(table).getByRole('row', { name: /Nov 2026/ })).toHaveTextContent('$3,100 *');
      expect(within(table).getByRole('row', { name: /Period/ })).toHaveTextContent('$9,250 *');
      const note = screen.getByRole('note');
      expect(note).toHaveTextContent('Some money could not be converted');
      expect(note).toHaveTextContent('CAD → USD: no rate for 2026-11');
    },
    ROUTER_TEST_MS,
  );
});

/** Rates into US dollars for a Canadian plant, October and November 2026: October entered, November not. */
function rates(overrides: Partial<ExchangeRates> = {}): ExchangeRates {
  return {
    reportingCurrency: 'USD',
    reportingCurrencySetByName: 'Ines Marlowe',
    reportingCurrencySetAt: '2026-01-05T14:30:00.000Z',
    currencies: ['CAD'],
    months: ['2026-10', '2026-11'],
    items: [
      {
        id: '1f2e3d4c-5b6a-4978-8695-a4b3c2d1e0f9',
        month: '2026-10',
        currency: 'CAD',
        reportingCurrency: 'USD',
        rate: 0.72,
        setByName: 'Ines Marlowe',
        updatedAt: '2026-11-02T10:00:00.000Z',
      },
    ],
    ...overrides,
  };
}

describe('the exchange rates page', () => {
  it(
    'names the reporting currency and who chose it, and lets an administrator enter a month’s rate',
    async () => {
      const { requests, user } = renderAt('admin', '/exchange-rates', {
        'GET /api/exchange-rates': { status: 200, body: rates() },
        'PUT /api/exchange-rates/CAD/2026-11': (request) => ({
          status: 200,
          body: {
            ...rates().items[0]!,
            id: '2a3b4c5d-6e7f-4081-9a2b-3c4d5e6f7a8b',
            month: '2026-11',
            rate: (request.body as { rate: number }).rate,
          },
        }),
      });
      expect(await screen.findByRole('heading', { name: 'Exchange rates' })).toBeInTheDocument();
      expect(screen.getByText(/Fleet totals are in USD/)).toBeInTheDocument();
      expect(screen.getByText(/^Chosen by Ines Marlowe on /)).toBeInTheDocument();

      const grid = screen.getByRole('table', { name: 'USD for one unit of each currency, by month' });
      expect(within(grid).getByRole('columnheader', { name: 'USD per CAD' })).toBeInTheDocument();
      expect(within(grid).getByRole('textbox', { name: 'USD per CAD, Oct 2026' })).toHaveValue('0.72');
      const november = within(grid).getByRole('textbox', { name: 'USD per CAD, Nov 2026' });
      expect(november).toHaveValue('');
      expect(november).toHaveAttribute('placeholder', 'No rate');

      const asked = requests.filter((r) => r.path === '/api/exchange-rates').length;
      await user.type(november, '0.7315');
      await user.click(within(grid).getByRole('button', { name: 'Save' }));
      await waitFor(() => expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ rate: 0.7315 }));
      expect(requests.find((r) => r.method === 'PUT')?.path).toBe('/api/exchange-rates/CAD/2026-11');
      await waitFor(() =>
        expect(requests.filter((r) => r.path === '/api/exchange-rates').length).toBeGreaterThan(asked),
      );
    },
    ROUTER_TEST_MS,
  );

  it(
    'lets an administrator choose another reporting currency',
    async () => {
      const { requests, user } = renderAt('admin', '/exchange-rates', {
        'GET /api/exchange-rates': { status: 200, body: rates() },
        'PUT /api/reporting-currency': { status: 200, body: rates({ reportingCurrency: 'CAD', currencies: ['USD'] }) },
      });
      const field = await screen.findByRole('textbox', { name: 'Currency (ISO 4217 code)' });
      expect(screen.getByRole('button', { name: 'Use USD for totals' })).toBeDisabled();
      await user.clear(field);
      await user.type(field, 'cad');
      await user.click(screen.getByRole('button', { name: 'Use CAD for totals' }));
      await waitFor(() => expect(requests.find((r) => r.method === 'PUT')?.body).toEqual({ currency: 'CAD' }));
    },
    ROUTER_TEST_MS,
  );

  it(
    'shows a manager the rates, a missing one marked in words, with nothing to change',
    async () => {
      renderAt('manager', '/exchange-rates', {
        'GET /api/exchange-rates': {
          status: 200,
          body: rates({ reportingCurrencySetByName: null, reportingCurrencySetAt: null }),
        },
      });
      const grid = await screen.findByRole('table', { name: 'USD for one unit of each currency, by month' });
      expect(screen.getByText('Not chosen yet: Kerfline uses the currency most sites keep.')).toBeInTheDocument();
      expect(screen.getByText('Only administrators enter rates.')).toBeInTheDocument();
      expect(within(grid).getByRole('row', { name: /Oct 2026/ })).toHaveTextContent('0.72');
      expect(within(grid).getByRole('row', { name: /Nov 2026/ })).toHaveTextContent('No rate');
      expect(screen.queryByRole('textbox')).not.toBeInTheDocument();
    },
    ROUTER_TEST_MS,
  );
});
