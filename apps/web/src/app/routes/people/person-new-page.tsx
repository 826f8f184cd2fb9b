import { Link, useNavigate } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { abilityFromMeRules, canAddWithPassword, useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { meQuery } from '../../../features/auth/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { siteListQuery } from '../../../features/sites/api/queries';
import { useCreateUser } from '../../../features/users/api/mutations';
import { PersonForm } from '../../../features/users/components/person-form';

/** What the people page is told about the person just added; never the password. */
export type AddedPerson = { name: string; email: string };

export function personNewPageLoader(queryClient: QueryClient) {
  return async () => {
    const me = await queryClient.ensureQueryData(meQuery());
    if (!canAddWithPassword(abilityFromMeRules(me.rules))) return null;
    await Promise.all([queryClient.ensureQueryData(siteListQuery()), queryClient.ensureQueryData(regionListQuery())]);
    return null;
  };
}

/** The form, fed plain options from the site and region lists. */
function NewPerson() {
  const { data: sites } = useSuspenseQuery(siteListQuery());
  const { data: regions } = useSuspenseQuery(regionListQuery());
  const create = useCreateUser();
  const navigate = useNavigate();
  const siteOptions = sites.items
    .map((site) => ({ id: site.id, name: `${site.name} (${site.code})` }))
    .sort((a, b) => a.name.localeCompare(b.name));
  const regionOptions = regions.items
    .map((region) => ({ id: region.id, name: region.name }))
    .sort((a, b) => a.name.localeCompare(b.name));

  return (
    <Card className="p-5 sm:p-6">
      <PersonForm
        sites={siteOptions}
        regions={regionOptions}
        submitLabel="Add person"
        cancel={
          <LinkButton to="/people" variant="quiet">
            Cancel
          </LinkButton>
        }
        onSubmit={async (input) => {
          const user = await create.mutateAsync(input);
          const added: AddedPerson = { name: user.name, email: user.email };
          await navigate('/people', { state: { added } });
        }}
      />
    </Card>
  );
}

/**
 * An account with a first password the administrator types: the fallback where Kerfline cannot send mail.
 * Inviting by e-mail is the usual way, so the person chooses their own password and nobody else knows it.
 */
export function PersonNewPage() {
  const ability = useAppAbility();
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>Add a person with a password · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Add a person with a password</h1>
        <p className="mt-1 text-ink-muted">An account to sign in with. What they see follows from their role.</p>
      </div>
      {canAddWithPassword(ability) ? (
        <>
          <Notice tone="caution" title="Invite people by e-mail when you can">
            Here you choose their first password and have to pass it on yourself, so you know it too. Use this only
            where Kerfline cannot send mail.{' '}
            <Link to="/people/invite" className="font-bold underline underline-offset-4">
              Invite someone instead
            </Link>
            .
          </Notice>
          <NewPerson />
        </>
      ) : (
        <Notice tone="info" title="Not for your role">
          Only an administrator can add someone with a password. Invite people by e-mail instead.
        </Notice>
      )}
    </div>
  );
}
