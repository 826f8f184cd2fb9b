import { useNavigate } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { abilityFromMeRules, grantable, useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { meQuery } from '../../../features/auth/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { siteListQuery } from '../../../features/sites/api/queries';
import { useCreateInvitation } from '../../../features/invitations/api/mutations';
import { PersonForm } from '../../../features/users/components/person-form';

export function personInvitePageLoader(queryClient: QueryClient) {
  return async () => {
    const me = await queryClient.ensureQueryData(meQuery());
    if (grantable(abilityFromMeRules(me.rules), 'Invitation', me.siteIds).roles.length === 0) return null;
    await Promise.all([
      queryClient.ensureQueryData(siteListQuery()),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
    ]);
    return null;
  };
}

function InviteForm({ siteIds }: { siteIds: string[] }) {
  const { data: sites } = useSuspenseQuery(siteListQuery());
  const { data: regions } = useSuspenseQuery(regionListQuery());
  const ability = useAppAbility();
  const { roles, siteIdsFor } = grantable(ability, 'Invitation', siteIds);
  // The sites offered: those where the inviter may give at least one role (their own site, for a site admin).
  const allowedSiteIds = new Set(roles.flatMap((role) => siteIdsFor(role)));
  const manager = roles.includes('manager');
  const siteOptions = sites.items
    .filter((site) => allowedSiteIds.has(site.id) || manager)
    .map((site) => ({ id: site.id, name: `${site.name} (${site.code})` }))
    .sort((a, b) => a.name.localeCompare(b.name));
  const create = useCreateInvitation();
  const navigate = useNavigate();
  return (
    <Card className="p-5 sm:p-6">
      <PersonForm
        mode="invite"
        roles={roles}
        sites={siteOptions}
        regions={regions.items.map((region) => ({ id: region.id, name: region.name }))}
        submitLabel="Send invitation"
        cancel={
          <LinkButton to="/people" variant="quiet">
            Cancel
          </LinkButton>
        }
        onSubmit={async (input) => {
          const invitation = await create.mutateAsync(input);
          await navigate('/people', { state: { invited: { email: invitation.email } } });
        }}
      />
    </Card>
  );
}

/** Invite someone by e-mail: they get a link to choose their own name and password. */
export function PersonInvitePage() {
  const { data: me } = useSuspenseQuery(meQuery());
  const ability = useAppAbility();
  const allowed = grantable(ability, 'Invitation', me.siteIds).roles.length > 0;
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>Invite someone · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Invite someone</h1>
        <p className="mt-1 text-ink-muted">
          Kerfline mails them a link that works once, for seven days. They choose their own password; what they see
          follows from the role you give them.
          {me.user.role === 'site_admin' ? ' You can invite technicians and site admins of your own site.' : ''}
        </p>
      </div>
      {allowed ? (
        <InviteForm siteIds={me.siteIds} />
      ) : (
        <Notice tone="info" title="Not for your role">
          Administrators and site admins invite people.
        </Notice>
      )}
    </div>
  );
}
