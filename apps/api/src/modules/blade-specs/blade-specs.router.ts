import { Router } from 'express';
import { z } from 'zod';
import {
  bladeSpecCreateSchema,
  bladeSpecListQuerySchema,
  bladeSpecUpdateSchema,
} from '@kerfline/domain/blade-specs/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import {
  createBladeSpec,
  deleteBladeSpec,
  getBladeSpec,
  listBladeSpecs,
  updateBladeSpec,
} from './blade-specs.service.js';

const params = z.object({ id: idSchema });

export function bladeSpecsRouter(): Router {
  const router = Router();
  router.get('/blade-specs', validate('query', bladeSpecListQuerySchema), async (_req, res) => {
    res.json(await listBladeSpecs(abilityOf(res), parsed(res, 'query', bladeSpecListQuerySchema)));
  });
  router.get('/blade-specs/:id', validate('params', params), async (_req, res) => {
    res.json(await getBladeSpec(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/blade-specs', validate('body', bladeSpecCreateSchema), async (_req, res) => {
    res.status(201).json(await createBladeSpec(actorOf(res), parsed(res, 'body', bladeSpecCreateSchema)));
  });
  router.patch(
    '/blade-specs/:id',
    validate('params', params),
    validate('body', bladeSpecUpdateSchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await updateBladeSpec(actorOf(res), id, parsed(res, 'body', bladeSpecUpdateSchema)));
    },
  );
  router.delete('/blade-specs/:id', validate('params', params), async (_req, res) => {
    await deleteBladeSpec(actorOf(res), parsed(res, 'params', params).id);
    res.status(204).end();
  });
  return router;
}
