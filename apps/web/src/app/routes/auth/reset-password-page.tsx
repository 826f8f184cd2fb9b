import { useState } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { PasswordResetForm } from '../../../features/auth/components/password-reset-forms';
import { LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { PublicFrame, tokenFromHash } from './public-frame';

/** Opened from the reset mail: the link's secret is in the address's fragment. */
export function ResetPasswordPage() {
  const token = tokenFromHash(useLocation().hash);
  const [done, setDone] = useState(false);
  return (
    <PublicFrame
      title="New password"
      heading="Choose a new password"
      below={
        <Link
          to="/forgot-password"
          className="inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
        >
          Ask for a new link
        </Link>
      }
    >
      {done ? (
        <div className="space-y-4">
          <Notice tone="info" title="Password changed">
            You are signed out on every device. Sign in with the new password.
          </Notice>
          <LinkButton to="/sign-in" variant="primary" className="w-full">
            Sign in
          </LinkButton>
        </div>
      ) : token ? (
        <PasswordResetForm token={token} onDone={() => setDone(true)} />
      ) : (
        <Notice title="The link is incomplete">Open the whole link from the e-mail, or ask for a new one.</Notice>
      )}
    </PublicFrame>
  );
}
