import type { RequestHandler } from 'express';

declare module 'express-session' {
  interface SessionData {
    /** When the person signed in (ms since the epoch); the absolute lifetime counts from here. */
    signedInAt: number;
  }
}

/**
 * A session lasts at most `maxMs` from sign-in, however active it stays; the idle timeout (the cookie's rolling
 * `maxAge`) ends it sooner when unused. Both limits live in the stored session, so every API process enforces
 * them: the check here ends a session past its end, and the cookie's expiry (which connect-pg-simple writes to
 * the `expire` column and filters on) is capped at the same moment, so the store itself stops handing it out.
 * Runs after express-session and before passport reads the user.
 */
export function sessionLifetime(options: { idleMs: number; maxMs: number }): RequestHandler {
  return (req, _res, next) => {
    const session = req.session;
    if (!session || !(session as { passport?: unknown }).passport) return next();
    const now = Date.now();
    // A session from before this rule started its clock now.
    session.signedInAt ??= now;
    const left = session.signedInAt + options.maxMs - now;
    if (left <= 0) {
      // Removes the stored session and starts an empty one: the person is no longer signed in anywhere with it.
      return session.regenerate((err) => next(err));
    }
    // express-session resets `maxAge` to `originalMaxAge` when it answers (rolling): cap that.
    session.cookie.originalMaxAge = Math.min(options.idleMs, left);
    session.cookie.maxAge = session.cookie.originalMaxAge;
    next();
  };
}
