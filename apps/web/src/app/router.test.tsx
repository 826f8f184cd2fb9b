import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../lib/query-client';
import { installFakeApi, type FakeRequest } from '../test-support/fake-api';
import { REGION_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../test-support/fixtures';
import { AppProviders } from './providers';
import { appRoutes } from './router';

const unauthenticated = { status: 401, body: { error: { code: 'UNAUTHENTICATED', message: 'Sign in first.' } } };

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, user: userEvent.setup() };
}

const signedInRoutes = (role: 'site_admin' | 'technician') => ({
  'GET /api/me': { status: 200, body: makeMe(role) },
  'GET /api/sites': { status: 200, body: page([makeSite()]) },
  'GET /api/regions': { status: 200, body: page([{ id: REGION_ID, name: 'Great Lakes' }]) },
  [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
  'GET /api/saws': { status: 200, body: page([makeSaw()]) },
  'GET /api/site-summaries': {
    status: 200,
    body: {
      asOf: '2026-03-04T12:00:00.000Z',
      items: [
        {
          siteId: SITE_ID,
          sawsInUse: 2,
          sawsDown: 1,
          downSince: '2026-03-04T08:00:00.000Z',
          bladesOn: 2,
          stock: {
            specs: 3,
            toReorder: 1,
            fewestDaysLeft: 6.4,
            fewestDaysSpecId: SITE_ID,
            fewestDaysSpecName: '1.25 in bi-metal 4/6',
            windowDays: 90,
          },
        },
      ],
    },
  },
});

describe('the web app', () => {
  it('opens a technician’s day on their site’s work: saws down first, then the running saws with their blades', async () => {
    installFakeApi({
      ...signedInRoutes('technician'),
      'GET /api/saws': {
        status: 200,
        body: page([
          makeSaw(),
          makeSaw({
            id: 'aa8a1b2c-7d3f-4e9a-b6c5-0f1d2e3a4b56',
            assetTag: 'HS-09',
            status: 'down',
            down: {
              stopId: 'bb8a1b2c-7d3f-4e9a-b6c5-0f1d2e3a4b57',
              category: 'hydraulic',
              planned: false,
              since: '2026-03-04T08:00:00.000Z',
            },
          }),
        ]),
      },
    });
    const { router } = renderApp('/');
    expect(await screen.findByRole('heading', { level: 1, name: 'Today' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/today');
    const down = screen.getByRole('region', { name: 'Down now' });
    expect(within(down).getByText('Down: hydraulic')).toBeInTheDocument();
    // A down saw's first action is to end its stop, one tap away; a running one's is to put a blade on.
    expect(within(down).getByRole('link', { name: 'End the stop' })).toHaveAttribute(
      'href',
      '/saws/aa8a1b2c-7d3f-4e9a-b6c5-0f1d2e3a4b56/stop-end',
    );
    const running = screen.getByRole('region', { name: 'Running, with the blade on each' });
    expect(within(running).getByRole('link', { name: 'Put a blade on' })).toBeInTheDocument();
  });

  it('opens straight on the site of a site admin', async () => {
    installFakeApi(signedInRoutes('site_admin'));
    const { router } = renderApp('/');
    expect(await screen.findByRole('heading', { level: 1, name: 'Holt Bar Works' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(`/sites/${SITE_ID}`);
  });

  it('opens on the list of sites for someone who sees several', async () => {
    installFakeApi({ ...signedInRoutes('site_admin'), 'GET /api/me': { status: 200, body: makeMe('admin') } });
    const { router } = renderApp('/');
    await waitFor(() => expect(router.state.location.pathname).toBe('/sites'));
  });

  it('sends a visitor without a session to sign in, remembering the page they wanted', async () => {
    installFakeApi({
      'GET /api/me': unauthenticated,
      'GET /api/sites': unauthenticated,
      'GET /api/saws': unauthenticated,
    });
    const { router } = renderApp(`/sites/${SITE_ID}?status=down`);
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(new URLSearchParams(router.state.location.search).get('next')).toBe(`/sites/${SITE_ID}?status=down`);
  });

  it('says plainly when the e-mail and password do not match, and keeps the button off while waiting', async () => {
    let release: () => void = () => {};
    installFakeApi({
      'GET /api/me': unauthenticated,
      'POST /api/auth/sign-in': () =>
        new Promise((resolve) => {
          release = () =>
            resolve({ status: 401, body: { error: { code: 'UNAUTHENTICATED', message: 'Wrong e-mail or password' } } });
        }),
    });
    const { user } = renderApp('/sign-in');
    await user.type(await screen.findByLabelText('E-mail'), 'dana.okafor@example.com');
    await user.type(screen.getByLabelText('Password'), 'not the password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('button', { name: 'Signing in…' })).toBeDisabled();
    release();
    expect(await screen.findByRole('alert')).toHaveTextContent('That e-mail and password do not match an account.');
    expect(screen.getByRole('button', { name: 'Sign in' })).toBeEnabled();
  });

  it('signs in and goes to the page that was asked for', async () => {
    let signedIn = false;
    const routes = signedInRoutes('site_admin');
    installFakeApi({
      ...routes,
      'GET /api/me': () => (signedIn ? routes['GET /api/me'] : unauthenticated),
      'POST /api/auth/sign-in': (request: FakeRequest) => {
        signedIn = true;
        expect(request.body).toEqual({ email: 'dana.okafor@example.com', password: 'correct horse battery' });
        return routes['GET /api/me'];
      },
    });
    const { user, router } = renderApp(`/sign-in?next=${encodeURIComponent(`/sites/${SITE_ID}`)}`);
    await user.type(await screen.findByLabelText('E-mail'), 'Dana.Okafor@example.com ');
    await user.type(screen.getByLabelText('Password'), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Holt Bar Works' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(`/sites/${SITE_ID}`);
    expect(screen.getByRole('link', { name: 'Add saw' })).toBeInTheDocument();
  });

  it('shows People in the navigation to a site admin but not to a technician', async () => {
    installFakeApi(signedInRoutes('site_admin'));
    renderApp('/sites');
    const nav = await screen.findByRole('navigation', { name: 'Main' });
    expect(within(nav).getByRole('link', { name: 'People' })).toBeInTheDocument();
    expect(within(nav).getByRole('link', { name: 'Sites' })).toHaveAttribute('aria-current', 'page');
  });

  it('keeps People out of a technician’s navigation, and lists their site with its figures', async () => {
    installFakeApi(signedInRoutes('technician'));
    renderApp('/sites');
    const tile = await screen.findByRole('link', { name: /Holt Bar Works/ });
    expect(tile).toHaveTextContent('Great Lakes');
    // What people act on, not the time zone: saws down now, the stock that runs out first.
    await waitFor(() => expect(tile).toHaveTextContent('Saws down now, of 2'));
    expect(tile).toHaveTextContent('6 days');
    expect(tile).toHaveTextContent('1.25 in bi-metal 4/6 runs out first · 1 spec to reorder');
    expect(tile).not.toHaveTextContent('America/Chicago');
    const nav = screen.getByRole('navigation', { name: 'Main' });
    expect(within(nav).queryByRole('link', { name: 'People' })).not.toBeInTheDocument();
    expect(within(nav).getByRole('link', { name: 'Shop calculators' })).toHaveAttribute('href', '/calculators');
  });

  it('signs out and returns to the sign-in page', async () => {
    const { requests } = installFakeApi({
      ...signedInRoutes('technician'),
      'POST /api/auth/sign-out': { status: 204 },
    });
    const { user, router } = renderApp('/sites');
    await screen.findByRole('link', { name: /Holt Bar Works/ });
    await user.click(screen.getByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(requests.some((r) => r.method === 'POST' && r.path === '/api/auth/sign-out')).toBe(true);
  });

  it('shows a plain message and a way back when a page fails to load', async () => {
    installFakeApi({
      ...signedInRoutes('technician'),
      [`GET /api/saws/${makeSaw().id}`]: {
        status: 404,
        body: { error: { code: 'NOT_FOUND', message: 'No such saw' } },
      },
    });
    renderApp(`/saws/${makeSaw().id}`);
    expect(await screen.findByRole('heading', { name: 'Not found' })).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Back to sites' })).toHaveAttribute('href', '/sites');
  });
});
