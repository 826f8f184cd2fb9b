import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { SAW_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
}

describe('the saw page', () => {
  it('links to the check targets, break-in plan and band speed for its band, in the site’s units', async () => {
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite()]) },
      [`GET /api/saws/${SAW_ID}`]: { status: 200, body: makeSaw() },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite({ unitSystem: 'imperial' }) },
    });
    renderApp(`/saws/${SAW_ID}`);
    const links = within(await screen.findByRole('navigation', { name: 'Figures for the band on this saw' }));
    // The fixture saw: 14 in wheels, a 1-1/4 x .042 band, 80–400 ft/min (1 in = 25.4 mm, 1 ft = 0.3048 m).
    const figures = 'thickness=0.042&width=1.25&wheel=14&sawMin=80&sawMax=400';
    expect(links.getByRole('link', { name: 'Check targets for this band' })).toHaveAttribute(
      'href',
      `/calculators/check-targets?units=imperial&sawId=${SAW_ID}&${figures}`,
    );
    expect(links.getByRole('link', { name: 'Break-in plan' })).toHaveAttribute(
      'href',
      `/calculators/break-in?units=imperial&sawId=${SAW_ID}&${figures}`,
    );
    expect(screen.getByText('Gravity or spring')).toBeInTheDocument();
    // The guide opening says whose figure it is: here Kerfline's shipped value (no site settings answered).
    expect(screen.getByRole('region', { name: 'Figures for this saw' })).toHaveTextContent(
      'Band thickness plus 0.001 in; 0.043 in to 0.044 in passes; anything tighter pinches the band. Kerfline’s starting value (no printed source gives one value).',
    );
  });

  it('offers no figures for a retired saw', async () => {
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite()]) },
      [`GET /api/saws/${SAW_ID}`]: {
        status: 200,
        body: makeSaw({ status: 'retired', retiredAt: '2025-06-30T12:00:00.000Z' }),
      },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
    });
    renderApp(`/saws/${SAW_ID}`);
    expect(await screen.findByText(/Retired on/)).toBeInTheDocument();
    expect(screen.queryByRole('navigation', { name: 'Figures for the band on this saw' })).not.toBeInTheDocument();
  });

  it('lets a site admin bring a retired saw back into service; a technician sees no such button', async () => {
    const retired = makeSaw({ status: 'retired', retiredAt: '2025-06-30T12:00:00.000Z' });
    const { requests } = installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('site_admin') },
      'GET /api/sites': { status: 200, body: page([makeSite()]) },
      [`GET /api/saws/${SAW_ID}`]: { status: 200, body: retired },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
      [`POST /api/saws/${SAW_ID}/restore`]: { status: 200, body: makeSaw() },
    });
    renderApp(`/saws/${SAW_ID}`);
    await userEvent.setup().click(await screen.findByRole('button', { name: 'Bring back into service' }));
    expect(await screen.findByText(/is back in service/)).toBeInTheDocument();
    expect(requests.some((r) => r.method === 'POST' && r.path === `/api/saws/${SAW_ID}/restore`)).toBe(true);
  });

  it('shows a technician no way to bring a retired saw back', async () => {
    installFakeApi({
      'GET /api/me': { status: 200, body: makeMe('technician') },
      'GET /api/sites': { status: 200, body: page([makeSite()]) },
      [`GET /api/saws/${SAW_ID}`]: {
        status: 200,
        body: makeSaw({ status: 'retired', retiredAt: '2025-06-30T12:00:00.000Z' }),
      },
      [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
    });
    renderApp(`/saws/${SAW_ID}`);
    expect(await screen.findByText(/Retired on/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Bring back into service' })).not.toBeInTheDocument();
  });
});
