import { Router, type ErrorRequestHandler, type Request, type RequestHandler, type Response } from 'express';
import type passportModule from 'passport';
import {
  passwordChangeSchema,
  passwordResetRequestSchema,
  passwordResetSchema,
  signInSchema,
} from '@kerfline/domain/auth/schema';
import { parsed, validate } from '../../http/validate.js';
import { requireSignIn, signedInOf } from '../../http/authenticate.js';
import { AppError } from '../../errors.js';
import type { MailQueue } from '../../jobs/mail-queue.js';
import { changePassword, loadSignedIn, toMe } from './auth.service.js';
import { completePasswordReset, requestPasswordReset } from './password-reset.service.js';

/**
 * Every answer to a reset request takes at least this long, whether or not the address has an account, so
 * the time of the answer says no more than its words (the work itself is a few milliseconds either way).
 */
export const RESET_REQUEST_MIN_MS = 400;

const RESET_REQUESTED =
  'If an account uses that address, a link to choose a new password is on its way. It works for one hour; check the spam folder if nothing arrives.';

type FailureLimit = { guard: RequestHandler; count: ErrorRequestHandler };

const NO_MATCH = 'That e-mail and password do not match an account';

/**
 * Sign-in is limited inside the passport strategy (per address and per account, failures only: see
 * security/attempt-limits.ts); the other routes that take a secret get their own limits from app.ts.
 */
export function authRouter(deps: {
  passport: InstanceType<typeof passportModule.Passport>;
  mail: MailQueue;
  passwordChangeLimit: FailureLimit;
  resetRequestLimits: RequestHandler[];
  resetLimit: FailureLimit;
  /** Forgets an account's failed sign-ins: a completed reset proves the mailbox, so its wait ends at once. */
  clearSignInWait: (email: string) => Promise<void>;
}): Router {
  const router = Router();

  router.post('/auth/sign-in', validate('body', signInSchema), (req, res, next) => {
    deps.passport.authenticate('local', (err: unknown, user: Express.User | false, info?: { message?: string }) => {
      if (err) return next(err);
      if (!user) {
        // The strategy says in `info` whether this failure made the account wait (seconds), the same for an
        // address with no account.
        const locked = Number(info?.message);
        const minutes = Math.ceil(locked / 60);
        return next(
          new AppError(
            'UNAUTHENTICATED',
            locked > 0
              ? `${NO_MATCH}. After several failed tries in a row, the next try waits ${minutes === 1 ? '1 minute' : `${minutes} minutes`}; a link to choose a new password ("Forgotten your password?") works at once`
              : NO_MATCH,
          ),
        );
      }
      // passport regenerates the session id here, so a session fixed before sign-in is worthless after it.
      req.logIn(user, async (loginErr) => {
        if (loginErr) return next(loginErr);
        // The absolute session lifetime counts from here (http/session-lifetime.ts).
        req.session.signedInAt = Date.now();
        try {
          const signedIn = await loadSignedIn(user.id);
          if (!signedIn) throw new AppError('UNAUTHENTICATED', NO_MATCH);
          res.json(await toMe(signedIn));
        } catch (e) {
          next(e);
        }
      });
    })(req, res, next);
  });

  router.post('/auth/sign-out', (req, res, next) => {
    req.logOut((err) => {
      if (err) return next(err);
      req.session.destroy((destroyErr) => {
        if (destroyErr) return next(destroyErr);
        res.clearCookie('kerfline.sid');
        res.status(204).end();
      });
    });
  });

  router.post(
    '/auth/password-reset/request',
    validate('body', passwordResetRequestSchema),
    ...deps.resetRequestLimits,
    async (_req, res) => {
      const floor = new Promise((resolve) => setTimeout(resolve, RESET_REQUEST_MIN_MS));
      const work = requestPasswordReset(parsed(res, 'body', passwordResetRequestSchema).email, deps.mail);
      // Both finish before answering; a failure is still an error, after the same wait.
      await Promise.all([work.catch(() => undefined), floor]);
      await work;
      res.status(202).json({ message: RESET_REQUESTED });
    },
  );
  router.post(
    '/auth/password-reset',
    validate('body', passwordResetSchema),
    deps.resetLimit.guard,
    async (_req: Request, res: Response) => {
      const { email } = await completePasswordReset(parsed(res, 'body', passwordResetSchema));
      await deps.clearSignInWait(email);
      res.status(204).end();
    },
    deps.resetLimit.count,
  );
  router.get('/me', requireSignIn, async (_req, res) => {
    res.json(await toMe(signedInOf(res)));
  });

  router.post(
    '/me/password',
    requireSignIn,
    validate('body', passwordChangeSchema),
    deps.passwordChangeLimit.guard,
    async (req: Request, res: Response) => {
      await changePassword(signedInOf(res).user.id, req.sessionID, parsed(res, 'body', passwordChangeSchema));
      res.status(204).end();
    },
    deps.passwordChangeLimit.count,
  );

  return router;
}
