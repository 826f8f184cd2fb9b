import { describe, expect, it } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter } from 'react-router-dom';
import type { Role } from '@kerfline/domain/users/schema';
import type { RemovedRecord } from '@kerfline/domain/removed-records/schema';
import type { Stop } from '@kerfline/domain/stops/schema';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { REGION_ID, SAW_ID, SITE_ID, makeMe, makeSaw, makeSite, page } from '../../../test-support/fixtures';
import { AppProviders } from '../../providers';
import { appRoutes } from '../../router';

const STOP_ID = '9d1e2f3a-4b5c-4d6e-8f7a-0b1c2d3e4f60';
const KEPT_STOP = 'a1b2c3d4-e5f6-4a7b-8c9d-0e1f2a3b4c01';
const KEPT_RUN = 'a1b2c3d4-e5f6-4a7b-8c9d-0e1f2a3b4c02';
const RUN_ID = '8e4c3d5f-6a7b-4c8d-ab9e-0f1a2b3c4d55';

function kept(overrides: Partial<RemovedRecord>): RemovedRecord {
  return {
    id: KEPT_STOP,
    siteId: SITE_ID,
    subject: 'Stop',
    recordId: STOP_ID,
    sawId: SAW_ID,
    sawAssetTag: 'BS-01',
    what: 'Hydraulic',
    occurredAt: '2026-11-20T07:00:00.000Z',
    endedAt: '2026-11-20T08:30:00.000Z',
    photoCount: 0,
    reason: 'Logged on the wrong saw',
    removedById: null,
    removedByName: 'Dana Okafor',
    removedAt: '2026-11-21T09:00:00.000Z',
    ...overrides,
  };
}

function renderAt(path: string, routes: Parameters<typeof installFakeApi>[0], role: Role = 'site_admin') {
  const fake = installFakeApi({
    'GET /api/me': { status: 200, body: makeMe(role) },
    'GET /api/regions': { status: 200, body: page([{ id: REGION_ID, name: 'Great Lakes' }]) },
    [`GET /api/sites/${SITE_ID}`]: { status: 200, body: makeSite() },
    'GET /api/saws': { status: 200, body: page([makeSaw()]) },
    ...routes,
  });
  const queryClient = createQueryClient();
  const router = createMemoryRouter(appRoutes(queryClient), { initialEntries: [path] });
  render(<AppProviders queryClient={queryClient} router={router} />);
  return { ...fake, router, user: userEvent.setup() };
}

describe('the removed entries of a site', () => {
  it('lists what, which saw, when, by whom and why, and puts one back or says what is in the way', async () => {
    let remaining = [
      kept({}),
      kept({
        id: KEPT_RUN,
        subject: 'BladeRun',
        recordId: RUN_ID,
        what: 'Fleet 34 (taken off: broken)',
        photoCount: 2,
      }),
    ];
    const { requests, user } = renderAt(`/sites/${SITE_ID}/removed`, {
      'GET /api/removed-records': () => ({ status: 200, body: page(remaining) }),
      [`POST /api/removed-records/${KEPT_STOP}/restore`]: {
        status: 409,
        body: {
          error: {
            code: 'CONFLICT',
            message:
              'It would overlap stop 11111111-2222-4333-8444-555555555555 (electrical, from …), entered since; change or remove that stop first',
            requestId: 'r1',
          },
        },
      },
      [`POST /api/removed-records/${KEPT_RUN}/restore`]: () => {
        remaining = remaining.filter((r) => r.id !== KEPT_RUN);
        return {
          status: 200,
          body: { subject: 'BladeRun', recordId: RUN_ID, siteId: SITE_ID, sawId: SAW_ID, photoCount: 2 },
        };
      },
    });
    const heading = await screen.findByRole('heading', { name: 'Removed entries' }, { timeout: 5000 });
    expect(heading).toBeInTheDocument();
    const stopItem = screen.getByRole('heading', { name: 'Hydraulic' }).closest('li')!;
    expect(within(stopItem).getByText('Logged on the wrong saw')).toBeInTheDocument();
    expect(within(stopItem).getByRole('link', { name: 'BS-01' })).toHaveAttribute('href', `/saws/${SAW_ID}`);
    expect(within(stopItem).getByText(/by Dana Okafor/)).toBeInTheDocument();
    expect(requests.find((r) => r.path === '/api/removed-records')!.query.get('siteId')).toBe(SITE_ID);

    await user.click(within(stopItem).getByRole('button', { name: /Put back: Stop, Hydraulic/ }));
    const refusal = await within(stopItem).findByRole('alert');
    expect(refusal).toHaveTextContent('It cannot go back yet');
    expect(refusal).toHaveTextContent(/would overlap the stop .*change or remove that stop first/);

    const runItem = screen.getByRole('heading', { name: 'Fleet 34 (taken off: broken)' }).closest('li')!;
    expect(within(runItem).getByText('2 come back with it')).toBeInTheDocument();
    await user.click(within(runItem).getByRole('button', { name: /Put back/ }));
    await waitFor(() => expect(screen.getByText('Put back.')).toBeInTheDocument());
    expect(screen.getByRole('link', { name: 'See it' })).toHaveAttribute('href', `/blade-runs/${RUN_ID}`);
    await waitFor(() => expect(screen.queryByRole('heading', { name: 'Fleet 34 (taken off: broken)' })).toBeNull());
  });

  it('is linked from the site’s records for its admin', async () => {
    renderAt(`/sites/${SITE_ID}/stops`, { 'GET /api/stops': { status: 200, body: page([]) } });
    const nav = await screen.findByRole('navigation', { name: 'The site’s records' }, { timeout: 5000 });
    expect(within(nav).getByRole('link', { name: 'Removed entries' })).toHaveAttribute(
      'href',
      `/sites/${SITE_ID}/removed`,
    );
  });

  it('hides the link from a technician', async () => {
    renderAt(`/sites/${SITE_ID}/stops`, { 'GET /api/stops': { status: 200, body: page([]) } }, 'technician');
    const nav = await screen.findByRole('navigation', { name: 'The site’s records' }, { timeout: 5000 });
    expect(within(nav).queryByRole('link', { name: 'Removed entries' })).toBeNull();
  });
});

