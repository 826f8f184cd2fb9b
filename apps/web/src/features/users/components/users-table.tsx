import { Link } from 'react-router-dom';
import { ROLE_LABELS, type User } from '@kerfline/domain/users/schema';

/**
 * People in the caller's scope. A plain table: it scrolls sideways inside its card on a phone rather than
 * squeezing e-mail addresses.
 */
export function UsersTable({
  users,
  siteNameOf,
  regionNameOf,
  linkTo,
}: {
  users: User[];
  siteNameOf: (siteId: string) => string | undefined;
  regionNameOf: (regionId: string) => string | undefined;
  /** Where a person's name leads (their page), when the viewer may open it. */
  linkTo?: (user: User) => string | undefined;
}) {
  if (users.length === 0) return <p className="px-5 py-8 text-center text-ink-muted">Nobody matches this filter.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[40rem] border-collapse text-left text-sm">
        <caption className="sr-only">People</caption>
        <thead>
          <tr className="border-b border-rule text-ink-muted">
            <th scope="col" className="py-3 pr-3 pl-5 font-semibold">
              Name
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              E-mail
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Role
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Works at
            </th>
            <th scope="col" className="py-3 pr-5 pl-3 font-semibold">
              Account
            </th>
          </tr>
        </thead>
        <tbody>
          {users.map((user) => (
            <tr key={user.id} className="border-b border-rule last:border-b-0">
              <th scope="row" className="py-3 pr-3 pl-5 font-semibold text-ink">
                {linkTo?.(user) ? (
                  <Link
                    to={linkTo(user)!}
                    className="inline-flex min-h-11 items-center text-accent-dark underline-offset-4 hover:underline"
                  >
                    {user.name}
                  </Link>
                ) : (
                  user.name
                )}
              </th>
              <td className="px-3 py-3 whitespace-nowrap text-ink">{user.email}</td>
              <td className="px-3 py-3 text-ink">{ROLE_LABELS[user.role]}</td>
              <td className="px-3 py-3 text-ink">
                <WorksAt user={user} siteNameOf={siteNameOf} regionNameOf={regionNameOf} />
              </td>
              <td className="py-3 pr-5 pl-3">
                {user.active ? (
                  <span className="font-semibold text-ink">
                    <span aria-hidden="true" className="mr-1.5 inline-block size-2.5 rounded-full bg-signal-safe" />
                    Active
                  </span>
                ) : (
                  <span className="text-ink-muted">
                    <span aria-hidden="true" className="mr-1.5 inline-block size-2.5 bg-ink-muted" />
                    <span className="line-through decoration-1">Inactive</span>
                  </span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Where a person's scope lies, in words: a home site, a region, a list of sites, or every site. */
function WorksAt({
  user,
  siteNameOf,
  regionNameOf,
}: {
  user: User;
  siteNameOf: (siteId: string) => string | undefined;
  regionNameOf: (regionId: string) => string | undefined;
}) {
  if (user.siteId) return <>{siteNameOf(user.siteId) ?? 'Another site'}</>;
  if (user.regionId) return <>Region {regionNameOf(user.regionId) ?? ''}</>;
  if (user.role === 'admin' || user.allSites) return <>Every site</>;
  if (user.managedSiteIds.length > 0) {
    const names = user.managedSiteIds.map((id) => siteNameOf(id) ?? 'another site');
    return <>{names.join(', ')}</>;
  }
  return <span className="text-ink-muted">No site yet</span>;
}
