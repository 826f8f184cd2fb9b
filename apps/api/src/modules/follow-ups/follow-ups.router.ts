import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import {
  FOLLOW_UP_STATE_LABELS,
  followUpCreateSchema,
  followUpListQuerySchema,
  followUpUpdateSchema,
} from '@kerfline/domain/follow-ups/schema';
import { PEER_METRIC_INFO } from '@kerfline/domain/outliers/peer-review';
import { abilityOf, actorOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { streamCsv } from '../../http/csv.js';
import { AppError } from '../../errors.js';
import { createFollowUp, getFollowUp, listAssignees, listFollowUps, updateFollowUp } from './follow-ups.service.js';

const params = z.object({ id: idSchema });
const assigneesQuery = z.object({ siteId: idSchema });
const exportQuery = followUpListQuerySchema.omit({ limit: true, offset: true });

export function followUpsRouter(): Router {
  const router = Router();
  router.get('/follow-ups', validate('query', followUpListQuerySchema), async (_req, res) => {
    res.json(await listFollowUps(abilityOf(res), parsed(res, 'query', followUpListQuerySchema)));
  });
  router.get('/follow-ups/assignees', validate('query', assigneesQuery), async (_req, res) => {
    res.json(await listAssignees(abilityOf(res), parsed(res, 'query', assigneesQuery).siteId));
  });
  router.get('/follow-ups/export', validate('query', exportQuery), async (_req, res) => {
    const ability = abilityOf(res);
    if (!ability.can('export', 'Site')) throw new AppError('FORBIDDEN', 'Your role does not export figures');
    const q = parsed(res, 'query', exportQuery);
    const first = await listFollowUps(ability, { ...q, limit: 500, offset: 0 });
    // Paged through the same scoped list the screen reads, 500 at a time.
    async function* batches() {
      let page = first;
      for (let offset = 0; ;) {
        yield page.items.map((f) => [
          f.siteName,
          f.sawAssetTag,
          f.title,
          f.flag ? PEER_METRIC_INFO[f.flag.metric].label : null,
          FOLLOW_UP_STATE_LABELS[f.state],
          f.overdue,
          f.assignee?.name ?? null,
          f.dueOn,
          f.createdBy?.name ?? null,
          f.createdAt,
          f.doneAt,
        ]);
        offset += page.items.length;
        if (page.items.length === 0 || offset >= page.total) return;
        page = await listFollowUps(ability, { ...q, limit: 500, offset });
      }
    }
    await streamCsv(
      res,
      'follow-ups',
      [
        'Site',
        'Asset tag',
        'Follow-up',
        'From the flag on',
        'State',
        'Overdue',
        'Assigned to',
        'Due',
        'Opened by',
        'Opened at',
        'Done at',
      ],
      first.total,
      batches(),
    );
  });
  router.get('/follow-ups/:id', validate('params', params), async (_req, res) => {
    res.json(await getFollowUp(abilityOf(res), parsed(res, 'params', params).id));
  });
  router.post('/follow-ups', validate('body', followUpCreateSchema), async (_req, res) => {
    res.status(201).json(await createFollowUp(actorOf(res), parsed(res, 'body', followUpCreateSchema)));
  });
  router.patch(
    '/follow-ups/:id',
    validate('params', params),
    validate('body', followUpUpdateSchema),
    async (_req, res) => {
      res.json(
        await updateFollowUp(actorOf(res), parsed(res, 'params', params).id, parsed(res, 'body', followUpUpdateSchema)),
      );
    },
  );
  return router;
}
