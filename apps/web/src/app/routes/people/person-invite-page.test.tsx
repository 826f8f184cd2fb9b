import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import type { Invitation } from '@kerfline/domain/invitations/schema';
import type { User } from '@kerfline/domain/users/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { OTHER_SITE_ID, REGION_ID, SITE_ID, makeMe, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, user: userEvent.setup() };
}

const technician: User = {
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

function invitationFrom(body: Record<string, unknown>, overrides: Partial<Invitation> = {}): Invitation {
  return {
    id: '5e6f7a8b-9c0d-4e1f-8a2b-3c4d5e6f7a8b',
    email: String(body.email),
    name: (body.name as string | null) ?? null,
    role: body.role as Invitation['role'],
    siteId: (body.siteId as string | null) ?? null,
    regionId: null,
    managedSiteIds: [],
    allSites: false,
    state: 'pending',
    expiresAt: '2026-12-09T10:00:00.000Z',
    invitedById: '00000000-0000-4000-8000-000000000004',
    invitedByName: 'Dana Okafor',
    createdAt: '2026-12-02T10:00:00.000Z',
    lastSentAt: '2026-12-02T10:00:00.000Z',
    sentCount: 1,
    acceptedAt: null,
    revokedAt: null,
    ...overrides,
  };
}

/** A site admin's view: two sites exist, only their own (SITE_ID) is theirs to invite to. */
function fakeSiteAdminApi() {
  const invitations: Invitation[] = [];
  const people: User[] = [technician];
  return installFakeApi({
    'GET /api/me': { status: 200, body: makeMe('site_admin') },
    'GET /api/sites': {
      status: 200,
      body: page([makeSite(), makeSite({ id: OTHER_SITE_ID, code: 'MTY', name: 'Marrow Tube Yard' })]),
    },
    'GET /api/regions': { status: 200, body: page([{ id: REGION_ID, name: 'Great Lakes' }]) },
    'GET /api/users': () => ({ status: 200, body: page(people) }),
    'GET /api/users/1c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f': () => ({ status: 200, body: people[0] }),
    'POST /api/users/1c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f/deactivate': () => {
      people[0] = { ...people[0]!, active: false };
      return { status: 200, body: people[0] };
    },
    'GET /api/invitations': () => ({ status: 200, body: page(invitations) }),
    'POST /api/invitations': (request) => {
      const invitation = invitationFrom(request.body as Record<string, unknown>);
      invitations.push(invitation);
      return { status: 201, body: invitation };
    },
    'POST /api/invitations/5e6f7a8b-9c0d-4e1f-8a2b-3c4d5e6f7a8b/resend': () => {
      invitations[0] = { ...invitations[0]!, sentCount: 2 };
      return { status: 200, body: invitations[0] };
    },
  });
}

describe('a site admin invites a technician', () => {
  it('offers only the roles and the site they may give, sends the invitation and lists it', async () => {
    const { requests } = fakeSiteAdminApi();
    const { router, user } = renderApp('/people');

    await user.click(await screen.findByRole('link', { name: 'Invite someone' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Invite someone' })).toBeInTheDocument();
    const roleGroup = screen.getByRole('group', { name: 'Role' });
    expect(
      within(roleGroup)
        .getAllByRole('radio')
        .map((r) => r.closest('label')?.textContent),
    ).toEqual([expect.stringMatching(/^Site admin/), expect.stringMatching(/^Saw technician/)]);
    expect(screen.queryByLabelText('Password')).not.toBeInTheDocument();

    await user.type(screen.getByRole('textbox', { name: /^E-mail/ }), 'Noel.Varga@example.com');
    await user.click(screen.getByRole('radio', { name: /Saw technician/ }));
    const homeSite = screen.getByRole('combobox', { name: 'Home site' });
    // Their own site only, already chosen.
    expect(
      within(homeSite)
        .getAllByRole('option')
        .map((o) => o.textContent),
    ).toEqual(['Choose…', 'Holt Bar Works (HLT)']);
    expect(homeSite).toHaveValue(SITE_ID);
    await user.click(screen.getByRole('button', { name: 'Send invitation' }));

    expect(await screen.findByText('Invitation sent to noel.varga@example.com')).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/people');
    expect(requests.find((r) => r.method === 'POST' && r.path === '/api/invitations')?.body).toEqual({
      email: 'noel.varga@example.com',
      name: null,
      role: 'technician',
      siteId: SITE_ID,
      regionId: null,
      managedSiteIds: [],
      allSites: false,
    });
    const table = await screen.findByRole('table', { name: 'Invitations' });
    expect(within(table).getByText('Waiting for an answer')).toBeInTheDocument();

    await user.click(
      within(table).getByRole('button', { name: 'Send the invitation to noel.varga@example.com again' }),
    );
    expect(await screen.findByText(/sent again to noel.varga@example.com, with a new link/)).toBeInTheDocument();
  });

  it('deactivates a technician of their site only after a second, explicit yes', async () => {
    const { requests } = fakeSiteAdminApi();
    const { user } = renderApp('/people');
    await user.click(await screen.findByRole('link', { name: 'Marta Ilves' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Marta Ilves' })).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Deactivate…' }));
    expect(requests.some((r) => r.path.endsWith('/deactivate'))).toBe(false);
    expect(screen.getByText(/signed out on every device at once/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Yes, deactivate' }));
    expect(await screen.findByRole('button', { name: 'Reactivate' })).toBeInTheDocument();
    expect(requests.filter((r) => r.path.endsWith('/deactivate'))).toHaveLength(1);
  });
});
