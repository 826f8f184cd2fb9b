import { useLocation, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { ROLES, ROLE_LABELS, type Role } from '@kerfline/domain/users/schema';
import { newUserSubject, useAppAbility } from '../../../lib/ability';
import { LinkButton } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { meQuery } from '../../../features/auth/api/queries';
import { siteListQuery } from '../../../features/sites/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { userListQuery, userListQueryFromSearch } from '../../../features/users/api/queries';
import { UsersTable } from '../../../features/users/components/users-table';
import type { AddedPerson } from './person-new-page';

/** The API lists people for these roles only (admins everyone, site admins their own site). */
const PEOPLE_ROLES: Role[] = ['admin', 'site_admin'];

export function peoplePageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQuery());
    if (!PEOPLE_ROLES.includes(me.user.role)) return null;
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(userListQuery(userListQueryFromSearch(search))),
      queryClient.ensureQueryData(siteListQuery()).catch(() => undefined),
      queryClient.ensureQueryData(regionListQuery()).catch(() => undefined),
    ]);
    return null;
  };
}

function PeopleList() {
  const [search, setSearch] = useSearchParams();
  const q = userListQueryFromSearch(search);
  const { data: users } = useSuspenseQuery(userListQuery(q));
  const { data: sites } = useQuery(siteListQuery());
  const { data: regions } = useQuery(regionListQuery());
  const siteNameOf = (siteId: string) => sites?.items.find((site) => site.id === siteId)?.name;
  const regionNameOf = (regionId: string) => regions?.items.find((region) => region.id === regionId)?.name;

  return (
    <Card aria-label="People">
      <div className="border-b border-rule px-5 py-3">
        <Field label="Role" className="w-full sm:w-72">
          {(props) => (
            <select
              {...props}
              value={q.role ?? ''}
              onChange={(event) => setSearch(event.target.value ? { role: event.target.value } : {})}
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
      </div>
      <UsersTable users={users.items} siteNameOf={siteNameOf} regionNameOf={regionNameOf} />
      <div className="border-t border-rule px-5 py-3">
        <Pager total={users.total} limit={users.limit} offset={users.offset} noun="people" />
      </div>
    </Card>
  );
}

/** The person the add form has just saved, from the navigation's state (absent on a plain visit). */
function useAddedPerson(): AddedPerson | undefined {
  const state: unknown = useLocation().state;
  if (!state || typeof state !== 'object' || !('added' in state)) return undefined;
  const added = state.added as Partial<AddedPerson> | null;
  return typeof added?.name === 'string' && typeof added.email === 'string'
    ? { name: added.name, email: added.email }
    : undefined;
}

/** The people at the user's sites, for administrators and site admins. */
export function PeoplePage() {
  const { data: me } = useSuspenseQuery(meQuery());
  const ability = useAppAbility();
  const added = useAddedPerson();
  const allowed = PEOPLE_ROLES.includes(me.user.role);
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
        {ability.can('create', newUserSubject()) ? (
          <LinkButton to="/people/new" variant="primary">
            Add person
          </LinkButton>
        ) : null}
      </div>
      {added ? (
        <Notice tone="info" title={`${added.name} added`}>
          They can sign in as {added.email} with the password you chose; pass it on to them yourself.
        </Notice>
      ) : null}
      {allowed ? (
        <PeopleList />
      ) : (
        <Notice tone="info" title="Not for your role">
          The list of people is kept by administrators and site admins.
        </Notice>
      )}
    </div>
  );
}