describe('removing a stop asks why and says it can be put back', () => {
  const stop: Stop = {
    id: STOP_ID,
    siteId: SITE_ID,
    sawId: SAW_ID,
    sawAssetTag: 'BS-01',
    startedAt: '2026-11-20T07:00:00.000Z',
    endedAt: '2026-11-20T08:30:00.000Z',
    category: 'hydraulic',
    planned: false,
    notes: null,
    durationMin: 90,
    createdById: null,
    createdByName: 'Sam Reyes',
    endedById: null,
    createdAt: '2026-11-20T07:00:00.000Z',
    updatedAt: '2026-11-20T08:30:00.000Z',
  };

  it('needs a reason, sends it with the removal, and goes back to the saw', async () => {
    const { requests, router, user } = renderAt(`/stops/${STOP_ID}`, {
      [`GET /api/stops/${STOP_ID}`]: { status: 200, body: stop },
      'GET /api/audit': { status: 200, body: page([]) },
      [`DELETE /api/stops/${STOP_ID}`]: { status: 204 },
    });
    await user.click(await screen.findByRole('button', { name: 'Remove this stop…' }, { timeout: 5000 }));
    const panel = screen.getByRole('region', { name: 'Remove this stop?' });
    expect(panel).toHaveTextContent(/can put it back from Removed entries/);
    await user.click(within(panel).getByRole('button', { name: 'Remove the stop' }));
    expect(await within(panel).findByText('Say why this record is being removed')).toBeInTheDocument();
    expect(requests.some((r) => r.method === 'DELETE')).toBe(false);

    await user.type(
      within(panel).getByRole('textbox', { name: 'Why is it being removed?' }),
      'Logged on the wrong saw',
    );
    await user.click(within(panel).getByRole('button', { name: 'Remove the stop' }));
    await waitFor(() =>
      expect(requests.find((r) => r.method === 'DELETE')).toMatchObject({
        path: `/api/stops/${STOP_ID}`,
        body: { reason: 'Logged on the wrong saw' },
      }),
    );
    await waitFor(() => expect(router.state.location.pathname).toBe(`/saws/${SAW_ID}`));
  });

  it('offers no removal to a technician', async () => {
    renderAt(`/stops/${STOP_ID}`, { [`GET /api/stops/${STOP_ID}`]: { status: 200, body: stop } }, 'technician');
    expect(await screen.findByRole('heading', { name: /Stopped: hydraulic/ }, { timeout: 5000 })).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Remove this stop…' })).toBeNull();
  });
});
