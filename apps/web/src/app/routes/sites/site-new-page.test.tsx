import { describe, expect, it } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import type { Role } from '@kerfline/domain/users/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, type FakeRequest } from '../../../test-support/fake-api';
import { REGION_ID, makeMe, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

const NEW_SITE_ID = '5e1f7a3c-2b4d-4c6e-8f10-a2b3c4d5e6f7';
const NEW_REGION_ID = '9d8c7b6a-5f4e-4d3c-8b2a-1f0e9d8c7b6a';

function renderApp(path: string) {
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  const { unmount } = render(<AppProviders queryClient={queryClient} router={router} />);
  return { router, unmount, user: userEvent.setup() };
}

/** The API as a user of `role` sees it, with one region and one site, plus any routes a test adds. */
function fakeApiFor(role: Role, extra: Parameters<typeof installFakeApi>[0] = {}) {
  return installFakeApi({
    'GET /api/me': { status: 200, body: makeMe(role) },
    'GET /api/sites': { status: 200, body: page([makeSite()]) },
    'GET /api/regions': { status: 200, body: page([{ id: REGION_ID, name: 'Great Lakes' }]) },
    'GET /api/saws': { status: 200, body: page([]) },
    ...extra,
  });
}

const combobox = (name: string) => screen.getByRole('combobox', { name });
const textbox = (name: RegExp) => screen.getByRole('textbox', { name });

describe('adding a site', () => {
  // The whole app through its router, lazy pages and all: more than 5 s on a busy machine under coverage.
  it('sends the schema-shaped site from the sites page and opens the new site', async () => {
    const added = makeSite({
      id: NEW_SITE_ID,
      code: 'RBT-2',
      name: 'Riverside Bar Depot',
      city: 'Hamilton',
      timeZone: 'America/Toronto',
      currency: 'CAD',
      unitSystem: 'metric',
      activeSawCount: 0,
    });
    const { requests } = fakeApiFor('admin', {
      'POST /api/sites': { status: 201, body: added },
      [`GET /api/sites/${NEW_SITE_ID}`]: { status: 200, body: added },
    });
    const { router, user } = renderApp('/sites');

    await user.click(await screen.findByRole('link', { name: 'Add site' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Add a site' })).toBeInTheDocument();
    // The only region is chosen already.
    expect(combobox('Region')).toHaveValue(REGION_ID);
    await user.type(textbox(/^Name/), 'Riverside Bar Depot');
    // Typed in small letters, sent in capitals as the schema wants.
    await user.type(textbox(/^Code/), 'rbt-2');
    await user.type(textbox(/^City/), 'Hamilton');
    await user.selectOptions(combobox('Time zone'), 'America/Toronto');
    await user.selectOptions(combobox('Currency'), 'CAD');
    await user.click(screen.getByRole('radio', { name: /Metric/ }));
    await user.click(screen.getByRole('button', { name: 'Add site' }));

    expect(await screen.findByRole('heading', { level: 1, name: 'Riverside Bar Depot' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(`/sites/${NEW_SITE_ID}`);
    const posts = requests.filter((r) => r.method === 'POST' && r.path === '/api/sites');
    expect(posts).toHaveLength(1);
    expect(posts[0]?.body).toEqual({
      name: 'Riverside Bar Depot',
      code: 'RBT-2',
      city: 'Hamilton',
      regionId: REGION_ID,
      timeZone: 'America/Toronto',
      currency: 'CAD',
      unitSystem: 'metric',
    });
    // Many fields typed one key at a time: on a loaded machine this takes longer than vitest's 5 s default.
  }, 20_000);

  it('says which code is taken when the server answers 409, and stays on the form', async () => {
    fakeApiFor('admin', {
      'POST /api/sites': {
        status: 409,
        body: {
          error: {
            code: 'CONFLICT',
            message: 'Another site already uses that code',
            details: [{ path: 'code', message: 'already taken' }],
          },
        },
      },
    });
    const { router, user } = renderApp('/sites/new');
    await user.type(await screen.findByRole('textbox', { name: /^Name/ }), 'Holt Annex');
    await user.type(textbox(/^Code/), 'HLT');
    await user.selectOptions(combobox('Time zone'), 'America/Chicago');
    await user.selectOptions(combobox('Currency'), 'USD');
    await user.click(screen.getByRole('radio', { name: /Imperial/ }));
    await user.click(screen.getByRole('button', { name: 'Add site' }));

    expect(await screen.findByRole('alert')).toHaveTextContent('Another site already uses that code');
    expect(textbox(/^Code/)).toHaveAccessibleDescription(/already taken/);
    expect(textbox(/^Code/)).toHaveAttribute('aria-invalid', 'true');
    expect(router.state.location.pathname).toBe('/sites/new');
    expect(screen.getByRole('button', { name: 'Add site' })).toBeEnabled();
  });

  it('adds a missing region beside the form and chooses it there', async () => {
    const regions = [{ id: REGION_ID, name: 'Great Lakes' }];
    const { requests } = fakeApiFor('admin', {
      'GET /api/regions': () => ({ status: 200, body: page(regions) }),
      'POST /api/regions': (request: FakeRequest) => {
        const region = { id: NEW_REGION_ID, name: (request.body as { name: string }).name };
        regions.push(region);
        return { status: 201, body: region };
      },
    });
    const { user } = renderApp('/sites/new');
    await user.type(await screen.findByRole('textbox', { name: 'Region name' }), '  Gulf Coast ');
    await user.click(screen.getByRole('button', { name: 'Add region' }));

    await waitFor(() => expect(combobox('Region')).toHaveValue(NEW_REGION_ID));
    expect(screen.getByRole('option', { name: 'Gulf Coast' })).toBeInTheDocument();
    expect(screen.getByRole('status')).toHaveTextContent('Region Gulf Coast added and chosen in the form above.');
    // The schema trims the name before it is sent.
    expect(requests.find((r) => r.method === 'POST' && r.path === '/api/regions')?.body).toEqual({
      name: 'Gulf Coast',
    });
  });

  it.each(['site_admin', 'manager'] as const)(
    'offers no "Add site" to a %s, and no form at /sites/new',
    async (role) => {
      const { requests } = fakeApiFor(role);
      const list = renderApp('/sites');
      expect(await screen.findByRole('link', { name: /Holt Bar Works/ })).toBeInTheDocument();
      expect(screen.queryByRole('link', { name: 'Add site' })).not.toBeInTheDocument();
      list.unmount();

      renderApp('/sites/new');
      expect(await screen.findByText('Only an administrator can add sites.')).toBeInTheDocument();
      expect(screen.queryByRole('button', { name: 'Add site' })).not.toBeInTheDocument();
      expect(requests.some((r) => r.method === 'POST')).toBe(false);
    },
  );
});
