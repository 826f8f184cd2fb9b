import type { QueryClient } from '@tanstack/react-query';
import { meQuery } from '../../../features/auth/api/queries';
import { siteListQuery } from '../../../features/sites/api/queries';

/**
 * The sites the signed-in person may bring files into, and the one a page is about: the address's `siteId`, else
 * their home site, else the first. Site admins have exactly their own; admins every site in use.
 */
export async function importSites(queryClient: QueryClient, wanted: string | null) {
  const me = await queryClient.ensureQueryData(meQuery());
  const all = (await queryClient.ensureQueryData(siteListQuery())).items.filter((s) => !s.retiredAt);
  const sites =
    me.user.role === 'admin' ? all : all.filter((s) => s.id === me.user.siteId && me.user.role === 'site_admin');
  const chosen = sites.find((s) => s.id === wanted) ?? sites.find((s) => s.id === me.user.siteId) ?? sites[0] ?? null;
  return { sites, chosen };
}
