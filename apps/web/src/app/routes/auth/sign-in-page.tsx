import { useNavigate, useSearchParams } from 'react-router-dom';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { KerflineMark } from '../../shell/kerfline-mark';
import { safeNextPath } from '../../root-loader';

export function SignInPage() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const next = safeNextPath(params.get('next'));

  return (
    <main className="flex min-h-screen items-start justify-center px-4 py-12 sm:items-center">
      <title>Sign in · Kerfline</title>
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-3">
          <KerflineMark className="size-10" />
          <div>
            <p className="text-2xl font-extrabold tracking-tight text-ink">Kerfline</p>
            <p className="text-sm text-ink-muted">Band saw records for every plant</p>
          </div>
        </div>
        <section aria-labelledby="sign-in-heading" className="rounded-sheet border border-rule bg-card p-6">
          <h1 id="sign-in-heading" className="mb-5 text-xl font-bold text-ink">
            Sign in
          </h1>
          <SignInForm onSignedIn={() => void navigate(next, { replace: true })} />
        </section>
        <p className="mt-4 text-sm text-ink-muted">Forgotten your password? Ask your site admin to set a new one.</p>
      </div>
    </main>
  );
}
