import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { makeMe, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

const TOKEN = 'AbCdEfGhIjKlMnOpQrStUvWxYz0123456789_-abcde';
const SENT = 'If an account uses that address, a link to choose a new password is on its way.';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, user: userEvent.setup() };
}

describe('a forgotten password', () => {
  it('is reached from the sign-in page, and the request answers in the server’s words', async () => {
    const { requests } = installFakeApi({
      'POST /api/auth/password-reset/request': { status: 202, body: { message: SENT } },
    });
    const { user } = renderApp('/sign-in');
    expect(screen.queryByText(/Ask your site admin/)).not.toBeInTheDocument();
    await user.click(await screen.findByRole('link', { name: 'Get a link to choose a new one' }));
    await screen.findByRole('heading', { level: 1, name: 'Choose a new password' });
    await user.type(screen.getByLabelText('E-mail'), 'Dale.Pruitt@Corvane.example');
    await user.click(screen.getByRole('button', { name: 'Send the link' }));
    expect(await screen.findByText(SENT)).toBeInTheDocument();
    expect(requests[0]?.body).toEqual({ email: 'dale.pruitt@corvane.example' });
  });

  it('takes the secret from the link’s fragment and sets the new password', async () => {
    const { requests } = installFakeApi({ 'POST /api/auth/password-reset': { status: 204 } });
    const { user } = renderApp(`/reset-password#token=${TOKEN}`);
    await user.type(await screen.findByLabelText('New password'), 'three words of mine');
    await user.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByText('Password changed')).toBeInTheDocument();
    expect(screen.getByText(/signed out on every device/)).toBeInTheDocument();
    expect(requests[0]?.body).toEqual({ token: TOKEN, newPassword: 'three words of mine' });
  });

  it('shows why a used link is refused, and says so when the link is cut short', async () => {
    installFakeApi({
      'POST /api/auth/password-reset': {
        status: 409,
        body: { error: { code: 'CONFLICT', message: 'This reset link was already used. Ask for a new link.' } },
      },
    });
    const { user } = renderApp(`/reset-password#token=${TOKEN}`);
    await user.type(await screen.findByLabelText('New password'), 'three words of mine');
    await user.click(screen.getByRole('button', { name: 'Save the new password' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('This reset link was already used. Ask for a new link.');
  });

  it('says a link without its secret is incomplete', async () => {
    installFakeApi({});
    renderApp('/reset-password');
    expect(await screen.findByText('The link is incomplete')).toBeInTheDocument();
  });
});

describe('accepting an invitation', () => {
  it('shows who invited whom as what, sets name and password, and signs straight in', async () => {
    const me = makeMe('technician', 'Noel Varga');
    const { requests } = installFakeApi({
      'POST /api/invitations/preview': {
        status: 200,
        body: {
          email: 'noel.varga@example.com',
          name: 'Noel V',
          role: 'technician',
          siteName: 'Holt Bar Works',
          regionName: null,
          invitedByName: 'Ines Carvalho',
          expiresAt: '2026-12-09T10:00:00.000Z',
        },
      },
      'POST /api/invitations/accept': { status: 201, body: { email: 'noel.varga@example.com' } },
      'POST /api/auth/sign-in': { status: 200, body: me },
      'GET /api/me': { status: 200, body: me },
      'GET /api/sites/3c9d7e2a-51b4-4f0a-8e6c-2d1b9a7f4e10': { status: 200, body: makeSite() },
      'GET /api/saws': { status: 200, body: page([]) },
      'GET /api/regions': { status: 200, body: page([]) },
    });
    const { router, user } = renderApp(`/invitation#token=${TOKEN}`);
    expect(await screen.findByText(/Ines Carvalho invited you as/)).toHaveTextContent(
      'Ines Carvalho invited you as Saw technician at Holt Bar Works. You will sign in as noel.varga@example.com.',
    );
    const name = screen.getByRole('textbox', { name: /Your name/ });
    expect(name).toHaveValue('Noel V');
    await user.clear(name);
    await user.type(name, 'Noel Varga');
    await user.type(screen.getByLabelText('Choose a password'), 'first-shift-band-2026');
    await user.click(screen.getByRole('button', { name: 'Set up my account' }));
    // A new technician starts from the day's work at their site.
    await screen.findByRole('heading', { level: 1, name: 'Today' });
    expect(router.state.location.pathname).toBe('/today');
    expect(requests.find((r) => r.path === '/api/invitations/accept')?.body).toEqual({
      token: TOKEN,
      name: 'Noel Varga',
      password: 'first-shift-band-2026',
    });
    expect(requests.find((r) => r.path === '/api/auth/sign-in')?.body).toEqual({
      email: 'noel.varga@example.com',
      password: 'first-shift-band-2026',
    });
  });

  it('says in the server’s words why an expired invitation cannot be used', async () => {
    installFakeApi({
      'POST /api/invitations/preview': {
        status: 409,
        body: {
          error: {
            code: 'CONFLICT',
            message: 'This invitation link expired on 2026-11-30. Ask Ines to send it again.',
          },
        },
      },
    });
    renderApp(`/invitation#token=${TOKEN}`);
    expect(await screen.findByRole('alert')).toHaveTextContent('expired on 2026-11-30. Ask Ines to send it again.');
    expect(screen.queryByRole('button', { name: 'Set up my account' })).not.toBeInTheDocument();
  });
});
