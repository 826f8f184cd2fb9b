import { ROLE_LABELS, type User } from '@kerfline/domain/users/schema';

/**
 * People in the caller's scope. A plain table: it scrolls sideways inside its card on a phone rather than
 * squeezing e-mail addresses.
 */
export function UsersTable({
  users,
  siteNameOf,
}: {
  users: User[];
  siteNameOf: (siteId: string) => string | undefined;
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
              Home site
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
                {user.name}
              </th>
              <td className="px-3 py-3 whitespace-nowrap text-ink">{user.email}</td>
              <td className="px-3 py-3 text-ink">{ROLE_LABELS[user.role]}</td>
              <td className="px-3 py-3 text-ink">
                {user.siteId ? (
                  (siteNameOf(user.siteId) ?? 'Another site')
                ) : (
                  <span className="text-ink-muted">None</span>
                )}
              </td>
              <td className="py-3 pr-5 pl-3">
                {user.active ? (
                  <span className="font-semibold text-ink">Active</span>
                ) : (
                  <span className="text-ink-muted line-through decoration-1">Inactive</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
