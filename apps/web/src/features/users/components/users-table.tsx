import { Link } from 'react-router-dom';
import { ROLE_LABELS, type User } from '@kerfline/domain/users/schema';

/**
 * People in the caller's scope. On a wide screen a table; below the md breakpoint each person becomes a card with
 * the column names beside the values, so a phone never scrolls sideways (long e-mail addresses wrap).
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
    <div>
      <table className="w-full border-collapse text-left text-sm max-md:block">
        <caption className="sr-only">People</caption>
        <thead className="max-md:hidden">
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
        <tbody className="max-md:block">
          {users.map((user) => (
            <tr key={user.id} className="border-b border-rule last:border-b-0 max-md:block max-md:px-4 max-md:py-3">
              <th
                scope="row"
                className="py-3 pr-3 pl-5 font-semibold text-ink max-md:block max-md:p-0 max-md:text-base"
              >
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
              <td
                data-label="E-mail"
                className="px-3 py-3 text-ink md:whitespace-nowrap max-md:break-all max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
              >
                {user.email}
              </td>
              <td
                data-label="Role"
                className="px-3 py-3 text-ink max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
              >
                {ROLE_LABELS[user.role]}
              </td>
              <td
                data-label="Works at"
                className="px-3 py-3 text-ink max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
              >
                <WorksAt user={user} siteNameOf={siteNameOf} regionNameOf={regionNameOf} />
              </td>
              <td
                data-label="Account"
                className="py-3 pr-5 pl-3 max-md:grid max-md:grid-cols-[6.5rem_1fr] max-md:gap-3 max-md:px-0 max-md:py-1 max-md:before:font-semibold max-md:before:text-ink-muted max-md:before:content-[attr(data-label)]"
              >
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
