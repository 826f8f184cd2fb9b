import { INVITATION_STATE_LABELS, type Invitation, type InvitationState } from '@kerfline/domain/invitations/schema';
import { ROLE_LABELS } from '@kerfline/domain/users/schema';
import { Button } from '../../../lib/ui/button';

/** A state's mark, so it never rests on colour alone: circle waiting, check accepted, triangle expired, bar withdrawn. */
const STATE_MARKS: Record<InvitationState, string> = {
  pending: '○',
  accepted: '✓',
  expired: '△',
  revoked: '—',
};

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium' });

/**
 * Invitations with their state and, for those still open, "Send again" (a new link and a new term) and
 * "Withdraw". Scrolls sideways in its card on a phone.
 */
export function InvitationsTable({
  invitations,
  whereOf,
  onAction,
  busyId,
}: {
  invitations: Invitation[];
  /** Where the invitation's role applies, in words (a site's name, a region…). */
  whereOf: (invitation: Invitation) => string;
  onAction?: (invitation: Invitation, action: 'resend' | 'revoke') => void;
  busyId?: string | undefined;
}) {
  if (invitations.length === 0)
    return <p className="px-5 py-8 text-center text-ink-muted">No invitations in this state.</p>;
  return (
    <div>
      <table className="w-full border-collapse text-left text-sm max-md:block">
        <caption className="sr-only">Invitations</caption>
        <thead className="max-md:hidden">
          <tr className="border-b border-rule text-ink-muted">
            <th scope="col" className="py-3 pr-3 pl-5 font-semibold">
              E-mail
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Role
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Works at
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              State
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Last sent
            </th>
            <th scope="col" className="py-3 pr-5 pl-3 font-semibold">
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody className="max-md:block">
          {invitations.map((invitation) => {
            const open = invitation.state === 'pending' || invitation.state === 'expired';
            return (
              <tr
                key={invitation.id}
                className="border-b border-rule last:border-b-0 max-md:block max-md:px-4 max-md:py-3"
              >
                <th
                  scope="row"
                  className="py-3 pr-3 pl-5 font-semibold break-all text-ink md:whitespace-nowrap max-md:block max-md:p-0"
                >
                  {invitation.email}
                  {invitation.name ? <span className="block font-normal text-ink-muted">{invitation.name}</span> : null}
                </th>
                <td
                  data-label="Role"
                  className="px-3 py-3 text-ink max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
                >
                  {ROLE_LABELS[invitation.role]}
                </td>
                <td
                  data-label="Works at"
                  className="px-3 py-3 text-ink max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
                >
                  {whereOf(invitation)}
                </td>
                <td
                  data-label="State"
                  className="px-3 py-3 text-ink md:whitespace-nowrap max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
                >
                  <div>
                    <span aria-hidden="true" className="mr-1.5 inline-block w-3 font-bold">
                      {STATE_MARKS[invitation.state]}
                    </span>
                    {INVITATION_STATE_LABELS[invitation.state]}
                    {invitation.state === 'pending' ? (
                      <span className="block text-ink-muted">
                        until {dateFormat.format(new Date(invitation.expiresAt))}
                      </span>
                    ) : null}
                  </div>
                </td>
                <td
                  data-label="Last sent"
                  className="tabular px-3 py-3 text-ink md:whitespace-nowrap max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
                >
                  <div>
                    {dateFormat.format(new Date(invitation.lastSentAt))}
                    <span className="block text-ink-muted">by {invitation.invitedByName}</span>
                  </div>
                </td>
                <td className="py-3 pr-5 pl-3 max-md:block max-md:px-0 max-md:pt-2">
                  {open && onAction ? (
                    <div className="flex gap-2 md:justify-end">
                      <Button
                        disabled={busyId === invitation.id}
                        onClick={() => onAction(invitation, 'resend')}
                        aria-label={`Send the invitation to ${invitation.email} again`}
                      >
                        Send again
                      </Button>
                      <Button
                        variant="quiet"
                        disabled={busyId === invitation.id}
                        onClick={() => onAction(invitation, 'revoke')}
                        aria-label={`Withdraw the invitation to ${invitation.email}`}
                      >
                        Withdraw
                      </Button>
                    </div>
                  ) : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
