import { Router } from 'express';
import { z } from 'zod';
import { siteCreateSchema, siteListQuerySchema, siteUpdateSchema } from '@kerfline/domain/sites/schema';
import { idSchema } from '@kerfline/domain/common/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { createSite, getSite, listSites, setSiteRetired, updateSite } from './sites.service.js';

const params = z.object({ id: idSchema });

export function sitesRouter(): Router {
  const router = Router();
  router.get('/sites', validate('query', siteListQuerySchema), async (_req, res) => {
    res.json(await listSites(abilityOf(res), parsed(res, 'query', siteListQuerySchema)));
  });
  router.get('/sites/:id', validate('params', params), async (_req, res) => {
    res.json(await getSite(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/sites', validate('body', siteCreateSchema), async (_req, res) => {
    res.status(201).json(await createSite(actorOf(res), parsed(res, 'body', siteCreateSchema)));
  });
  router.patch('/sites/:id', validate('params', params), validate('body', siteUpdateSchema), async (_req, res) => {
    res.json(await updateSite(actorOf(res), parsed(res, 'params', params).id, parsed(res, 'body', siteUpdateSchema)));
  });
  router.post('/sites/:id/retire', validate('params', params), async (_req, res) => {
    res.json(await setSiteRetired(actorOf(res), parsed(res, 'params', params).id, true));
  });
  router.post('/sites/:id/restore', validate('params', params), async (_req, res) => {
    res.json(await setSiteRetired(actorOf(res), parsed(res, 'params', params).id, false));
  });
  return router;
}
