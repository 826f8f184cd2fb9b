import { Router, type RequestHandler } from 'express';
import type passportModule from 'passport';
import { passwordChangeSchema, signInSchema } from '@kerfline/domain/auth/schema';
import { parsed, validate } from '../../http/validate.js';
import { requireSignIn, signedInOf } from '../../http/authenticate.js';
import { AppError } from '../../errors.js';
import { changePassword, loadSignedIn, toMe } from './auth.service.js';

export function authRouter(deps: {
  passport: InstanceType<typeof passportModule.Passport>;
  signInLimiter: RequestHandler;
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
