import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
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
    expect(screen.getByRole('link', { name: /Band length/ })).toHaveAttribute(
      'href',
      '/calculators/band-length?units=metric',
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

  it('answers an unknown calculator with a plain not-found page', async () => {
    technicianApi();
    renderApp('/calculators/slide-rule');
    expect(await screen.findByRole('heading', { name: 'No page here' })).toBeInTheDocument();
  });
});
