import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import {
  fleetQuerySchema,
  overviewExportQuerySchema,
  periodQuerySchema,
  periodRunsQuerySchema,
  practiceExportQuerySchema,
  sawExportQuerySchema,
  siteExportQuerySchema,
} from '@kerfline/domain/fleet/schema';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { sendCsv, streamCsv } from '../../http/csv.js';
import {
  countSawRuns,
  eachSawRun,
  getFleetRun,
  getOverview,
  getPractice,
  getSawFigures,
  getSiteFigures,
  listSawRuns,
  readableSaw,
} from './fleet.service.js';
import {
  assertExportable,
  overviewTable,
  practiceTable,
  runCells,
  runHeader,
  sawTable,
  siteTable,
} from './fleet-csv.js';

const siteParams = z.object({ siteId: idSchema });
const sawParams = z.object({ sawId: idSchema });
const runParams = z.object({ runId: idSchema });

/** The fleet figures: overview, a site, a saw, a blade run, practice compared; each table also as CSV. */
export function fleetRouter(): Router {
  const router = Router();
  router.get('/fleet/overview', validate('query', fleetQuerySchema), async (_req, res) => {
    res.json(await getOverview(abilityOf(res), parsed(res, 'query', fleetQuerySchema)));
  });
  router.get('/fleet/overview/export', validate('query', overviewExportQuerySchema), async (_req, res) => {
    const q = parsed(res, 'query', overviewExportQuerySchema);
    const overview = await getOverview(abilityOf(res), q);
    assertExportable(
      abilityOf(res),
      overview.sites.map((s) => s.site),
    );
    await sendCsv(res, `fleet-${q.table}-${q.from}-${q.to}`, overviewTable(overview, q.table, q.units));
  });
  router.get('/fleet/practice', validate('query', fleetQuerySchema), async (_req, res) => {
    res.json(await getPractice(abilityOf(res), parsed(res, 'query', fleetQuerySchema)));
  });
  router.get('/fleet/practice/export', validate('query', practiceExportQuerySchema), async (_req, res) => {
    const q = parsed(res, 'query', practiceExportQuerySchema);
    const practice = await getPractice(abilityOf(res), q);
    assertExportable(
      abilityOf(res),
      practice.sites.map((s) => s.site),
    );
    await sendCsv(res, `practice-${q.from}-${q.to}`, practiceTable(practice, q.units));
  });
  router.get(
    '/fleet/sites/:siteId',
    validate('params', siteParams),
    validate('query', periodQuerySchema),
    async (_req, res) => {
      const { siteId } = parsed(res, 'params', siteParams);
      res.json(await getSiteFigures(abilityOf(res), siteId, parsed(res, 'query', periodQuerySchema)));
    },
  );
  router.get(
    '/fleet/sites/:siteId/export',
    validate('params', siteParams),
    validate('query', siteExportQuerySchema),
    async (_req, res) => {
      const q = parsed(res, 'query', siteExportQuerySchema);
      const figures = await getSiteFigures(abilityOf(res), parsed(res, 'params', siteParams).siteId, q);
      assertExportable(abilityOf(res), [figures.site]);
      await sendCsv(res, `${figures.site.code}-${q.table}-${q.from}-${q.to}`, siteTable(figures, q.table, q.units));
    },
  );
  router.get(
    '/fleet/saws/:sawId',
    validate('params', sawParams),
    validate('query', periodQuerySchema),
    async (_req, res) => {
      const { sawId } = parsed(res, 'params', sawParams);
      res.json(await getSawFigures(abilityOf(res), sawId, parsed(res, 'query', periodQuerySchema)));
    },
  );
  router.get(
    '/fleet/saws/:sawId/runs',
    validate('params', sawParams),
    validate('query', periodRunsQuerySchema),
    async (_req, res) => {
      const { sawId } = parsed(res, 'params', sawParams);
      res.json(await listSawRuns(abilityOf(res), sawId, parsed(res, 'query', periodRunsQuerySchema)));
    },
  );
  router.get(
    '/fleet/saws/:sawId/export',
    validate('params', sawParams),
    validate('query', sawExportQuerySchema),
    async (_req, res) => {
      const ability = abilityOf(res);
      const q = parsed(res, 'query', sawExportQuerySchema);
      const { sawId } = parsed(res, 'params', sawParams);
      if (q.table !== 'runs') {
        const figures = await getSawFigures(ability, sawId, q);
        assertExportable(ability, [figures.site]);
        await sendCsv(res, `${figures.saw.assetTag}-${q.table}-${q.from}-${q.to}`, sawTable(figures, q.table, q.units));
        return;
      }
      // The runs need the saw, not its figures. They can be many: counted first for the progress bar, then
      // streamed a thousand at a time.
      const readable = await readableSaw(ability, sawId);
      assertExportable(ability, [readable.site]);
      const name = `${readable.saw.assetTag}-${q.table}-${q.from}-${q.to}`;
      const total = await countSawRuns(ability, readable, q);
      async function* batches() {
        for await (const runs of eachSawRun(ability, readable, q)) yield runs.map((r) => runCells(r, q.units));
      }
      await streamCsv(res, name, runHeader(q.units), total, batches());
    },
  );
  router.get('/fleet/runs/:runId', validate('params', runParams), async (_req, res) => {
    res.json(await getFleetRun(abilityOf(res), parsed(res, 'params', runParams).runId));
  });
  return router;
}
