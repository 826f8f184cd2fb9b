import { useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { ROLE_LABELS, type User } from '@kerfline/domain/users/schema';
import { grantable, userSubject, useAppAbility } from '../../../lib/ability';
import { Button, LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { meQuery } from '../../../features/auth/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { parseSiteListQuery, siteListQuery } from '../../../features/sites/api/queries';
import { userDetailQuery } from '../../../features/users/api/queries';
import { useSetUserActive, useUpdateUser } from '../../../features/users/api/mutations';
import { PersonForm, type PersonFormValues } from '../../../features/users/components/person-form';

export function personPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    await Promise.all([
      queryClient.ensureQueryData(userDetailQuery(params.userId ?? '')),
      queryClient.ensureQueryData(siteListQuery()).catch(() => undefined),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
    ]);
    return null;
  };
}

function initialValues(user: User): Partial<PersonFormValues> {
  return {
    name: user.name,
    email: user.email,
    role: user.role,
    siteId: user.siteId ?? '',
    regionId: user.regionId ?? '',
    managerScope: user.allSites ? 'all' : 'chosen',
    managedSiteIds: user.managedSiteIds,
  };
}

function EditPerson({ user, self }: { user: User; self: boolean }) {
  const { data: me } = useSuspenseQuery(meQuery());
  const { data: sites } = useQuery(siteListQuery());
  const { data: allSites } = useQuery(siteListQuery(parseSiteListQuery({ includeRetired: true })));
  const { data: regions } = useQuery(regionListQuery());
  const ability = useAppAbility();
  const update = useUpdateUser(user.id);
  const [saved, setSaved] = useState(false);
  const { roles, siteIdsFor } = grantable(ability, 'User', me.siteIds);
  const allowedSiteIds = new Set(roles.flatMap((role) => siteIdsFor(role)));
  const siteName = (id: string) => allSites?.items.find((site) => site.id === id);
  // Sites in use the editor may give, plus wherever the person is now (even a retired site), so it shows.
  const siteOptions = (sites?.items ?? [])
    .filter((site) => allowedSiteIds.has(site.id) || roles.includes('manager'))
    .map((site) => ({ id: site.id, name: `${site.name} (${site.code})` }));
  for (const id of [user.siteId, ...user.managedSiteIds]) {
    const site = id ? siteName(id) : undefined;
    if (site && !siteOptions.some((o) => o.id === site.id))
      siteOptions.push({ id: site.id, name: `${site.name} (${site.code})${site.retiredAt ? ', retired' : ''}` });
  }
  siteOptions.sort((a, b) => a.name.localeCompare(b.name));
  return (
    <Card aria-labelledby="edit-heading" className="space-y-4 p-5 sm:p-6">
      <h2 id="edit-heading" className="text-lg font-bold text-ink">
        Name and role
      </h2>
      {self ? (
        <Notice tone="info">This is you: change your name here. Another administrator changes your role.</Notice>
      ) : null}
      {saved && update.isSuccess ? <Notice tone="info">Saved.</Notice> : null}
      <PersonForm
        key={`${user.id}-${user.role}-${user.siteId}`}
        mode="edit"
        roles={self ? [user.role] : roles.includes(user.role) ? roles : [user.role, ...roles]}
        sites={siteOptions}
        regions={(regions?.items ?? []).map((region) => ({ id: region.id, name: region.name }))}
        initial={initialValues(user)}
        submitLabel="Save changes"
        onSubmit={async (input) => {
          setSaved(false);
          await update.mutateAsync(input);
          setSaved(true);
        }}
      />
    </Card>
  );
}

function AccountState({ user }: { user: User }) {
  const setActive = useSetUserActive(user.id);
  const [confirming, setConfirming] = useState(false);
  return (
    <Card aria-labelledby="account-heading" className="space-y-3 p-5 sm:p-6">
      <h2 id="account-heading" className="text-lg font-bold text-ink">
        Account
      </h2>
      {setActive.isError ? <Notice>{setActive.error.message}</Notice> : null}
      {user.active ? (
        confirming ? (
          <div className="space-y-3 rounded-sheet border-l-4 border-signal-stop bg-signal-stop-soft px-4 py-3">
            <p className="font-bold text-signal-stop">Deactivate {user.name}?</p>
            <p className="text-sm text-ink">
              They are signed out on every device at once and cannot sign in until someone reactivates them. Everything
              they recorded keeps their name.
            </p>
            <div className="flex flex-wrap gap-2">
              <Button
                variant="danger"
                disabled={setActive.isPending}
                onClick={() => setActive.mutate(false, { onSettled: () => setConfirming(false) })}
              >
                {setActive.isPending ? 'Deactivating…' : 'Yes, deactivate'}
              </Button>
              <Button variant="quiet" onClick={() => setConfirming(false)}>
                Keep the account
              </Button>
            </div>
          </div>
        ) : (
          <>
            <p className="text-sm text-ink-muted">
              Someone who has left, or should not sign in for now, is deactivated rather than removed.
            </p>
            <Button variant="danger" onClick={() => setConfirming(true)}>
              Deactivate…
            </Button>
          </>
        )
      ) : (
        <>
          <p className="text-sm text-ink">
            <span aria-hidden="true" className="mr-1.5 inline-block size-2.5 bg-ink-muted" />
            Deactivated: they cannot sign in. Reactivating lets them sign in with their old password again.
          </p>
          <Button disabled={setActive.isPending} onClick={() => setActive.mutate(true)}>
            {setActive.isPending ? 'Reactivating…' : 'Reactivate'}
          </Button>
        </>
      )}
    </Card>
  );
}

/** One person: their name, role and where it applies, and whether their account is active. */
export function PersonPage() {
  const userId = useParams().userId ?? '';
  const { data: user } = useSuspenseQuery(userDetailQuery(userId));
  const { data: me } = useSuspenseQuery(meQuery());
  const ability = useAppAbility();
  const self = me.user.id === user.id;
  const canChange = ability.can('update', userSubject(user));
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <title>{`${user.name} · Kerfline`}</title>
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link
          to="/people"
          className="inline-flex min-h-11 items-center text-ink-muted underline-offset-4 hover:text-ink hover:underline"
        >
          People
        </Link>
        <span aria-hidden="true" className="px-2 text-ink-muted">
          /
        </span>
        <span aria-current="page" className="text-ink">
          {user.name}
        </span>
      </nav>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">{user.name}</h1>
        <p className="mt-1 text-ink-muted">
          {user.email} · {ROLE_LABELS[user.role]} · {user.active ? 'Active' : 'Deactivated'}
        </p>
      </div>
      {canChange ? (
        <>
          <EditPerson user={user} self={self} />
          {self ? null : <AccountState user={user} />}
        </>
      ) : (
        <Notice tone="info" title="Not yours to change">
          {self ? (
            <>
              Your own password is on <Link to="/account">your account page</Link>; your role is changed by your site
              admin or an administrator.
            </>
          ) : (
            'An administrator changes this person.'
          )}
        </Notice>
      )}
      <LinkButton to="/people" variant="quiet">
        Back to people
      </LinkButton>
    </div>
  );
}
