import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import { fleetSawSchema } from '../fleet/schema.js';
import { MATERIAL_GROUPS } from '../band-speed/schema.js';
import { SAW_KINDS } from '../saws/schema.js';
import { UNIT_SYSTEMS } from '../sites/schema.js';
import { REMOVAL_REASONS } from '../diagnosis/schema.js';
import { FOLLOW_UP_STATES } from '../follow-ups/schema.js';
import { PEER_METRICS } from './peer-review.js';

const metricValues = z.record(z.enum(PEER_METRICS), z.number().nullable());

export const peerFlagSchema = z.object({
  sawId: idSchema,
  metric: z.enum(PEER_METRICS),
  groupKey: z.string(),
  value: z.number(),
  peerMedian: z.number(),
  peerCount: z.number().int(),
  modifiedZ: z.number(),
  direction: z.enum(['high', 'low']),
  ratioToMedian: z.number().nullable(),
  threshold: z.number(),
  scale: z.enum(['mad', 'mean_absolute_deviation']),
  method: z.string(),
});

export const peerGroupSchema = z.object({
  key: z.string(),
  kind: z.enum(SAW_KINDS),
  mainMaterial: z.enum(MATERIAL_GROUPS).nullable(),
  sawIds: z.array(idSchema),
  metrics: z.record(
    z.enum(PEER_METRICS),
    z.object({ judged: z.number().int(), median: z.number().nullable(), notice: z.string().nullable() }),
  ),
});

const reviewedSawSchema = z.object({
  saw: fleetSawSchema,
  site: z.object({
    id: idSchema,
    code: z.string(),
    name: z.string(),
    colourIndex: z.number().int(),
    unitSystem: z.enum(UNIT_SYSTEMS),
  }),
  values: metricValues,
  bladesWithArea: z.number().int(),
  scheduledHours: z.number(),
  /** The newest follow-up not yet done, if any. */
  activeFollowUp: z.object({ id: idSchema, state: z.enum(FOLLOW_UP_STATES), dueOn: z.string() }).nullable(),
});

export const outlierReviewSchema = z.object({
  period: z.object({ from: z.string(), to: z.string() }),
  asOf: z.string(),
  reportingCurrency: z.string(),
  saws: z.array(reviewedSawSchema),
  groups: z.array(peerGroupSchema),
  flags: z.array(peerFlagSchema),
  notJudged: z.array(z.object({ sawId: idSchema, metric: z.enum(PEER_METRICS), reason: z.string() })),
  warnings: z.array(z.string()),
});
export type OutlierReview = z.infer<typeof outlierReviewSchema>;

const causeSchema = z.object({
  cause: z.string(),
  label: z.string(),
  advice: z.string(),
  score: z.number(),
  evidence: z.array(z.object({ text: z.string(), effect: z.number() })),
});

/** One saw among its peers: each figure's verdict, its failure-reason mix beside its peers' and the likely causes. */
export const sawOutlierSchema = z.object({
  period: z.object({ from: z.string(), to: z.string() }),
  asOf: z.string(),
  reportingCurrency: z.string(),
  saw: reviewedSawSchema,
  group: peerGroupSchema,
  peers: z.array(reviewedSawSchema),
  flags: z.array(peerFlagSchema),
  notJudged: z.array(z.object({ metric: z.enum(PEER_METRICS), reason: z.string() })),
  reasonMix: z.array(
    z.object({
      reason: z.enum(REMOVAL_REASONS),
      saw: z.number().int(),
      sawShare: z.number(),
      peers: z.number().int(),
      peerShare: z.number(),
    }),
  ),
  standoutReason: z.enum(REMOVAL_REASONS).nullable(),
  likelyCauses: z
    .object({
      mode: z.string(),
      modeLabel: z.string(),
      basis: z.string(),
      causes: z.array(causeSchema),
      evidenceUsed: z.object({ cutLogs: z.number().int(), breakInSkippedShare: z.number().nullable() }),
    })
    .nullable(),
  warnings: z.array(z.string()),
});
export type SawOutlier = z.infer<typeof sawOutlierSchema>;
