import { Router } from 'express';
import { siteSummaryQuerySchema } from '@kerfline/domain/site-summaries/schema';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { listSiteSummaries } from './site-summaries.service.js';

export function siteSummariesRouter(): Router {
  const router = Router();
  router.get('/site-summaries', validate('query', siteSummaryQuerySchema), async (_req, res) => {
    res.json(await listSiteSummaries(abilityOf(res), parsed(res, 'query', siteSummaryQuerySchema)));
  });
  return router;
}
