import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { passwordChangeSchema, type PasswordChange } from '@kerfline/domain/auth/schema';
import { showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { useChangePassword } from '../api/mutations';
import { PASSWORD_HINT } from '@kerfline/domain/users/schema';

const FIELDS = new Set<keyof PasswordChange>(['currentPassword', 'newPassword']);

/** The signed-in person's own password: the current one first, then a new one of at least 12 characters. */
export function PasswordChangeForm() {
  const change = useChangePassword();
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<PasswordChange>({
    resolver: zodResolver(passwordChangeSchema),
    defaultValues: { currentPassword: '', newPassword: '' },
  });

  const onSubmit = handleSubmit((values) =>
    change.mutateAsync(values).then(
      () => reset(),
      (error: unknown) =>
        showServerError(
          error,
          setError,
          (path) => (FIELDS.has(path as keyof PasswordChange) ? (path as keyof PasswordChange) : undefined),
          'The password was not changed. Try again.',
        ),
    ),
  );

  return (
    <form onSubmit={onSubmit} noValidate method="post" className="space-y-5">
      {errors.root?.server?.message ? <Notice>{errors.root.server.message}</Notice> : null}
      {change.isSuccess ? (
        <p
          role="status"
          className="rounded-sheet border border-signal-safe bg-signal-safe-soft px-3 py-2 text-sm text-ink"
        >
          Password changed. You stay signed in here; anywhere else you were signed in, you will be asked again.
        </p>
      ) : null}
      <Field label="Current password" error={errors.currentPassword?.message}>
        {(props) => (
          <input
            {...props}
            {...register('currentPassword')}
            type="password"
            autoComplete="current-password"
            className={inputClass}
          />
        )}
      </Field>
      <Field label="New password" hint={PASSWORD_HINT} error={errors.newPassword?.message}>
        {(props) => (
          <input
            {...props}
            {...register('newPassword')}
            type="password"
            autoComplete="new-password"
            className={inputClass}
          />
        )}
      </Field>
      <Button type="submit" variant="primary" disabled={change.isPending}>
        {change.isPending ? 'Changing…' : 'Change password'}
      </Button>
    </form>
  );
}
