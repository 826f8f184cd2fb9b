import { Router } from 'express';
import { auditListQuerySchema } from '@kerfline/domain/audit/schema';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { listAudit } from './audit.service.js';

export function auditRouter(): Router {
  const router = Router();
  router.get('/audit', validate('query', auditListQuerySchema), async (_req, res) => {
    res.json(await listAudit(abilityOf(res), parsed(res, 'query', auditListQuerySchema)));
  });
  return router;
}
