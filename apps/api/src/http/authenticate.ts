import type { NextFunction, Request, Response } from 'express';
import type { AppAbility, Principal } from '@kerfline/domain/authz/ability';
import { AppError } from '../errors.js';
import { loadSignedIn, signedInFrom, type SignedIn } from '../modules/auth/auth.service.js';
import { personReadWithSession } from './session-store.js';
import type { Actor } from '../audit/write-audit.js';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User {
      id: string;
    }
  }
}

/**
 * Requires a signed-in, active user and puts who they are and what they may do on `res.locals`, rebuilt from
 * the database on every request so a change of role or sites takes effect at once. Never kept beyond the request.
 */
export async function requireSignIn(req: Request, res: Response, next: NextFunction): Promise<void> {
  const userId = req.user?.id;
  // Usually read in the same statement as this request's session (http/session-store.ts); otherwise read now.
  const along = personReadWithSession(req);
  const signedIn = !userId
    ? null
    : along && along.userId === userId
      ? signedInFrom(along.person)
      : await loadSignedIn(userId);
  if (!signedIn) throw new AppError('UNAUTHENTICATED', 'Sign in to continue');
  res.locals.signedIn = signedIn;
  next();
}

export function signedInOf(res: Response): SignedIn {
  return res.locals.signedIn as SignedIn;
}

export function abilityOf(res: Response): AppAbility {
  return signedInOf(res).ability;
}

export function principalOf(res: Response): Principal {
  return signedInOf(res).principal;
}

/** The caller as services see them: what they may do, and who they are for the audit trail. */
export function actorOf(res: Response): Actor {
  const signedIn = signedInOf(res);
  return { ability: signedIn.ability, userId: signedIn.user.id };
}
