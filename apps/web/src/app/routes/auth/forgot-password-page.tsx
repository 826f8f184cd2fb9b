import { Link } from 'react-router-dom';
import { PasswordResetRequestForm } from '../../../features/auth/components/password-reset-forms';
import { PublicFrame } from './public-frame';

export function ForgotPasswordPage() {
  return (
    <PublicFrame
      title="New password"
      heading="Choose a new password"
      below={
        <Link
          to="/sign-in"
          className="inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
        >
          Back to sign in
        </Link>
      }
    >
      <PasswordResetRequestForm />
    </PublicFrame>
  );
}
