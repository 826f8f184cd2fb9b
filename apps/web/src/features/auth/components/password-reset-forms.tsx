import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  passwordResetRequestSchema,
  passwordResetSchema,
  type PasswordResetRequest,
} from '@kerfline/domain/auth/schema';
import { showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { useRequestPasswordReset, useResetPassword } from '../api/mutations';
import { PASSWORD_HINT } from '@kerfline/domain/users/schema';

/** Asks for a reset link. The answer reads the same whether or not the address has an account. */
export function PasswordResetRequestForm() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<PasswordResetRequest>({
    resolver: zodResolver(passwordResetRequestSchema),
    defaultValues: { email: '' },
  });
  if (request.isSuccess)
    return (
      <Notice tone="info" title="Check your mail">
        {request.data.message}
      </Notice>
    );
  return (
    <form onSubmit={handleSubmit((values) => request.mutate(values))} noValidate className="space-y-5">
      {request.isError ? <Notice>{request.error.message}</Notice> : null}
      <p className="text-sm text-ink-muted">
        Type the address you sign in with. We mail a link that works for an hour.
      </p>
      <Field label="E-mail" error={errors.email?.message}>
        {(props) => (
          <input {...props} {...register('email')} type="email" autoComplete="username" className={inputClass} />
        )}
      </Field>
      <Button type="submit" variant="primary" className="w-full" disabled={request.isPending}>
        {request.isPending ? 'Sending…' : 'Send the link'}
      </Button>
    </form>
  );
}

const newPasswordSchema = passwordResetSchema.pick({ newPassword: true });
type NewPassword = { newPassword: string };

/** Chooses a new password with the link's secret; on success every session of the person has ended. */
export function PasswordResetForm({ token, onDone }: { token: string; onDone: () => void }) {
  const reset = useResetPassword();
  const [shown, setShown] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<NewPassword>({ resolver: zodResolver(newPasswordSchema), defaultValues: { newPassword: '' } });
  const submit = handleSubmit(async ({ newPassword }) => {
    try {
      await reset.mutateAsync({ token, newPassword });
      onDone();
    } catch (error) {
      showServerError(
        error,
        setError,
        (path) => (path === 'newPassword' ? 'newPassword' : undefined),
        'The password was not changed. Try again.',
      );
    }
  });
  return (
    <form method="post" onSubmit={submit} noValidate className="space-y-5">
      {errors.root?.server?.message ? (
        <Notice title="The password was not changed">{errors.root.server.message}</Notice>
      ) : null}
      <Field label="New password" hint={PASSWORD_HINT} error={errors.newPassword?.message}>
        {(props) => (
          <div className="flex gap-2">
            <input
              {...props}
              {...register('newPassword')}
              type={shown ? 'text' : 'password'}
              autoComplete="new-password"
              autoCapitalize="off"
              spellCheck={false}
              className={inputClass}
            />
            <Button
              aria-controls={props.id}
              aria-label={shown ? 'Hide password' : 'Show password'}
              onClick={() => setShown((s) => !s)}
            >
              {shown ? 'Hide' : 'Show'}
            </Button>
          </div>
        )}
      </Field>
      <Button type="submit" variant="primary" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? 'Saving…' : 'Save the new password'}
      </Button>
    </form>
  );
}
