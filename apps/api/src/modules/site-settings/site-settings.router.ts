import { Router } from 'express';
import {
  siteSettingChangeSchema,
  siteSettingParamsSchema,
  siteSettingsParamsSchema,
} from '@kerfline/domain/settings/schema';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { changeSiteSetting, listSiteSettings, resetSiteSetting } from './site-settings.service.js';

export function siteSettingsRouter(): Router {
  const router = Router();
  router.get('/sites/:siteId/settings', validate('params', siteSettingsParamsSchema), async (_req, res) => {
    res.json(await listSiteSettings(abilityOf(res), parsed(res, 'params', siteSettingsParamsSchema).siteId));
  });
  router.put(
    '/sites/:siteId/settings/:key',
    validate('params', siteSettingParamsSchema),
    validate('body', siteSettingChangeSchema),
    async (_req, res) => {
      const { siteId, key } = parsed(res, 'params', siteSettingParamsSchema);
      const { value } = parsed(res, 'body', siteSettingChangeSchema);
      res.json(await changeSiteSetting(actorOf(res), siteId, key, value));
    },
  );
  // Removing the site's own value puts it back on the shipped one.
  router.delete('/sites/:siteId/settings/:key', validate('params', siteSettingParamsSchema), async (_req, res) => {
    const { siteId, key } = parsed(res, 'params', siteSettingParamsSchema);
    res.json(await resetSiteSetting(actorOf(res), siteId, key));
  });
  return router;
}
