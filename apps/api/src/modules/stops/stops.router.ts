import { Router } from 'express';
import { z } from 'zod';
import {
  stopCreateSchema,
  stopEndSchema,
  stopExportQuerySchema,
  stopListQuerySchema,
  stopUpdateSchema,
} from '@kerfline/domain/stops/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { removalOf, requireRemovalReason } from '../../http/removal-reason.js';
import { createStop, deleteStop, endStop, getStop, listStops, updateStop } from './stops.service.js';
import { exportName, exportScope, streamListCsv } from '../records/record-export.js';
import { STOP_HEADER, stopCells } from '../records/record-csv.js';

const params = z.object({ id: idSchema });

export function stopsRouter(): Router {
  const router = Router();
  router.get('/stops', validate('query', stopListQuerySchema), async (_req, res) => {
    res.json(await listStops(abilityOf(res), parsed(res, 'query', stopListQuerySchema)));
  });
  // The table as CSV: the same filters and scope, paged through the same list a thousand rows at a time.
  router.get('/stops/export', validate('query', stopExportQuerySchema), async (_req, res) => {
    const ability = abilityOf(res);
    const filters = parsed(res, 'query', stopExportQuerySchema);
    const scope = await exportScope(ability, filters.siteId);
    await streamListCsv(
      res,
      exportName(scope, 'stops'),
      STOP_HEADER,
      (limit, offset) => listStops(ability, { ...filters, limit, offset }),
      stopCells,
    );
  });
  router.get('/stops/:id', validate('params', params), async (_req, res) => {
    res.json(await getStop(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/stops', validate('body', stopCreateSchema), async (_req, res) => {
    res.status(201).json(await createStop(actorOf(res), parsed(res, 'body', stopCreateSchema)));
  });
  router.post('/stops/:id/end', validate('params', params), validate('body', stopEndSchema), async (_req, res) => {
    const { id } = parsed(res, 'params', params);
    res.json(await endStop(actorOf(res), id, parsed(res, 'body', stopEndSchema)));
  });
  router.patch('/stops/:id', validate('params', params), validate('body', stopUpdateSchema), async (_req, res) => {
    const { id } = parsed(res, 'params', params);
    res.json(await updateStop(actorOf(res), id, parsed(res, 'body', stopUpdateSchema)));
  });
  router.delete('/stops/:id', validate('params', params), requireRemovalReason(), async (_req, res) => {
    await deleteStop(actorOf(res), parsed(res, 'params', params).id, removalOf(res));
    res.status(204).end();
  });
  return router;
}
