import { Suspense, useState } from 'react';
import { Link, NavLink, Outlet, useNavigate, useNavigation } from 'react-router-dom';
import { useQueryClient, useSuspenseQuery } from '@tanstack/react-query';
import { ROLE_LABELS, type Role } from '@kerfline/domain/users/schema';
import { AppAbilityProvider } from '../../lib/ability';
import { isApiError } from '../../lib/api-client';
import { Button } from '../../lib/ui/button';
import { meQuery } from '../../features/auth/api/queries';
import { useSignOut } from '../../features/auth/api/mutations';
import { KerflineMark } from './kerfline-mark';

type NavItem = { to: string; label: string; roles?: Role[] };

/** What each role sees in the navigation; the pages themselves are still guarded by the server. */
const NAV_ITEMS: NavItem[] = [
  { to: '/fleet', label: 'Fleet', roles: ['admin', 'manager', 'regional_lead'] },
  { to: '/outliers', label: 'Outliers', roles: ['admin', 'manager', 'regional_lead'] },
  { to: '/follow-ups', label: 'Follow-ups', roles: ['admin', 'manager', 'regional_lead', 'site_admin'] },
  { to: '/budgets', label: 'Budgets', roles: ['admin', 'manager'] },
  { to: '/today', label: 'Today', roles: ['technician', 'site_admin'] },
  { to: '/sites', label: 'Sites' },
  { to: '/saws', label: 'Saws' },
  { to: '/blade-specs', label: 'Blade specs', roles: ['admin', 'site_admin'] },
  { to: '/people', label: 'People', roles: ['admin', 'site_admin'] },
  { to: '/imports', label: 'Imports', roles: ['admin', 'site_admin'] },
  { to: '/calculators', label: 'Shop calculators' },
  { to: '/mail', label: 'Mail', roles: ['admin'] },
  { to: '/exchange-rates', label: 'Rates', roles: ['admin'] },
];

const navLinkClass = ({ isActive }: { isActive: boolean }) =>
  `flex min-h-11 items-center rounded-sheet border-b-[3px] px-3 text-sm font-semibold transition-colors ${
    isActive ? 'border-accent bg-accent-soft text-accent-dark' : 'border-transparent text-ink hover:bg-paper-deep'
  }`;

/** The signed-in frame: top bar with the mark, navigation by role, who is signed in, and sign out. */
export function AppShell() {
  const { data: me } = useSuspenseQuery(meQuery());
  const navigation = useNavigation();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const signOut = useSignOut();
  const [menuOpen, setMenuOpen] = useState(false);

  const items = NAV_ITEMS.filter((item) => !item.roles || item.roles.includes(me.user.role));
  const closeMenu = () => setMenuOpen(false);

  const onSignOut = () => {
    signOut.mutate(undefined, {
      onSettled: async (_data, error) => {
        // A session that had already ended counts as signed out.
        if (error && !isApiError(error, 401)) return;
        await navigate('/sign-in', { replace: true });
        // Only after leaving the signed-in pages, so nothing on screen refetches: the next user starts clean.
        queryClient.clear();
      },
    });
  };

  const userBlock = (
    <Link
      to="/account"
      onClick={closeMenu}
      className="block min-h-11 rounded-sheet px-2 py-1 text-sm leading-tight hover:bg-paper-deep"
      aria-label={`Your account: ${me.user.name}, ${ROLE_LABELS[me.user.role]}`}
    >
      <span className="block font-bold text-ink">{me.user.name}</span>
      <span className="block text-ink-muted">{ROLE_LABELS[me.user.role]}</span>
    </Link>
  );

  return (
    <AppAbilityProvider rules={me.rules}>
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded-sheet focus:bg-card focus:px-4 focus:py-3"
      >
        Skip to content
      </a>
      <header className="sticky top-0 z-40 border-b border-rule bg-card">
        <div
          aria-hidden="true"
          className={`h-0.5 bg-accent transition-opacity ${navigation.state === 'idle' ? 'opacity-0' : 'animate-pulse opacity-100'}`}
        />
        <div className="mx-auto flex max-w-7xl items-center gap-4 px-4 py-2 sm:px-6">
          <Link to="/" className="flex min-h-11 items-center gap-2.5 rounded-sheet pr-2">
            <KerflineMark />
            <span className="text-lg font-extrabold tracking-tight text-ink">Kerfline</span>
          </Link>
          <nav aria-label="Main" className="hidden flex-1 md:block">
            <ul className="flex gap-1">
              {items.map((item) => (
                <li key={item.to}>
                  <NavLink to={item.to} className={navLinkClass}>
                    {item.label}
                  </NavLink>
                </li>
              ))}
            </ul>
          </nav>
          <div className="ml-auto hidden items-center gap-4 md:flex">
            {userBlock}
            <Button onClick={onSignOut} disabled={signOut.isPending}>
              {signOut.isPending ? 'Signing out…' : 'Sign out'}
            </Button>
          </div>
          <Button
            className="ml-auto md:hidden"
            aria-expanded={menuOpen}
            aria-controls="phone-menu"
            onClick={() => setMenuOpen((open) => !open)}
          >
            <svg viewBox="0 0 20 20" aria-hidden="true" className="size-5">
              {menuOpen ? (
                <path d="M4 4l12 12M16 4L4 16" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              ) : (
                <path d="M3 5h14M3 10h14M3 15h14" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              )}
            </svg>
            Menu
          </Button>
        </div>
        {menuOpen ? (
          <div id="phone-menu" className="border-t border-rule px-4 pt-2 pb-4 md:hidden">
            <nav aria-label="Main">
              <ul className="space-y-1">
                {items.map((item) => (
                  <li key={item.to}>
                    <NavLink to={item.to} className={navLinkClass} onClick={closeMenu}>
                      {item.label}
                    </NavLink>
                  </li>
                ))}
              </ul>
            </nav>
            <div className="mt-3 flex items-center justify-between gap-4 border-t border-rule pt-3">
              {userBlock}
              <Button onClick={onSignOut} disabled={signOut.isPending}>
                Sign out
              </Button>
            </div>
          </div>
        ) : null}
        {signOut.isError && !isApiError(signOut.error, 401) ? (
          <p role="alert" className="mx-auto max-w-7xl px-4 pb-2 text-sm font-semibold text-signal-stop sm:px-6">
            Signing out failed: {signOut.error.message}
          </p>
        ) : null}
      </header>
      <main
        id="main"
        tabIndex={-1}
        aria-busy={navigation.state !== 'idle'}
        className="mx-auto max-w-7xl px-4 py-6 sm:px-6 sm:py-8"
      >
        <Suspense fallback={<p className="text-ink-muted">Loading…</p>}>
          <Outlet />
        </Suspense>
      </main>
    </AppAbilityProvider>
  );
}
