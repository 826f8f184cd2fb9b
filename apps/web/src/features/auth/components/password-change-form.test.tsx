import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { PASSWORD_HINT, passwordTooGuessable } from '@kerfline/domain/users/schema';
import { PasswordChangeForm } from './password-change-form';

function renderForm() {
  render(
    <QueryClientProvider client={createQueryClient()}>
      <PasswordChangeForm />
    </QueryClientProvider>,
  );
  return userEvent.setup();
}

describe('changing one’s password', () => {
  it('asks for 12 characters before sending anything', async () => {
    const { requests } = installFakeApi({});
    const user = renderForm();
    await user.type(screen.getByLabelText('Current password'), 'old-password-1');
    await user.type(screen.getByLabelText('New password'), 'short');
    await user.click(screen.getByRole('button', { name: 'Change password' }));
    expect(await screen.findByText('must be at least 12 characters')).toBeInTheDocument();
    expect(requests).toHaveLength(0);
  });

  it('puts the server’s answer beside the current password when it is wrong', async () => {
    installFakeApi({
      'POST /api/me/password': {
        status: 400,
        body: {
          error: {
            code: 'VALIDATION_FAILED',
            message: 'The current password is not right',
            details: [{ path: 'currentPassword', message: 'not right' }],
          },
        },
      },
    });
    const user = renderForm();
    await user.type(screen.getByLabelText('Current password'), 'a-wrong-password');
    await user.type(screen.getByLabelText('New password'), 'a-brand-new-password');
    await user.click(screen.getByRole('button', { name: 'Change password' }));
    expect(await screen.findByText('not right')).toBeInTheDocument();
    expect(screen.getByLabelText('Current password')).toHaveAttribute('aria-invalid', 'true');
  });

  it('states the password rule, and puts the server’s strength refusal beside the new password', async () => {
    const weak = passwordTooGuessable('This is similar to a commonly used password.');
    installFakeApi({
      'POST /api/me/password': {
        status: 400,
        body: {
          error: {
            code: 'VALIDATION_FAILED',
            message: 'Choose a harder password',
            details: [{ path: 'newPassword', message: weak }],
          },
        },
      },
    });
    const user = renderForm();
    expect(screen.getByText(PASSWORD_HINT)).toBeInTheDocument();
    await user.type(screen.getByLabelText('Current password'), 'old-password-1');
    await user.type(screen.getByLabelText('New password'), 'password1234');
    await user.click(screen.getByRole('button', { name: 'Change password' }));
    expect(
      await screen.findByText(
        'is too easy to guess (this is similar to a commonly used password); use three or four unrelated words, or a longer mix of words and digits',
      ),
    ).toBeInTheDocument();
    expect(screen.getByLabelText('New password')).toHaveAttribute('aria-invalid', 'true');
  });

  it('sends both passwords, says it worked and empties the fields', async () => {
    const { requests } = installFakeApi({ 'POST /api/me/password': { status: 204 } });
    const user = renderForm();
    await user.type(screen.getByLabelText('Current password'), 'old-password-1');
    await user.type(screen.getByLabelText('New password'), 'a-brand-new-password');
    await user.click(screen.getByRole('button', { name: 'Change password' }));
    expect(await screen.findByRole('status')).toHaveTextContent('Password changed');
    expect(requests[0]?.body).toEqual({ currentPassword: 'old-password-1', newPassword: 'a-brand-new-password' });
    expect(screen.getByLabelText('New password')).toHaveValue('');
  });
});
