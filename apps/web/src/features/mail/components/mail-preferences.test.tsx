import { describe, expect, it } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { MailPreferences } from './mail-preferences';

const digest = {
  kind: 'weekly_digest',
  label: 'Weekly region digest',
  description: 'Monday morning: the sites and saws of your region.',
  enabled: true,
};

function renderPreferences() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <MailPreferences />
    </QueryClientProvider>,
  );
  return userEvent.setup();
}

describe('a person’s choice of mail', () => {
  it('turns the digest off at once and keeps it off when the server agrees', async () => {
    const { requests } = installFakeApi({
      'GET /api/me/mail-preferences': { status: 200, body: [digest] },
      'PATCH /api/me/mail-preferences': { status: 200, body: [{ ...digest, enabled: false }] },
    });
    const user = renderPreferences();
    const box = await screen.findByRole('checkbox', { name: /Weekly region digest: on/ });
    await user.click(box);
    expect(box).not.toBeChecked();
    expect(await screen.findByText('Weekly region digest: off')).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ kind: 'weekly_digest', enabled: false });
  });

  it('moves the switch back and says why when the server refuses', async () => {
    installFakeApi({
      'GET /api/me/mail-preferences': { status: 200, body: [digest] },
      'PATCH /api/me/mail-preferences': {
        status: 400,
        body: { error: { code: 'VALIDATION_FAILED', message: 'Weekly region digest mail is not sent to your role' } },
      },
    });
    const user = renderPreferences();
    await user.click(await screen.findByRole('checkbox', { name: /Weekly region digest/ }));
    expect(await screen.findByRole('alert')).toHaveTextContent('not sent to your role');
    await waitFor(() => expect(screen.getByRole('checkbox', { name: /Weekly region digest/ })).toBeChecked());
  });

  it('says when a role gets no regular mail', async () => {
    installFakeApi({ 'GET /api/me/mail-preferences': { status: 200, body: [] } });
    renderPreferences();
    expect(await screen.findByText(/Your role gets no regular mail/)).toBeInTheDocument();
  });
});
