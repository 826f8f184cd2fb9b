import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { ROLES, ROLE_LABELS, type Role } from '@kerfline/domain/users/schema';
import { Card } from '../../../lib/ui/card';
import { Field, inputClass } from '../../../lib/ui/field';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { meQuery } from '../../../features/auth/api/queries';
import { siteListQuery } from '../../../features/sites/api/queries';
import { regionListQuery } from '../../../features/regions/api/queries';
import { userListQuery, userListQueryFromSearch } from '../../../features/users/api/queries';
import { UsersTable } from '../../../features/users/components/users-table';

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

/** The people at the user's sites, for administrators and site admins. */
export function PeoplePage() {
  const { data: me } = useSuspenseQuery(meQuery());
  const allowed = PEOPLE_ROLES.includes(me.user.role);
  return (
    <div className="space-y-6">
      <title>People · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">People</h1>
        <p className="mt-1 text-ink-muted">
          {me.user.role === 'admin' ? 'Everyone with an account.' : 'Everyone with an account at your site.'}
        </p>
      </div>
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
