import { Router } from 'express';
import { regionCreateSchema } from '@kerfline/domain/regions/schema';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { createRegion, listRegions } from './regions.service.js';

export function regionsRouter(): Router {
  const router = Router();
  router.get('/regions', async (_req, res) => {
    res.json(await listRegions(abilityOf(res)));
  });
  router.post('/regions', validate('body', regionCreateSchema), async (_req, res) => {
    res.status(201).json(await createRegion(abilityOf(res), parsed(res, 'body', regionCreateSchema)));
  });
  return router;
}
