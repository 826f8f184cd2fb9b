import { Router } from 'express';
import { z } from 'zod';
import { sawCreateSchema, sawListQuerySchema, sawUpdateSchema } from '@kerfline/domain/saws/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { createSaw, getSaw, listSaws, restoreSaw, retireSaw, updateSaw } from './saws.service.js';

const params = z.object({ id: idSchema });

export function sawsRouter(): Router {
  const router = Router();
  router.get('/saws', validate('query', sawListQuerySchema), async (_req, res) => {
    res.json(await listSaws(abilityOf(res), parsed(res, 'query', sawListQuerySchema)));
  });
  router.get('/saws/:id', validate('params', params), async (_req, res) => {
    res.json(await getSaw(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/saws', validate('body', sawCreateSchema), async (_req, res) => {
    res.status(201).json(await createSaw(actorOf(res), parsed(res, 'body', sawCreateSchema)));
  });
  router.patch('/saws/:id', validate('params', params), validate('body', sawUpdateSchema), async (_req, res) => {
    res.json(await updateSaw(actorOf(res), parsed(res, 'params', params).id, parsed(res, 'body', sawUpdateSchema)));
  });
  router.post('/saws/:id/retire', validate('params', params), async (_req, res) => {
    res.json(await retireSaw(actorOf(res), parsed(res, 'params', params).id));
  });
  router.post('/saws/:id/restore', validate('params', params), async (_req, res) => {
    res.json(await restoreSaw(actorOf(res), parsed(res, 'params', params).id));
  });
  return router;
}
