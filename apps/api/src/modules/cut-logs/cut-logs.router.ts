import { Router } from 'express';
import { z } from 'zod';
import { cutLogCreateSchema, cutLogListQuerySchema } from '@kerfline/domain/cut-logs/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { removalOf, requireRemovalReason } from '../../http/removal-reason.js';
import { createCutLog, deleteCutLog, getCutLog, listCutLogs } from './cut-logs.service.js';

const params = z.object({ id: idSchema });

export function cutLogsRouter(): Router {
  const router = Router();
  router.get('/cut-logs', validate('query', cutLogListQuerySchema), async (_req, res) => {
    res.json(await listCutLogs(abilityOf(res), parsed(res, 'query', cutLogListQuerySchema)));
  });
  router.get('/cut-logs/:id', validate('params', params), async (_req, res) => {
    res.json(await getCutLog(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/cut-logs', validate('body', cutLogCreateSchema), async (_req, res) => {
    res.status(201).json(await createCutLog(actorOf(res), parsed(res, 'body', cutLogCreateSchema)));
  });
  router.delete('/cut-logs/:id', validate('params', params), requireRemovalReason(), async (_req, res) => {
    await deleteCutLog(actorOf(res), parsed(res, 'params', params).id, removalOf(res));
    res.status(204).end();
  });
  return router;
}
