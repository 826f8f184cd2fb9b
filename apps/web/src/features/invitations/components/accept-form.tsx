import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { invitationAcceptSchema, type InvitationPreview } from '@kerfline/domain/invitations/schema';
import { PASSWORD_HINT, ROLE_LABELS } from '@kerfline/domain/users/schema';
import { showServerError } from '../../../lib/form-errors';
import { Button } from '../../../lib/ui/button';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';

const answerSchema = invitationAcceptSchema.omit({ token: true });
export type InvitationAnswer = { name: string; password: string };

/** Where the invitation's role applies, in a phrase. */
export function invitationWhere(preview: InvitationPreview): string {
  if (preview.siteName) return ` at ${preview.siteName}`;
  if (preview.regionName) return ` for the ${preview.regionName} region`;
  return '';
}

/** The invited person's answer: the name to show and a password of their own. */
export function AcceptInvitationForm({
  preview,
  onSubmit,
}: {
  preview: InvitationPreview;
  onSubmit: (answer: InvitationAnswer) => Promise<unknown>;
}) {
  const [shown, setShown] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<InvitationAnswer>({
    resolver: zodResolver(answerSchema),
    defaultValues: { name: preview.name ?? '', password: '' },
  });
  const submit = handleSubmit(async (answer) => {
    try {
      await onSubmit(answer);
    } catch (error) {
      showServerError(
        error,
        setError,
        (path) => (path === 'name' || path === 'password' ? path : undefined),
        'The account was not set up. Try again.',
      );
    }
  });
  return (
    <form method="post" onSubmit={submit} noValidate className="space-y-5">
      <p className="text-ink">
        {preview.invitedByName} invited you as <strong>{ROLE_LABELS[preview.role]}</strong>
        {invitationWhere(preview)}. You will sign in as <strong className="break-all">{preview.email}</strong>.
      </p>
      {errors.root?.server?.message ? <Notice title="Not set up yet">{errors.root.server.message}</Notice> : null}
      <Field label="Your name" hint="As colleagues should see it on records." error={errors.name?.message}>
        {(props) => <input {...props} {...register('name')} autoComplete="name" className={inputClass} />}
      </Field>
      {/* Lets password managers file the new password under the right address. */}
      <input type="hidden" name="username" autoComplete="username" value={preview.email} readOnly />
      <Field label="Choose a password" hint={PASSWORD_HINT} error={errors.password?.message}>
        {(props) => (
          <div className="flex gap-2">
            <input
              {...props}
              {...register('password')}
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
        {isSubmitting ? 'Setting up…' : 'Set up my account'}
      </Button>
    </form>
  );
}
