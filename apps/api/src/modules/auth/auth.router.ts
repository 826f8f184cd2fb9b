import { Router, type RequestHandler } from 'express';
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

export function authRouter(deps: {
  passport: InstanceType<typeof passportModule.Passport>;
  signInLimiter: RequestHandler;
  linkLimiter: RequestHandler;
  mail: MailQueue;
}): Router {
  const router = Router();

  router.post('/auth/sign-in', deps.signInLimiter, validate('body', signInSchema), (req, res, next) => {
    deps.passport.authenticate('local', (err: unknown, user: Express.User | false) => {
      if (err) return next(err);
      if (!user) return next(new AppError('UNAUTHENTICATED', 'That e-mail and password do not match an account'));
      // passport regenerates the session id here, so a session fixed before sign-in is worthless after it.
      req.logIn(user, async (loginErr) => {
        if (loginErr) return next(loginErr);
        try {
          const signedIn = await loadSignedIn(user.id);
          if (!signedIn) throw new AppError('UNAUTHENTICATED', 'That e-mail and password do not match an account');
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
    deps.linkLimiter,
    validate('body', passwordResetRequestSchema),
    async (_req, res) => {
      const floor = new Promise((resolve) => setTimeout(resolve, RESET_REQUEST_MIN_MS));
      const work = requestPasswordReset(parsed(res, 'body', passwordResetRequestSchema).email, deps.mail);
      // Both finish before answering; a failure is still an error, after the same wait.
      await Promise.all([work.catch(() => undefined), floor]);
      await work;
      res.status(202).json({ message: RESET_REQUESTED });
    },
  );
  router.post('/auth/password-reset', deps.linkLimiter, validate('body', passwordResetSchema), async (_req, res) => {
    await completePasswordReset(parsed(res, 'body', passwordResetSchema));
    res.status(204).end();
  });
  router.get('/me', requireSignIn, async (_req, res) => {
    res.json(await toMe(signedInOf(res)));
  });

  router.post(
    '/me/password',
    requireSignIn,
    deps.signInLimiter,
    validate('body', passwordChangeSchema),
    async (req, res) => {
      await changePassword(signedInOf(res).user.id, req.sessionID, parsed(res, 'body', passwordChangeSchema));
      res.status(204).end();
    },
  );

  return router;
}
