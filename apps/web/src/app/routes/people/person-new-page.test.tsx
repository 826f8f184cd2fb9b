import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import type { Role, User } from '@kerfline/domain/users/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { OTHER_SITE_ID, REGION_ID, SITE_ID, makeMe, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

const NEW_USER_ID = '8b7a6c5d-4e3f-4a2b-9c1d-0e9f8a7b6c5d';
const PASSWORD = 'kerf-and-feed-2026';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  const { unmount } = render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, queryClient, unmount, user: userEvent.setup() };
}

const someone: User = {
  id: '1c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f',
  email: 'marta.ilves@example.com',
  name: 'Marta Ilves',
  role: 'technician',
  siteId: SITE_ID,
  regionId: null,
  managedSiteIds: [],
  allSites: false,
  active: true,
};

/**
 * The API as a user of `role` sees it: two sites, one region, one person on file. A person posted is kept
 * and listed afterwards, as the server would.
 */
function fakeApiFor(role: Role, answerPost?: (request: FakeRequest) => { status: number; body: unknown }) {
  const people: User[] = [someone];
  return installFakeApi({
    'GET /api/me': { status: 200, body: makeMe(role) },
    'GET /api/sites': {
      status: 200,
      body: page([makeSite(), makeSite({ id: OTHER_SITE_ID, code: 'MTY', name: 'Marrow Tube Yard' })]),
    },
    'GET /api/regions': { status: 200, body: page([{ id: REGION_ID, name: 'Great Lakes' }]) },
    'GET /api/users': () => ({ status: 200, body: page(people) }),
    'GET /api/invitations': { status: 200, body: page([]) },
    'POST /api/users':
      answerPost ??
      ((request) => {
        const input = request.body as Omit<User, 'id' | 'active'> & { password: string };
        const user: User = {
          id: NEW_USER_ID,
          email: input.email,
          name: input.name,
          role: input.role,
          siteId: input.siteId,
          regionId: input.regionId,
          managedSiteIds: input.managedSiteIds,
          allSites: input.allSites,
          active: true,
        };
        people.push(user);
        return { status: 201, body: user };
      }),
  });
}

