import { Router } from 'express';
import { z } from 'zod';
import { regionCreateSchema, regionUpdateSchema } from '@kerfline/domain/regions/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { createRegion, listRegions, updateRegion } from './regions.service.js';

const params = z.object({ id: idSchema });

export function regionsRouter(): Router {
  const router = Router();
  router.get('/regions', async (_req, res) => {
    res.json(await listRegions(abilityOf(res)));
  });
  router.post('/regions', validate('body', regionCreateSchema), async (_req, res) => {
    res.status(201).json(await createRegion(actorOf(res), parsed(res, 'body', regionCreateSchema)));
  });
  router.patch('/regions/:id', validate('params', params), validate('body', regionUpdateSchema), async (_req, res) => {
    res.json(
      await updateRegion(actorOf(res), parsed(res, 'params', params).id, parsed(res, 'body', regionUpdateSchema)),
    );
  });
  return router;
}
