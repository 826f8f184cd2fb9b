import { Link, useLocation, useNavigate } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { invitationPreviewQuery } from '../../../features/invitations/api/queries';
import { useAcceptInvitation } from '../../../features/invitations/api/mutations';
import { AcceptInvitationForm } from '../../../features/invitations/components/accept-form';
import { useSignIn } from '../../../features/auth/api/mutations';
import { Notice } from '../../../lib/ui/notice';
import { PublicFrame, tokenFromHash } from './public-frame';

function Accept({ token }: { token: string }) {
  const preview = useQuery(invitationPreviewQuery(token));
  const accept = useAcceptInvitation();
  const signIn = useSignIn();
  const navigate = useNavigate();
  if (preview.isPending)
    return (
      <p role="status" className="text-ink-muted">
        Opening the invitation…
      </p>
    );
  if (preview.isError) return <Notice title="This invitation cannot be used">{preview.error.message}</Notice>;
  return (
    <AcceptInvitationForm
      preview={preview.data}
      onSubmit={async ({ name, password }) => {
        const { email } = await accept.mutateAsync({ token, name, password });
        // Straight in with the password just chosen.
        await signIn.mutateAsync({ email, password });
        await navigate('/', { replace: true });
      }}
    />
  );
}

/** Opened from the invitation mail: the link's secret is in the address's fragment. */
export function InvitationPage() {
  const token = tokenFromHash(useLocation().hash);
  return (
    <PublicFrame
      title="Your invitation"
      heading="Set up your Kerfline account"
      below={
        <p>
          Have an account already?{' '}
          <Link
            to="/sign-in"
            className="inline-flex min-h-11 items-center font-semibold text-accent-dark underline underline-offset-4"
          >
            Sign in
          </Link>
        </p>
      }
    >
      {token ? (
        <Accept token={token} />
      ) : (
        <Notice title="The link is incomplete">
          Open the whole link from your invitation e-mail. If it no longer works, ask whoever invited you to send it
          again.
        </Notice>
      )}
    </PublicFrame>
  );
}
