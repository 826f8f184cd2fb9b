import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import type { AuditEntry } from '@kerfline/domain/audit/schema';
import type { Role } from '@kerfline/domain/users/schema';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import { shippedSettings, type SiteSetting } from '@kerfline/domain/settings/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { SITE_ID, makeMe, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

// Carbide-tipped tension has no printed range: the site's to set, shipped at the bi-metal 25,000–30,000 psi.
const KEY = 'band_tension.carbide_tipped';
const SETTINGS = `/api/sites/${SITE_ID}/settings`;
/** 1 psi = 6,894.757 Pa (NIST SP 811 (2008), B.8). */
const MPA_PER_PSI = 6894.757293168361 / 1e6;

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, user: userEvent.setup() };
}

/**
 * The API as a user of `role` at the imperial test site sees it. Settings changed or put back are kept and
 * written into the history, as the server does.
 */
function fakeApiFor(role: Role) {
  let items: SiteSetting[] = shippedSettings();
  const history: AuditEntry[] = [];
  const me = makeMe(role, 'Dana Okafor');
  const record = (key: string, before: SiteSetting, after: SiteSetting) =>
    history.unshift({
      id: `0000000${history.length}-0000-4000-8000-000000000000`,
      at: '2026-12-02T15:00:00.000Z',
      actorId: me.user.id,
      actorName: 'Dana Okafor',
      siteId: SITE_ID,
      entity: 'SiteSetting',
      entityId: key,
      action: 'update',
      before: { ...before.value, source: before.source },
      after: { ...after.value, source: after.source },
    });
  const keyOf = (request: FakeRequest) => decodeURIComponent(request.path.split('/').pop()!);
  return installFakeApi({
    'GET /api/me': { status: 200, body: me },
    'GET /api/sites': { status: 200, body: page([makeSite({ unitSystem: 'imperial' })]) },
    [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite({ unitSystem: 'imperial' }) },
    [`GET ${SETTINGS}`]: () => ({ status: 200, body: { siteId: SITE_ID, items } }),
    [`PUT ${SETTINGS}/${KEY}`]: (request) => {
      const before = items.find((s) => s.key === keyOf(request))!;
      const after: SiteSetting = {
        ...before,
        value: (request.body as { value: Record<string, number> }).value,
        source: 'site',
        changedById: me.user.id,
        changedByName: 'Dana Okafor',
        changedAt: '2026-12-02T15:00:00.000Z',
      };
      items = items.map((s) => (s.key === after.key ? after : s));
      record(after.key, before, after);
      return { status: 200, body: after };
    },
    [`DELETE ${SETTINGS}/${KEY}`]: (request) => {
      const before = items.find((s) => s.key === keyOf(request))!;
      const after: SiteSetting = shippedSettings().find((s) => s.key === before.key)!;
      items = items.map((s) => (s.key === after.key ? after : s));
      record(after.key, before, after);
      return { status: 200, body: after };
    },
    'GET /api/saws': { status: 200, body: page([]) },
    'GET /api/regions': { status: 200, body: page([]) },
    'GET /api/audit': () => ({ status: 200, body: { ...page(history), limit: 20 } }),
  });
}

const tensionCard = () => screen.getByRole('article', { name: settingDefinition(KEY)!.label }) as HTMLElement;

