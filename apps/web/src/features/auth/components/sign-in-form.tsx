import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { signInSchema, type Me, type SignIn } from '@kerfline/domain/auth/schema';
import { isApiError } from '../../../lib/api-client';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { useSignIn } from '../api/mutations';

/** The server answers a wrong password and an unknown address alike, so the page does too. */
export const WRONG_CREDENTIALS_MESSAGE = 'That e-mail and password do not match an account.';

function messageFor(error: unknown): string {
  if (isApiError(error, 401)) return WRONG_CREDENTIALS_MESSAGE;
  if (error instanceof Error) return error.message;
  return 'Signing in failed. Try again.';
}

export function SignInForm({ onSignedIn }: { onSignedIn: (me: Me) => void }) {
  const signIn = useSignIn();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<SignIn>({ resolver: zodResolver(signInSchema), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit((values) => {
    signIn.mutate(values, { onSuccess: onSignedIn });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5">
      {signIn.isError ? <Notice>{messageFor(signIn.error)}</Notice> : null}
      <Field label="E-mail" error={errors.email?.message}>
        {(props) => (
          <input {...props} {...register('email')} type="email" autoComplete="username" className={inputClass} />
        )}
      </Field>
      <Field label="Password" error={errors.password?.message}>
        {(props) => (
          <input
            {...props}
            {...register('password')}
            type="password"
            autoComplete="current-password"
            className={inputClass}
          />
        )}
      </Field>
      <Button type="submit" variant="primary" className="w-full" disabled={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