describe('adding a person', () => {
  it('adds a technician at a site from the people page and lists them there', async () => {
    const { requests } = fakeApiFor('admin');
    const { router, queryClient, user } = renderApp('/people');

    await user.click(await screen.findByRole('link', { name: 'Add with a password' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Add a person with a password' })).toBeInTheDocument();
    // The fallback says plainly that inviting is the better way.
    expect(screen.getByRole('note')).toHaveTextContent(/Invite people by e-mail when you can/);
    expect(screen.getByRole('link', { name: 'Invite someone instead' })).toHaveAttribute('href', '/people/invite');
    await user.type(screen.getByRole('textbox', { name: /^Name/ }), 'Rosa Lindqvist');
    await user.type(screen.getByRole('textbox', { name: /^E-mail/ }), 'rosa.lindqvist@example.com');
    await user.click(screen.getByRole('radio', { name: /Saw technician/ }));
    // The route feeds the form its sites, labelled with their codes.
    await user.selectOptions(screen.getByRole('combobox', { name: 'Home site' }), 'Marrow Tube Yard (MTY)');
    await user.type(screen.getByLabelText('Password'), PASSWORD);
    await user.click(screen.getByRole('button', { name: 'Add person' }));

    const table = await screen.findByRole('table', { name: 'People' });
    const row = await within(table).findByRole('rowheader', { name: 'Rosa Lindqvist' });
    expect(within(row.closest('tr')!).getByText('Marrow Tube Yard')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/people');
    expect(screen.getByRole('status')).toHaveTextContent('Rosa Lindqvist added');

    const posts = requests.filter((r) => r.method === 'POST' && r.path === '/api/users');
    expect(posts).toHaveLength(1);
    expect(posts[0]?.body).toEqual({
      name: 'Rosa Lindqvist',
      email: 'rosa.lindqvist@example.com',
      role: 'technician',
      password: PASSWORD,
      siteId: OTHER_SITE_ID,
      regionId: null,
      managedSiteIds: [],
      allSites: false,
    });

    // The password went to the server once and is kept nowhere the app can read it back.
    expect(`${router.state.location.search}${JSON.stringify(router.state.location.state)}`).not.toContain(PASSWORD);
    expect(
      JSON.stringify(
        queryClient
          .getQueryCache()
          .getAll()
          .map((query) => query.state.data),
      ),
    ).not.toContain(PASSWORD);
    await waitFor(() =>
      expect(
        JSON.stringify(
          queryClient
            .getMutationCache()
            .getAll()
            .map((mutation) => mutation.state.variables),
        ),
      ).not.toContain(PASSWORD),
    );
  });

  it('sends a manager with the sites ticked', async () => {
    const { requests } = fakeApiFor('admin');
    const { user } = renderApp('/people/new');
    await user.type(await screen.findByRole('textbox', { name: /^Name/ }), 'Ilse Brandt');
    await user.type(screen.getByRole('textbox', { name: /^E-mail/ }), 'ilse.brandt@example.com');
    await user.click(screen.getByRole('radio', { name: /Operations manager/ }));
    expect(screen.queryByRole('combobox', { name: 'Home site' })).not.toBeInTheDocument();
    await user.click(screen.getByRole('checkbox', { name: /Holt Bar Works/ }));
    await user.click(screen.getByRole('checkbox', { name: /Marrow Tube Yard/ }));
    await user.type(screen.getByLabelText('Password'), PASSWORD);
    await user.click(screen.getByRole('button', { name: 'Add person' }));

    await screen.findByRole('rowheader', { name: 'Ilse Brandt' });
    expect(requests.find((r) => r.method === 'POST' && r.path === '/api/users')?.body).toMatchObject({
      role: 'manager',
      siteId: null,
      regionId: null,
      managedSiteIds: [SITE_ID, OTHER_SITE_ID],
      allSites: false,
    });
  });

  it('keeps the form open with the message when the e-mail is taken', async () => {
    fakeApiFor('admin', () => ({
      status: 409,
      body: {
        error: {
          code: 'CONFLICT',
          message: 'Someone already uses that e-mail address',
          details: [{ path: 'email', message: 'already taken' }],
        },
      },
    }));
    const { router, user } = renderApp('/people/new');
    await user.type(await screen.findByRole('textbox', { name: /^Name/ }), 'Marta Ilves');
    await user.type(screen.getByRole('textbox', { name: /^E-mail/ }), someone.email);
    await user.click(screen.getByRole('radio', { name: /Administrator/ }));
    await user.type(screen.getByLabelText('Password'), PASSWORD);
    await user.click(screen.getByRole('button', { name: 'Add person' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('Someone already uses that e-mail address');
    expect(screen.getByRole('textbox', { name: /^E-mail/ })).toHaveAccessibleDescription(/already taken/);
    expect(router.state.location.pathname).toBe('/people/new');
  });

  it('offers a site admin "Invite someone" but not adding with a password, and the people of their site', async () => {
    fakeApiFor('site_admin');
    renderApp('/people');
    expect(await screen.findByRole('rowheader', { name: 'Marta Ilves' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Add with a password' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Invite someone' })).toHaveAttribute('href', '/people/invite');
  });

  it.each(['site_admin', 'manager'] as const)('shows a %s a note, not the form, at /people/new', async (role) => {
    const { requests } = fakeApiFor(role);
    const people = renderApp('/people');
    expect(await screen.findByRole('heading', { level: 1, name: 'People' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Add with a password' })).not.toBeInTheDocument();
    people.unmount();

    renderApp('/people/new');
    expect(
      await screen.findByText(
        'Only an administrator can add someone with a password. Invite people by e-mail instead.',
      ),
    ).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Add person' })).not.toBeInTheDocument();
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
  });
});
