import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '@kerfline/domain/common/schema';
import { fleetQuerySchema, periodQuerySchema } from '@kerfline/domain/fleet/schema';
import { PEER_METRIC_INFO } from '@kerfline/domain/outliers/peer-review';
import { abilityOf } from '../../http/authenticate.js';
import { parsed, validate } from '../../http/validate.js';
import { sendCsv } from '../../http/csv.js';
import { assertExportable } from '../fleet/fleet-csv.js';
import { fleetSites } from '../fleet/assemble.js';
import { getOutlierReview, getSawOutlier } from './outliers.service.js';

const sawParams = z.object({ sawId: idSchema });

export function outliersRouter(): Router {
  const router = Router();
  router.get('/outliers', validate('query', fleetQuerySchema), async (_req, res) => {
    res.json(await getOutlierReview(abilityOf(res), parsed(res, 'query', fleetQuerySchema)));
  });
  router.get('/outliers/export', validate('query', fleetQuerySchema), async (_req, res) => {
    const ability = abilityOf(res);
    const q = parsed(res, 'query', fleetQuerySchema);
    const review = await getOutlierReview(ability, q);
    assertExportable(ability, await fleetSites(ability, { only: [...new Set(review.saws.map((s) => s.site.id))] }));
    const sawOf = new Map(review.saws.map((s) => [s.saw.id, s]));
    const line = (sawId: string) => [
      sawOf.get(sawId)!.site.code,
      sawOf.get(sawId)!.saw.assetTag,
      sawOf.get(sawId)!.saw.name,
    ];
    // Values in the figures' own units (mm² per blade, reporting-currency minor units per mm², per 1 000 h): the
    // unit column says which.
    await sendCsv(res, `outliers-${q.from}-${q.to}`, {
      header: [
        'Site code',
        'Asset tag',
        'Saw',
        'Figure',
        'Unit',
        'Verdict',
        'Value',
        'Peer median',
        'Comparable saws',
        'Modified z-score',
        'How it was judged',
      ],
      rows: [
        ...review.flags.map((f) => [
          ...line(f.sawId),
          PEER_METRIC_INFO[f.metric].label,
          PEER_METRIC_INFO[f.metric].unit,
          `Unusually ${f.direction}`,
          f.value,
          f.peerMedian,
          f.peerCount,
          f.modifiedZ,
          f.method,
        ]),
        ...review.notJudged.map((n) => [
          ...line(n.sawId),
          PEER_METRIC_INFO[n.metric].label,
          PEER_METRIC_INFO[n.metric].unit,
          'Not judged',
          sawOf.get(n.sawId)!.values[n.metric],
          null,
          null,
          null,
          n.reason,
        ]),
      ],
    });
  });
  router.get(
    '/outliers/saws/:sawId',
    validate('params', sawParams),
    validate('query', periodQuerySchema),
    async (_req, res) => {
      const { sawId } = parsed(res, 'params', sawParams);
      res.json(await getSawOutlier(abilityOf(res), sawId, parsed(res, 'query', periodQuerySchema)));
    },
  );
  return router;
}
