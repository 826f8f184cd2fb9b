import { Router, type ErrorRequestHandler, type Request, type RequestHandler, type Response } from 'express';
import { z } from 'zod';
import {
  invitationAcceptSchema,
  invitationCreateSchema,
  invitationListQuerySchema,
  invitationLookupSchema,
} from '@kerfline/domain/invitations/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf, requireSignIn } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import type { MailQueue } from '../../jobs/mail-queue.js';
import {
  acceptInvitation,
  createInvitation,
  listInvitations,
  previewInvitation,
  resendInvitation,
  revokeInvitation,
} from './invitations.service.js';

const params = z.object({ id: idSchema });

/**
 * The invited person's two routes (no session: the link's secret is the proof) and the inviters' routes.
 * The secret travels in the body, never in an address, so it reaches no access log.
 */
export function invitationsRouter(deps: {
  mail: MailQueue;
  /** Failed uses of invitation links per address (app.ts): `guard` after validation, `count` last. */
  linkLimit: { guard: RequestHandler; count: ErrorRequestHandler };
}): Router {
  const router = Router();
  const { guard, count } = deps.linkLimit;
  router.post(
    '/invitations/preview',
    validate('body', invitationLookupSchema),
    guard,
    async (_req: Request, res: Response) => {
      res.json(await previewInvitation(parsed(res, 'body', invitationLookupSchema).token));
    },
    count,
  );
  router.post(
    '/invitations/accept',
    validate('body', invitationAcceptSchema),
    guard,
    async (_req: Request, res: Response) => {
      res.status(201).json(await acceptInvitation(parsed(res, 'body', invitationAcceptSchema)));
    },
    count,
  );

  router.get('/invitations', requireSignIn, validate('query', invitationListQuerySchema), async (_req, res) => {
    res.json(await listInvitations(abilityOf(res), parsed(res, 'query', invitationListQuerySchema)));
  });
  router.post('/invitations', requireSignIn, validate('body', invitationCreateSchema), async (_req, res) => {
    res.status(201).json(await createInvitation(actorOf(res), parsed(res, 'body', invitationCreateSchema), deps.mail));
  });
  router.post('/invitations/:id/resend', requireSignIn, validate('params', params), async (_req, res) => {
    res.json(await resendInvitation(actorOf(res), parsed(res, 'params', params).id, deps.mail));
  });
  router.post('/invitations/:id/revoke', requireSignIn, validate('params', params), async (_req, res) => {
    res.json(await revokeInvitation(actorOf(res), parsed(res, 'params', params).id));
  });
  return router;
}
