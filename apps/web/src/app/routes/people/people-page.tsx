import { useLocation, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { ROLES, ROLE_LABELS, type Role } from '@kerfline/domain/users/schema';
import { INVITATION_STATES, INVITATION_STATE_LABELS, type Invitation } from '@kerfline/domain/invitations/schema';
import { canAddWithPassword, grantable, useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { meQuery } from '../../../features/auth/api/queries';
import { parseSiteListQuery, siteListQuery } from '../../../features/sites/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { userListQuery, userListQueryFromSearch } from '../../../features/users/api/queries';
import { UsersTable } from '../../../features/users/components/users-table';
import { invitationListQuery, invitationListQueryFromSearch } from '../../../features/invitations/api/queries';
import { useInvitationAction } from '../../../features/invitations/api/mutations';
import { InvitationsTable } from '../../../features/invitations/components/invitations-table';
import type { AddedPerson } from './person-new-page';

/** The API lists people for these roles only (admins everyone, site admins their own site). */
const PEOPLE_ROLES: Role[] = ['admin', 'site_admin'];

/** Every site, retired ones too: only to name where people work. */
const allSitesQuery = () => siteListQuery(parseSiteListQuery({ includeRetired: true }));

export function peoplePageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQuery());
    if (!PEOPLE_ROLES.includes(me.user.role)) return null;
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(userListQuery(userListQueryFromSearch(search))),
      queryClient.ensureQueryData(invitationListQuery(invitationListQueryFromSearch(search))),
      queryClient.ensureQueryData(allSitesQuery()).catch(() => undefined),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
    ]);
    return null;
  };
}

function useNames() {
  const { data: sites } = useQuery(allSitesQuery());
  const { data: regions } = useQuery(regionListQuery());
  const siteNameOf = (siteId: string) => sites?.items.find((site) => site.id === siteId)?.name;
  const regionNameOf = (regionId: string) => regions?.items.find((region) => region.id === regionId)?.name;
  return { siteNameOf, regionNameOf };
}

