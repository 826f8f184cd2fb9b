import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { safeNextPath } from '../../root-loader';
import { PublicFrame } from './public-frame';

export function SignInPage() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = safeNextPath(params.get('next'));

  return (
    <PublicFrame
      title="Sign in"
      heading="Sign in"
      below={
        <p>
          Forgotten your password?{' '}
          <Link
            to="/forgot-password"
            className="inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
          >
            Get a link to choose a new one
          </Link>
        </p>
      }
    >
      <SignInForm onSignedIn={() => void navigate(next, { replace: true })} />
    </PublicFrame>
  );
}
