import { useSuspenseQuery } from '@tanstack/react-query';
import { ROLE_LABELS } from '@kerfline/domain/users/schema';
import { meQuery } from '../../../features/auth/api/queries';
import { PasswordChangeForm } from '../../../features/auth/components/password-change-form';
import { Card } from '../../../lib/ui/card';
import { MailPreferences } from '../../../features/mail/components/mail-preferences';

/** The signed-in person's own account: who they are signed in as, and their password. */
export function AccountPage() {
  const { data: me } = useSuspenseQuery(meQuery());
  return (
    <div className="mx-auto max-w-xl space-y-6">
      <title>Your account · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Your account</h1>
        <p className="mt-1 text-ink-muted">
          {me.user.name} · {me.user.email} · {ROLE_LABELS[me.user.role]}
        </p>
      </div>
      <Card aria-label="Password" className="px-5 py-5">
        <h2 className="mb-4 text-lg font-bold text-ink">Change your password</h2>
        <PasswordChangeForm />
      </Card>
      <Card aria-label="Mail" className="px-5 py-5">
        <h2 className="mb-1 text-lg font-bold text-ink">Mail from Kerfline</h2>
        <p className="mb-4 text-sm text-ink-muted">Sent to {me.user.email}.</p>
        <MailPreferences />
      </Card>
    </div>
  );
}
