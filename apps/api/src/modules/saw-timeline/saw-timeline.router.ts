import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import { sawTimelineQuerySchema } from '@kerfline/domain/saw-timeline/schema';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { getSawTimeline } from './saw-timeline.service.js';

const params = z.object({ id: idSchema });

export function sawTimelineRouter(): Router {
  const router = Router();
  router.get(
    '/saws/:id/timeline',
    validate('params', params),
    validate('query', sawTimelineQuerySchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await getSawTimeline(abilityOf(res), id, parsed(res, 'query', sawTimelineQuerySchema)));
    },
  );
  return router;
}