function PeopleList() {
  const [search, setSearch] = useSearchParams();
  const q = userListQueryFromSearch(search);
  const { data: users } = useSuspenseQuery(userListQuery(q));
  const { siteNameOf, regionNameOf } = useNames();
  const setFilter = (key: string, value: string) =>
    setSearch((current) => {
      const next = new URLSearchParams(current);
      if (value) next.set(key, value);
      else next.delete(key);
      next.delete('offset');
      return next;
    });

  return (
    <Card aria-label="People">
      <div className="flex flex-wrap gap-4 border-b border-rule px-5 py-3">
        <Field label="Role" className="w-full sm:w-72">
          {(props) => (
            <select
              {...props}
              value={q.role ?? ''}
              onChange={(event) => setFilter('role', event.target.value)}
              className={inputClass}
            >
              <option value="">Every role</option>
              {ROLES.map((role) => (
                <option key={role} value={role}>
                  {ROLE_LABELS[role]}
                </option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Account" className="w-full sm:w-56">
          {(props) => (
            <select
              {...props}
              value={q.state ?? ''}
              onChange={(event) => setFilter('state', event.target.value)}
              className={inputClass}
            >
              <option value="">Active and inactive</option>
              <option value="active">Active only</option>
              <option value="inactive">Inactive only</option>
            </select>
          )}
        </Field>
      </div>
      <UsersTable
        users={users.items}
        siteNameOf={siteNameOf}
        regionNameOf={regionNameOf}
        linkTo={(user) => `/people/${user.id}`}
      />
      <div className="border-t border-rule px-5 py-3">
        <Pager total={users.total} limit={users.limit} offset={users.offset} noun="people" />
      </div>
    </Card>
  );
}

function Invitations() {
  const [search, setSearch] = useSearchParams();
  const q = invitationListQueryFromSearch(search);
  const { data: invitations } = useSuspenseQuery(invitationListQuery(q));
  const { siteNameOf, regionNameOf } = useNames();
  const act = useInvitationAction();
  const whereOf = (invitation: Invitation) => {
    if (invitation.siteId) return siteNameOf(invitation.siteId) ?? 'Another site';
    if (invitation.regionId) return `Region ${regionNameOf(invitation.regionId) ?? ''}`;
    if (invitation.role === 'admin' || invitation.allSites) return 'Every site';
    return invitation.managedSiteIds.map((id) => siteNameOf(id) ?? 'another site').join(', ');
  };
  const done = act.isSuccess
    ? act.variables.action === 'resend'
      ? `Invitation sent again to ${act.data.email}, with a new link. The old link no longer works.`
      : `Invitation to ${act.data.email} withdrawn. Its link no longer works.`
    : undefined;

  return (
    <Card aria-labelledby="invitations-heading">
      <div className="flex flex-wrap items-end justify-between gap-4 border-b border-rule px-5 py-4">
        <div>
          <h2 id="invitations-heading" className="text-lg font-bold text-ink">
            Invitations
          </h2>
          <p className="text-sm text-ink-muted">
            A link by e-mail that works once, for seven days. Sending again makes a new link.
          </p>
        </div>
        <Field label="Show" className="w-full sm:w-64">
          {(props) => (
            <select
              {...props}
              value={q.state ?? ''}
              onChange={(event) =>
                setSearch((current) => {
                  const next = new URLSearchParams(current);
                  next.set('invitations', event.target.value || 'all');
                  next.delete('invitationsOffset');
                  return next;
                })
              }
              className={inputClass}
            >
              {INVITATION_STATES.map((state) => (
                <option key={state} value={state}>
                  {INVITATION_STATE_LABELS[state]}
                </option>
              ))}
              <option value="">Every invitation</option>
            </select>
          )}
        </Field>
      </div>
      {done ? (
        <div className="px-5 pt-4">
          <Notice tone="info">{done}</Notice>
        </div>
      ) : null}
      {act.isError ? (
        <div className="px-5 pt-4">
          <Notice>{act.error.message}</Notice>
        </div>
      ) : null}
      <InvitationsTable
        invitations={invitations.items}
        whereOf={whereOf}
        busyId={act.isPending ? act.variables.id : undefined}
        onAction={(invitation, action) => act.mutate({ id: invitation.id, action })}
      />
      {invitations.total > invitations.limit ? (
        <p className="border-t border-rule px-5 py-3 text-sm text-ink-muted">
          The {invitations.limit} newest of {invitations.total} are shown.
        </p>
      ) : null}
    </Card>
  );
}

type Arrived = { added?: AddedPerson; invited?: { email: string } };

/** What the add or invite form has just done, from the navigation's state (absent on a plain visit). */
function useArrived(): Arrived {
  const state: unknown = useLocation().state;
  if (!state || typeof state !== 'object') return {};
  const { added, invited } = state as { added?: Partial<AddedPerson>; invited?: { email?: unknown } };
  return {
    added:
      typeof added?.name === 'string' && typeof added.email === 'string'
        ? { name: added.name, email: added.email }
        : undefined,
    invited: typeof invited?.email === 'string' ? { email: invited.email } : undefined,
  };
}

/** The people at the user's sites and the invitations sent, for administrators and site admins. */
export function PeoplePage() {
  const { data: me } = useSuspenseQuery(meQuery());
  const ability = useAppAbility();
  const { added, invited } = useArrived();
  const allowed = PEOPLE_ROLES.includes(me.user.role);
  const canInvite = grantable(ability, 'Invitation', me.siteIds).roles.length > 0;
  return (
    <div className="space-y-6">
      <title>People · Kerfline</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight text-ink">People</h1>
          <p className="mt-1 text-ink-muted">
            {me.user.role === 'admin' ? 'Everyone with an account.' : 'Everyone with an account at your site.'}
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          {canAddWithPassword(ability) ? <LinkButton to="/people/new">Add with a password</LinkButton> : null}
          {canInvite ? (
            <LinkButton to="/people/invite" variant="primary">
              Invite someone
            </LinkButton>
          ) : null}
        </div>
      </div>
      {added ? (
        <Notice tone="info" title={`${added.name} added`}>
          They can sign in as {added.email} with the password you chose; pass it on to them yourself.
        </Notice>
      ) : null}
      {invited ? (
        <Notice tone="info" title={`Invitation sent to ${invited.email}`}>
          The link in it works once, for seven days. It is listed below until they accept.
        </Notice>
      ) : null}
      {allowed ? (
        <>
          <PeopleList />
          <Invitations />
        </>
      ) : (
        <Notice tone="info" title="Not for your role">
          The list of people is kept by administrators and site admins.
        </Notice>
      )}
    </div>
  );
}
