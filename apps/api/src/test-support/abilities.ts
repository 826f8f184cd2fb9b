import type { AppAbility } from '@kerfline/domain/authz/ability';
import { loadSignedIn } from '../modules/auth/auth.service.js';

/** A person's ability as the API builds it for their requests (tests that call services directly use it). */
export async function abilityFor(userId: string): Promise<AppAbility> {
  const signedIn = await loadSignedIn(userId);
  if (!signedIn) throw new Error(`No active user ${userId}`);
  return signedIn.ability;
}
