import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import { removedRecordListQuerySchema } from '@kerfline/domain/removed-records/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import { getRemovedRecord, listRemovedRecords, restoreRemovedRecord } from './removed-records.service.js';

const params = z.object({ id: idSchema });

export function removedRecordsRouter(storage: PhotoStorage): Router {
  const router = Router();
  router.get('/removed-records', validate('query', removedRecordListQuerySchema), async (_req, res) => {
    res.json(await listRemovedRecords(abilityOf(res), parsed(res, 'query', removedRecordListQuerySchema)));
  });
  router.get('/removed-records/:id', validate('params', params), async (_req, res) => {
    res.json(await getRemovedRecord(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/removed-records/:id/restore', validate('params', params), async (_req, res) => {
    res.json(await restoreRemovedRecord(storage, actorOf(res), parsed(res, 'params', params).id));
  });
  return router;
}
