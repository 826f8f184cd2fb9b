import { Router } from 'express';
import { z } from 'zod';
import { mailLogQuerySchema, mailPreferenceUpdateSchema } from '@kerfline/domain/mail/schema';
import { pageQuerySchema } from '@kerfline/domain/common/schema';
import { abilityOf, signedInOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import {
  assertMayRunSchedules,
  getMailPreferences,
  listMailLog,
  readOutbox,
  setMailPreference,
} from './mail.service.js';

const runParams = z.object({ schedule: z.enum(['weekly-digest', 'monthly-summary']) });

export function mailRouter(deps: {
  catcherDir?: string | undefined;
  /** Queues a scheduled run now (the jobs runtime's `fire`). */
  runSchedule: (schedule: z.infer<typeof runParams>['schedule']) => Promise<void>;
}): Router {
  const router = Router();
  router.get('/me/mail-preferences', async (_req, res) => {
    res.json(await getMailPreferences(signedInOf(res).user));
  });
  router.patch('/me/mail-preferences', validate('body', mailPreferenceUpdateSchema), async (_req, res) => {
    res.json(await setMailPreference(signedInOf(res).user, parsed(res, 'body', mailPreferenceUpdateSchema)));
  });
  router.get('/mail-log', validate('query', mailLogQuerySchema), async (_req, res) => {
    res.json(await listMailLog(abilityOf(res), parsed(res, 'query', mailLogQuerySchema)));
  });
  router.get('/outbox', validate('query', pageQuerySchema), async (_req, res) => {
    res.json(await readOutbox(abilityOf(res), deps.catcherDir, parsed(res, 'query', pageQuerySchema)));
  });
  router.post('/mail/schedules/:schedule/run', validate('params', runParams), async (_req, res) => {
    assertMayRunSchedules(abilityOf(res));
    await deps.runSchedule(parsed(res, 'params', runParams).schedule);
    res.status(202).json({ message: 'Queued: each person gets at most one per period, so repeats send nothing new.' });
  });
  return router;
}
