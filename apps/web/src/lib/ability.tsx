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
  // meSchema keeps actions and subjects as plain strings; they are the domain's own names by construction.
  const ability = useMemo(() => abilityFromRules(rules as AppRawRule[]), [rules]);
  return <CaslAbilityProvider value={ability}>{children}</CaslAbilityProvider>;
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
