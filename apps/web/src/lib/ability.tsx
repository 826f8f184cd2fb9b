import { useMemo, type ReactNode } from 'react';
import { subject } from '@casl/ability';
import { AbilityProvider as CaslAbilityProvider, useAbility } from '@casl/react';
import { abilityFromRules, type AppAbility, type AppRawRule } from '@kerfline/domain/authz/ability';
import type { Me } from '@kerfline/domain/auth/schema';
import { ROLES, type Role } from '@kerfline/domain/users/schema';

/**
 * Gives every screen the signed-in user's ability, rebuilt from the rules `/api/me` sent. It only hides
 * controls the user may not use; the server checks every request again.
 */
export function AppAbilityProvider({ rules, children }: { rules: Me['rules']; children: ReactNode }) {
  const ability = useMemo(() => abilityFromMeRules(rules), [rules]);
  return <CaslAbilityProvider value={ability}>{children}</CaslAbilityProvider>;
}

/**
 * The ability for the rules `/api/me` sent, built as the provider builds it; loaders use it to skip
 * fetching what a page will not show to this user.
 */
export function abilityFromMeRules(rules: Me['rules']): AppAbility {
  // meSchema keeps actions and subjects as plain strings; they are the domain's own names by construction.
  return abilityFromRules(rules as AppRawRule[]);
}

/** Wraps an ability built elsewhere (tests build one with `defineAbilityFor`). */
export function StaticAbilityProvider({ ability, children }: { ability: AppAbility; children: ReactNode }) {
  return <CaslAbilityProvider value={ability}>{children}</CaslAbilityProvider>;
}

export function useAppAbility(): AppAbility {
  return useAbility<AppAbility>();
}

/**
 * The subject for a saw that does not exist yet, for `can('create', …)`. The domain types every saw subject
 * with an id; a new one has none, and the create rules test only its site, so the id is left blank.
 */
export function newSawSubject(siteId: string) {
  return subject('Saw', { id: '', siteId });
}

/** A person as a subject: CASL decides on their site and role (the server checks the saved record again). */
export function userSubject(person: { id: string; siteId: string | null; role: Role }) {
  return subject('User', { id: person.id, siteId: person.siteId, role: person.role });
}

/** Adding a person with a typed first password: administrators only, a fallback to inviting. */
export function canAddWithPassword(ability: AppAbility): boolean {
  return ability.can('manage', 'all');
}

const AT_ONE_SITE: readonly Role[] = ['site_admin', 'technician'];

/**
 * What the signed-in person may give when inviting (`Invitation`) or changing (`User`) someone: the roles,
 * and for roles tied to one site, the sites. Read from the same rules the server enforces.
 */
export function grantable(
  ability: AppAbility,
  subjectType: 'Invitation' | 'User',
  siteIds: readonly string[],
): { roles: Role[]; siteIdsFor: (role: Role) => string[] } {
  const action = subjectType === 'Invitation' ? 'create' : 'update';
  const allows = (role: Role, siteId: string | null) =>
    ability.can(action, subject(subjectType, { id: '', siteId, role }) as Parameters<AppAbility['can']>[1]);
  const siteIdsFor = (role: Role) => (AT_ONE_SITE.includes(role) ? siteIds.filter((id) => allows(role, id)) : []);
  const roles = ROLES.filter((role) => (AT_ONE_SITE.includes(role) ? siteIdsFor(role).length > 0 : allows(role, null)));
  return { roles, siteIdsFor };
}
