import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { SAW_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
import { makeRun } from '../../../test-support/records';
import { shippedSettings } from '@kerfline/domain/settings/schema';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, user: userEvent.setup() };
}

/** A technician at an imperial site with one saw (the fixtures' invented scenario). */
function technicianApi() {
  return installFakeApi({
    'GET /api/me': { status: 200, body: makeMe('technician') },
    'GET /api/sites': { status: 200, body: page([makeSite({ unitSystem: 'imperial' })]) },
    'GET /api/saws': { status: 200, body: page([makeSaw()]) },
  });
}

describe('the shop calculators', () => {
  it('opens in the units of the user’s site, and keeps the units chosen in every link', async () => {
    technicianApi();
    const { router, user } = renderApp('/calculators');
    expect(await screen.findByRole('heading', { level: 1, name: 'Shop calculators' })).toBeInTheDocument();
    expect(screen.getByRole('radio', { name: /Imperial/ })).toBeChecked();
    const tiles = screen.getAllByRole('link', {
      name: /Teeth in the work|Band length|Band speed|Cut area|Break-in|Check targets/,
    });
    expect(tiles).toHaveLength(6);
    expect(screen.getByRole('link', { name: /Band length/ })).toHaveAttribute(
      'href',
      '/calculators/band-length?units=imperial',
    );

    await user.click(screen.getByRole('radio', { name: /Metric/ }));
    await waitFor(() => expect(router.state.location.search).toBe('?units=metric'));
    // The tiles redraw for the new address once the route's data is in.
    await waitFor(() =>
      expect(screen.getByRole('link', { name: /Band length/ })).toHaveAttribute(
        'href',
        '/calculators/band-length?units=metric',
      ),
    );

    await user.click(screen.getByRole('link', { name: /Band length/ }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Band length' })).toBeInTheDocument();
    expect(screen.getByRole('textbox', { name: /Drive wheel diameter/ })).toHaveAccessibleName(/\(mm\)$/);
    const switcher = screen.getByRole('navigation', { name: 'Calculators' });
    expect(within(switcher).getByRole('link', { name: 'Band length' })).toHaveAttribute('aria-current', 'page');
    expect(within(switcher).getByRole('link', { name: 'Check targets' })).toHaveAttribute(
      'href',
      '/calculators/check-targets?units=metric',
    );
  });

  it('offers the user’s saws on the check targets, composed from the saw list', async () => {
    const { requests } = technicianApi();
    const { user } = renderApp('/calculators/check-targets?units=imperial');
    const picker = await screen.findByRole('combobox', { name: 'Fill in from a saw' });
    expect(requests.some((request) => request.path === '/api/saws')).toBe(true);
    await user.selectOptions(picker, 'HS-07 · Bar line saw');
    // The fixture saw's band is 1.0668 mm thick (0.042 in) and 31.75 mm wide (1.25 in).
    expect(screen.getByRole('textbox', { name: /Band thickness/ })).toHaveValue('0.042');
    expect(screen.getByRole('textbox', { name: /Band width/ })).toHaveValue('1.25');
  });

  it('works without the saw list when it cannot be loaded', async () => {
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite({ unitSystem: 'metric' })]) },
      'GET /api/saws': { status: 403, body: { error: { code: 'FORBIDDEN', message: 'Not for your role' } } },
    });
    renderApp('/calculators/band-speed');
    expect(await screen.findByRole('heading', { level: 1, name: 'Band speed for a material' })).toBeInTheDocument();
    expect(screen.queryByRole('combobox', { name: 'Fill in from a saw' })).not.toBeInTheDocument();
    expect(screen.getByRole('radio', { name: /Metric/ })).toBeChecked();
  });

  it('opens the check targets for a saw in its site’s units, with the site’s own settings and their source', async () => {
    const settings = shippedSettings().map((setting) =>
      setting.key === 'band_tension.bimetal'
        ? {
            ...setting,
            // 25,000–28,000 psi, kept by the site (1 psi = 6,894.757 Pa, NIST SP 811 B.8).
            value: { minMPa: 172.369, maxMPa: 193.053 },
            source: 'site' as const,
            changedById: null,
            changedByName: 'Ines Carvalho',
            changedAt: '2026-11-30T15:00:00.000Z',
          }
        : setting,
    );
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite({ unitSystem: 'imperial' })]) },
      'GET /api/saws': { status: 200, body: page([makeSaw()]) },
      [`GET /api/saws/${SAW_ID}`]: { status: 200, body: makeSaw() },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite({ unitSystem: 'imperial' }) },
      [`GET /api/sites/${SITE_ID}/settings`]: { status: 200, body: { siteId: SITE_ID, items: settings } },
    });
    renderApp(`/calculators/check-targets?sawId=${SAW_ID}`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Check targets' })).toBeInTheDocument();
    // No units in the address: the saw's site works in inches. Its band fills the fields.
    expect(screen.getByRole('radio', { name: /Imperial/ })).toBeChecked();
    expect(screen.getByRole('textbox', { name: /Band thickness/ })).toHaveValue('0.042');
    expect(screen.getByRole('combobox', { name: 'Fill in from a saw' })).toHaveDisplayValue('HS-07 · Bar line saw');
    expect(screen.getByText(/^For/)).toHaveTextContent(
      'For HS-07 · Bar line saw, with the settings of Holt Bar Works.',
    );
    const tension = screen.getByRole('article', { name: 'Band tension' });
    expect(tension).toHaveTextContent('Passes25,000–28,000 psi');
    expect(tension).toHaveTextContent('Source: Your site’s setting, changed by Ines Carvalho on Nov 30, 2026.');
    // The fixture saw's head feeds by gravity against a spring: the spring-balance check is there.
    expect(screen.getByRole('article', { name: 'Head down-force' })).toHaveTextContent(
      'Source: Kerfline’s starting value (no printed source gives one value).',
    );
    // The answer comes before the full cautions; a one-line caution opens the page.
    const result = screen.getByRole('heading', { name: 'Targets' });
    const cautions = screen.getByRole('region', { name: /Caution: work on the saw safely/ });
    expect(result.compareDocumentPosition(cautions) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
    expect(screen.getByRole('link', { name: 'All the cautions' })).toHaveAttribute('href', '#safety-cautions');
  });

  it('leaves out the spring-balance check for a saw whose head feeds hydraulically', async () => {
    const hydraulic = makeSaw({ headFeed: 'hydraulic' });
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite({ unitSystem: 'metric' })]) },
      'GET /api/saws': { status: 200, body: page([hydraulic]) },
      [`GET /api/saws/${SAW_ID}`]: { status: 200, body: hydraulic },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite({ unitSystem: 'metric' }) },
      [`GET /api/sites/${SITE_ID}/settings`]: { status: 200, body: { siteId: SITE_ID, items: shippedSettings() } },
    });
    renderApp(`/calculators/check-targets?units=metric&sawId=${SAW_ID}&thickness=1.07`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Check targets' })).toBeInTheDocument();
    // The address's figure wins over the saw's record.
    expect(screen.getByRole('textbox', { name: /Band thickness/ })).toHaveValue('1.07');
    expect(screen.queryByRole('article', { name: 'Head down-force' })).not.toBeInTheDocument();
    expect(screen.getByText(/This saw feeds its head hydraulically/)).toHaveTextContent(
      /^No head down-force check: This saw feeds its head hydraulically/,
    );
    // Another calculator keeps the saw.
    expect(
      within(screen.getByRole('navigation', { name: 'Calculators' })).getByRole('link', { name: 'Break-in' }),
    ).toHaveAttribute('href', expect.stringContaining(`sawId=${SAW_ID}`));
  });

  it('answers an unknown calculator with a plain not-found page', async () => {
    technicianApi();
    renderApp('/calculators/slide-rule');
    expect(await screen.findByRole('heading', { name: 'No page here' })).toBeInTheDocument();
  });

  it('opens the break-in plan from a saw with its speeds and the material its blade is cutting', async () => {
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite({ unitSystem: 'imperial' })]) },
      [`GET /api/saws/${SAW_ID}`]: { status: 200, body: makeSaw() },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite({ unitSystem: 'imperial' }) },
      [`GET /api/sites/${SITE_ID}/settings`]: { status: 200, body: { siteId: SITE_ID, items: shippedSettings() } },
      'GET /api/blade-runs': (request) => ({
        status: 200,
        body: page(
          request.query.get('sawId') === SAW_ID && request.query.get('open') === 'true'
            ? [makeRun({ sawId: SAW_ID, materialGroup: 'stainless_steel', removedAt: null })]
            : [],
        ),
      }),
    });
    renderApp(`/calculators/break-in?units=imperial&sawId=${SAW_ID}&sawMin=80&sawMax=400`);
    const material = await screen.findByRole('combobox', { name: /Material to cut first/ });
    expect(material).toHaveValue('stainless_steel');
    expect(screen.getByRole('textbox', { name: /Lowest band speed of the saw/ })).toHaveValue('80');
    // Shipped stainless 20–40 m/min = 66–131 ft/min at full band speed during break-in; the saw runs 80–131.
    expect(screen.getByRole('region', { name: 'Result' })).toHaveTextContent(
      'Band speed in stainless steel during break-in: 66–131 ft/min; this saw runs 80–131 ft/min of it.',
    );
  });
});