describe('the site settings page', () => {
  it('lets a site admin change a tension range in psi, says whose it is now, and puts Kerfline’s back', async () => {
    const { requests } = fakeApiFor('site_admin');
    const { user } = renderApp(`/sites/${SITE_ID}/settings`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Site settings' })).toBeInTheDocument();
    const card = within(tensionCard());
    // Shipped at 25,000–30,000 psi; an imperial site reads psi first.
    expect(card.getByText('25,000 psi (172.4 MPa)')).toBeInTheDocument();
    expect(tensionCard()).toHaveTextContent('Source: Kerfline’s starting value (no printed source gives one value).');

    await user.click(card.getByRole('button', { name: /^Change Band tension, carbide-tipped/ }));
    const lowest = card.getByRole('textbox', { name: /Lowest/ });
    expect(lowest).toHaveAccessibleName(/^Lowest\s?\(psi\)$/);
    expect(lowest).toHaveValue('25000');
    await user.clear(lowest);
    await user.type(lowest, '26000');
    await user.click(card.getByRole('button', { name: 'Save for this site' }));

    await waitFor(() => expect(tensionCard()).toHaveTextContent('26,000 psi'));
    const put = requests.find((r) => r.method === 'PUT')!;
    const sent = (put.body as { value: Record<string, number> }).value;
    // 26,000 psi = 179.26 MPa; the untouched highest keeps its stored number exactly.
    expect(sent.minMPa).toBeCloseTo(26000 * MPA_PER_PSI, 9);
    expect(sent.maxMPa).toBe(settingDefinition(KEY)!.defaults.maxMPa);
    // 15:00 UTC is 10:00 in Chicago, the fixture site's zone: still 2 December.
    expect(tensionCard()).toHaveTextContent('Source: Your site’s setting, changed by Dana Okafor on Dec 2, 2026.');
    expect(tensionCard()).toHaveTextContent('Kerfline’s value: Lowest 25,000');

    const history = within(screen.getByRole('region', { name: 'Changes to these settings' }));
    expect(await history.findByText(/Lowest: 25,000 psi/)).toHaveTextContent(
      'Lowest: 25,000 psi → changed to 26,000 psi',
    );
    expect(history.getByText('From Kerfline’s value to the site’s own.')).toBeInTheDocument();

    await user.click(card.getByRole('button', { name: /^Put back Kerfline’s value of Band tension, carbide-tipped/ }));
    await waitFor(() => expect(tensionCard()).toHaveTextContent('Source: Kerfline’s starting value'));
    expect(requests.some((r) => r.method === 'DELETE' && r.path === `${SETTINGS}/${KEY}`)).toBe(true);
    expect(await history.findByText('Put back to Kerfline’s value.')).toBeInTheDocument();
  });

  it('says in the site’s units what is wrong with a value, and sends nothing', async () => {
    const { requests } = fakeApiFor('site_admin');
    const { user } = renderApp(`/sites/${SITE_ID}/settings`);
    await screen.findByRole('heading', { level: 1, name: 'Site settings' });
    const card = within(tensionCard());
    await user.click(card.getByRole('button', { name: /^Change Band tension, carbide-tipped/ }));
    const highest = card.getByRole('textbox', { name: /Highest/ });
    await user.clear(highest);
    await user.type(highest, '20000');
    await user.click(card.getByRole('button', { name: 'Save for this site' }));
    expect(await card.findByText('The highest tension must not be below the lowest')).toBeInTheDocument();
    await user.clear(highest);
    await user.type(highest, '200');
    await user.click(card.getByRole('button', { name: 'Save for this site' }));
    expect(await card.findByText('Highest must be from 1,451 to 145,037 psi')).toBeInTheDocument();
    expect(requests.some((r) => r.method === 'PUT')).toBe(false);
  });

  it('shows a technician the values and where they come from, with nothing to change and no history', async () => {
    const { requests } = fakeApiFor('technician');
    renderApp(`/sites/${SITE_ID}/settings`);
    await screen.findByRole('heading', { level: 1, name: 'Site settings' });
    expect(tensionCard()).toHaveTextContent('25,000 psi');
    expect(screen.queryByRole('button', { name: /^Change/ })).not.toBeInTheDocument();
    expect(screen.queryByRole('region', { name: 'Changes to these settings' })).not.toBeInTheDocument();
    expect(requests.some((r) => r.path === '/api/audit')).toBe(false);
  });

  it('is reached from the site page', async () => {
    fakeApiFor('technician');
    const { user, router } = renderApp(`/sites/${SITE_ID}`);
    await user.click(await screen.findByRole('link', { name: 'Site settings' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/sites/${SITE_ID}/settings`));
    expect(await screen.findByRole('heading', { level: 1, name: 'Site settings' })).toBeInTheDocument();
  });
});
