import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import {
  checkCountsQuerySchema,
  checkRecordCreateSchema,
  checkRecordExportQuerySchema,
  checkRecordListQuerySchema,
  dueCheckListQuerySchema,
  siteCheckCreateSchema,
  siteCheckListQuerySchema,
  siteCheckUpdateSchema,
} from '@kerfline/domain/site-checks/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { removalOf, requireRemovalReason } from '../../http/removal-reason.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import {
  createSiteCheck,
  deleteSiteCheck,
  getSiteCheck,
  listSiteChecks,
  setSiteCheckRetired,
  updateSiteCheck,
} from './site-checks.service.js';
import {
  checkCounts,
  deleteCheckRecord,
  getCheckRecord,
  listCheckRecords,
  recordCheck,
  sawChecks,
  siteDueChecks,
} from './check-records.service.js';
import { exportName, exportScope, exportUnits, streamListCsv } from '../records/record-export.js';
import { CHECK_RECORD_HEADER, checkRecordCells } from '../records/record-csv.js';

const params = z.object({ id: idSchema });
const siteParams = z.object({ siteId: idSchema });

/**
 * A site's list of checks, checks recorded on saws, and which are due and overdue. `storage` keeps the photos of
 * a recorded check that is removed.
 */
export function siteChecksRouter(storage: PhotoStorage): Router {
  const router = Router();

  router.get(
    '/sites/:siteId/checks',
    validate('params', siteParams),
    validate('query', siteCheckListQuerySchema),
    async (_req, res) => {
      const { siteId } = parsed(res, 'params', siteParams);
      const { includeRetired } = parsed(res, 'query', siteCheckListQuerySchema);
      res.json({ siteId, items: await listSiteChecks(abilityOf(res), siteId, includeRetired ?? false) });
    },
  );
  router.post(
    '/sites/:siteId/checks',
    validate('params', siteParams),
    validate('body', siteCheckCreateSchema),
    async (_req, res) => {
      const { siteId } = parsed(res, 'params', siteParams);
      res.status(201).json(await createSiteCheck(actorOf(res), siteId, parsed(res, 'body', siteCheckCreateSchema)));
    },
  );
  router.get(
    '/sites/:siteId/checks/overdue',
    validate('params', siteParams),
    validate('query', dueCheckListQuerySchema),
    async (_req, res) => {
      const { siteId } = parsed(res, 'params', siteParams);
      res.json(await siteDueChecks(abilityOf(res), siteId, parsed(res, 'query', dueCheckListQuerySchema)));
    },
  );
  router.get('/sites/:siteId/checks/counts', validate('params', siteParams), async (_req, res) => {
    const [counts] = await checkCounts(abilityOf(res), parsed(res, 'params', siteParams).siteId);
    res.json(counts);
  });
  router.get('/check-counts', validate('query', checkCountsQuerySchema), async (_req, res) => {
    res.json({ items: await checkCounts(abilityOf(res), parsed(res, 'query', checkCountsQuerySchema).siteId) });
  });

  router.get('/site-checks/:id', validate('params', params), async (_req, res) => {
    res.json(await getSiteCheck(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.patch(
    '/site-checks/:id',
    validate('params', params),
    validate('body', siteCheckUpdateSchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await updateSiteCheck(actorOf(res), id, parsed(res, 'body', siteCheckUpdateSchema)));
    },
  );
  router.post('/site-checks/:id/retire', validate('params', params), async (_req, res) => {
    res.json(await setSiteCheckRetired(actorOf(res), parsed(res, 'params', params).id, true));
  });
  router.post('/site-checks/:id/restore', validate('params', params), async (_req, res) => {
    res.json(await setSiteCheckRetired(actorOf(res), parsed(res, 'params', params).id, false));
  });
  router.delete('/site-checks/:id', validate('params', params), async (_req, res) => {
    await deleteSiteCheck(actorOf(res), parsed(res, 'params', params).id);
    res.status(204).end();
  });

  router.get('/saws/:id/checks', validate('params', params), async (_req, res) => {
    res.json(await sawChecks(abilityOf(res), parsed(res, 'params', params).id));
  });

  router.get('/check-records', validate('query', checkRecordListQuerySchema), async (_req, res) => {
    res.json(await listCheckRecords(abilityOf(res), parsed(res, 'query', checkRecordListQuerySchema)));
  });
  // The checks recorded, as CSV: the same filters and scope, paged through the same list a thousand at a time.
  router.get('/check-records/export', validate('query', checkRecordExportQuerySchema), async (_req, res) => {
    const ability = abilityOf(res);
    const { units, ...filters } = parsed(res, 'query', checkRecordExportQuerySchema);
    const scope = await exportScope(ability, filters.siteId);
    const system = exportUnits(units, scope);
    await streamListCsv(
      res,
      exportName(scope, 'checks-recorded'),
      CHECK_RECORD_HEADER,
      (limit, offset) => listCheckRecords(ability, { ...filters, limit, offset }),
      (record) => checkRecordCells(record, system),
    );
  });
  router.get('/check-records/:id', validate('params', params), async (_req, res) => {
    res.json(await getCheckRecord(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/check-records', validate('body', checkRecordCreateSchema), async (_req, res) => {
    res.status(201).json(await recordCheck(actorOf(res), parsed(res, 'body', checkRecordCreateSchema)));
  });
  router.delete('/check-records/:id', validate('params', params), requireRemovalReason(), async (_req, res) => {
    await deleteCheckRecord(storage, actorOf(res), parsed(res, 'params', params).id, removalOf(res));
    res.status(204).end();
  });
  return router;
}
