import { redirect, type LoaderFunctionArgs } from 'react-router-dom';
import type { QueryClient } from '@tanstack/react-query';
import { isApiError } from '../lib/api-client';
import { meQuery } from '../features/auth/api/queries';

/**
 * The one place a missing session is handled: every signed-in page sits under this loader, and a 401 from
 * `/api/me` sends the user to sign in, with the page they wanted kept in `next`.
 */
export function rootLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    try {
      return await queryClient.ensureQueryData(meQuery());
    } catch (error) {
      if (isApiError(error, 401)) {
        const url = new URL(request.url);
        const wanted = `${url.pathname}${url.search}`;
        throw redirect(wanted === '/' ? '/sign-in' : `/sign-in?next=${encodeURIComponent(wanted)}`);
      }
      throw error;
    }
  };
}

/** Only a path inside this app may follow sign-in (never `//elsewhere` or an absolute URL). */
export function safeNextPath(next: string | null): string {
  return next && next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\') ? next : '/';
}

/**
 * The first page after sign-in: operations managers start from the fleet overview and regional leads from the
 * saws that need a look; a technician starts from the day's work at their site (saws down, blades on saws, with
 * the actions one tap away); a site admin from their site; everyone else from the list of sites.
 */
export function homeLoader(queryClient: QueryClient) {
  return async () => {
    const me = await queryClient.ensureQueryData(meQuery());
    if (me.user.role === 'manager') return redirect('/fleet');
    if (me.user.role === 'regional_lead') return redirect('/outliers');
    const [only, ...others] = me.siteIds;
    if (me.user.role === 'technician' && only) return redirect('/today');
    return redirect(only && others.length === 0 ? `/sites/${only}` : '/sites');
  };
}
