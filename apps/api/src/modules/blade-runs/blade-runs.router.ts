import { Router } from 'express';
import { z } from 'zod';
import {
  bladeRunInstallSchema,
  bladeRunExportQuerySchema,
  bladeRunListQuerySchema,
  bladeRunRemoveSchema,
  bladeRunUpdateSchema,
  breakInAdviceQuerySchema,
  confirmCauseSchema,
  likelyCausesQuerySchema,
} from '@kerfline/domain/blade-runs/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import type { Actor } from '../../audit/write-audit.js';
import { parsed, validate } from '../../http/validate.js';
import { removalOf, requireRemovalReason } from '../../http/removal-reason.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import {
  confirmCause,
  deleteBladeRun,
  getBladeRun,
  getBreakInAdvice,
  getLikelyCauses,
  installBladeRun,
  listBladeRuns,
  removeBladeRun,
  updateBladeRun,
} from './blade-runs.service.js';
import { exportName, exportScope, exportUnits, streamListCsv } from '../records/record-export.js';
import { bladeRunCells, bladeRunHeader } from '../records/record-csv.js';

const params = z.object({ id: idSchema });

/** What follows a blade drawn from a site's stock (the low-stock notice); it never undoes the install. */
export type AfterStockDrawn = (actor: Actor, siteId: string, bladeSpecId: string) => Promise<unknown>;

/** `storage` keeps the photos of a run that is removed. */
export function bladeRunsRouter(storage: PhotoStorage, afterStockDrawn?: AfterStockDrawn): Router {
  const router = Router();
  router.get('/blade-runs', validate('query', bladeRunListQuerySchema), async (_req, res) => {
    res.json(await listBladeRuns(abilityOf(res), parsed(res, 'query', bladeRunListQuerySchema)));
  });
  // The table as CSV: the same filters and scope, paged through the same list a thousand rows at a time.
  router.get('/blade-runs/export', validate('query', bladeRunExportQuerySchema), async (_req, res) => {
    const ability = abilityOf(res);
    const { units, ...filters } = parsed(res, 'query', bladeRunExportQuerySchema);
    const scope = await exportScope(ability, filters.siteId);
    const system = exportUnits(units, scope);
    await streamListCsv(
      res,
      exportName(scope, 'blade-runs'),
      bladeRunHeader(system),
      (limit, offset) => listBladeRuns(ability, { ...filters, limit, offset }),
      (run) => bladeRunCells(run, system),
    );
  });
  router.get('/blade-runs/:id', validate('params', params), async (_req, res) => {
    res.json(await getBladeRun(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/blade-runs', validate('body', bladeRunInstallSchema), async (_req, res) => {
    const actor = actorOf(res);
    const result = await installBladeRun(actor, parsed(res, 'body', bladeRunInstallSchema));
    if (afterStockDrawn && result.run.stockReceiptId !== null)
      await afterStockDrawn(actor, result.run.siteId, result.run.bladeSpecId).catch((err: unknown) =>
        res.log.error({ err }, 'the low-stock check after a blade was drawn failed; the blade is on the saw'),
      );
    res.status(201).json(result);
  });
  router.post(
    '/blade-runs/:id/remove',
    validate('params', params),
    validate('body', bladeRunRemoveSchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await removeBladeRun(actorOf(res), id, parsed(res, 'body', bladeRunRemoveSchema)));
    },
  );
  router.patch(
    '/blade-runs/:id',
    validate('params', params),
    validate('body', bladeRunUpdateSchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await updateBladeRun(actorOf(res), id, parsed(res, 'body', bladeRunUpdateSchema)));
    },
  );
  router.delete('/blade-runs/:id', validate('params', params), requireRemovalReason(), async (_req, res) => {
    await deleteBladeRun(storage, actorOf(res), parsed(res, 'params', params).id, removalOf(res));
    res.status(204).end();
  });
  router.get(
    '/blade-runs/:id/likely-causes',
    validate('params', params),
    validate('query', likelyCausesQuerySchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await getLikelyCauses(abilityOf(res), id, parsed(res, 'query', likelyCausesQuerySchema)));
    },
  );
  router.post(
    '/blade-runs/:id/confirmed-cause',
    validate('params', params),
    validate('body', confirmCauseSchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await confirmCause(actorOf(res), id, parsed(res, 'body', confirmCauseSchema)));
    },
  );
  router.get(
    '/saws/:id/break-in-plan',
    validate('params', params),
    validate('query', breakInAdviceQuerySchema),
    async (_req, res) => {
      const { id } = parsed(res, 'params', params);
      res.json(await getBreakInAdvice(abilityOf(res), id, parsed(res, 'query', breakInAdviceQuerySchema)));
    },
  );
  return router;
}
