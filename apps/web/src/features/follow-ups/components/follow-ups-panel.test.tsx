import { describe, expect, it } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router-dom';
import type { FollowUp } from '@kerfline/domain/follow-ups/schema';
import { createQueryClient } from '../../../lib/query-client';
import { StaticAbilityProvider } from '../../../lib/ability';
import { installFakeApi } from '../../../test-support/fake-api';
import { SAW_ID, SITE_ID, abilityFor, page } from '../../../test-support/fixtures';
import { FollowUpsPanel } from './follow-ups-panel';

const FOLLOW_UP_ID = '0d3f6a2b-8c1e-4f5a-9b7d-2e4c6a8b0d13';
const followUp = (overrides: Partial<FollowUp> = {}): FollowUp => ({
  id: FOLLOW_UP_ID,
  siteId: SITE_ID,
  siteName: 'Riverside',
  sawId: SAW_ID,
  sawAssetTag: 'BS-01',
  sawName: 'Bay 1 bar saw',
  title: 'Blade life short: check the pitch',
  flag: null,
  assignee: { id: '5b1c2d3e-4f5a-4b6c-8d7e-9f0a1b2c3d4e', name: 'Dale Pruitt' },
  dueOn: '2099-01-10',
  state: 'open',
  overdue: false,
  createdBy: { id: '6c2d3e4f-5a6b-4c7d-8e9f-0a1b2c3d4e5f', name: 'Tomasz Wren' },
  createdAt: '2026-12-01T08:00:00Z',
  updatedAt: '2026-12-01T08:00:00Z',
  doneAt: null,
  entries: [],
  ...overrides,
});

function renderPanel(role: 'technician' | 'manager', props: Parameters<typeof FollowUpsPanel>[0]) {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <StaticAbilityProvider ability={abilityFor(role)}>
        <MemoryRouter>
          <FollowUpsPanel {...props} />
        </MemoryRouter>
      </StaticAbilityProvider>
    </QueryClientProvider>,
  );
  return userEvent.setup();
}

describe('the follow-ups panel on a saw and on the start screen', () => {
  it('lets the technician start a follow-up and add a note, one tap each', async () => {
    let current = followUp();
    const { requests } = installFakeApi({
      'GET /api/follow-ups': (r) =>
        r.query.get('state') === 'done'
          ? { status: 200, body: { items: [], total: 2, limit: 1, offset: 0 } }
          : { status: 200, body: page([current]) },
      [`PATCH /api/follow-ups/${FOLLOW_UP_ID}`]: (r) => {
        current = followUp({ state: (r.body as { state?: FollowUp['state'] }).state ?? current.state });
        return { status: 200, body: current };
      },
    });
    const user = renderPanel('technician', { sawId: SAW_ID });
    expect(await screen.findByText('Blade life short: check the pitch')).toBeInTheDocument();
    expect(screen.getByText(/For Dale Pruitt · due 2099-01-10 · from Tomasz Wren/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Start' }));
    expect(await screen.findByRole('button', { name: 'Mark done' })).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ state: 'in_progress' });
    await user.click(screen.getByRole('button', { name: 'Add a note' }));
    await user.type(screen.getByRole('textbox', { name: 'Note' }), 'Finer pitch ordered');
    await user.click(screen.getByRole('button', { name: 'Save the note' }));
    expect(requests.filter((r) => r.method === 'PATCH').at(-1)?.body).toEqual({ note: 'Finer pitch ordered' });
    // Done follow-ups stay in the history, a link away.
    expect(screen.getByRole('link', { name: '2 done follow-ups in the history' })).toHaveAttribute(
      'href',
      `/follow-ups?sawId=${SAW_ID}&state=done`,
    );
  });

  it('shows a manager the follow-up without the buttons, and shows nothing when a saw has none', async () => {
    installFakeApi({ 'GET /api/follow-ups': { status: 200, body: page([followUp({ overdue: true })]) } });
    renderPanel('manager', { siteId: SITE_ID });
    expect(await screen.findByText('Overdue')).toBeInTheDocument();
    expect(screen.getByText('BS-01')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Start' })).not.toBeInTheDocument();
  });

  it('hides itself where nothing is open and nothing is done', async () => {
    const { requests } = installFakeApi({ 'GET /api/follow-ups': { status: 200, body: page([]) } });
    renderPanel('technician', { sawId: SAW_ID, hideWhenEmpty: true });
    // Both reads (open and done) answered, and there is nothing to show: not even the heading.
    await waitFor(() => expect(requests.filter((r) => r.path === '/api/follow-ups')).toHaveLength(2));
    await waitFor(() => expect(screen.queryByText('Loading the follow-ups…')).not.toBeInTheDocument());
    expect(screen.queryByRole('heading', { name: 'Follow-ups' })).not.toBeInTheDocument();
  });
});
