import { useMemo, type ReactNode } from 'react';
import { subject } from '@casl/ability';
import { AbilityProvider as CaslAbilityProvider, useAbility } from '@casl/react';
import { abilityFromRules, type AppAbility, type AppRawRule } from '@kerfline/domain/authz/ability';
import type { Me } from '@kerfline/domain/auth/schema';

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

/**
 * The subject for a person who does not exist yet, for `can('create', …)`. Only administrators may add
 * people; the server checks the new person's site again when they are saved.
 */
export function newUserSubject() {
  return subject('User', { id: '', siteId: null });
}
