import { z } from 'zod';
import { idSchema } from '../common/schema.js';
import { MATERIAL_GROUPS } from '../band-speed/schema.js';
import { BREAK_IN_MODES } from '../break-in/schema.js';
import { FAILURE_MODES } from '../diagnosis/schema.js';
import { CAUSE_IDS } from '../diagnosis/likely-causes.js';
import { figureBasisSchema } from '../figures/basis.js';
import { recordWarningSchema } from '../records/schema.js';
import { bladeRunSchema, type BladeRunInstallResult, type BreakInAdvice, type RunDiagnosis } from './schema.js';

/**
 * The blade runs' computed answers (break-in advice, likely causes) as they travel: the shapes the API sends,
 * for the web to parse at its boundary like every other answer. Each is checked against the domain type it
 * mirrors, so the two cannot drift apart.
 */

const speedRangeSchema = z.object({ minMPerMin: z.number(), maxMPerMin: z.number() });

export const recommendedBandSpeedSchema = speedRangeSchema.extend({
  minFpm: z.number(),
  maxFpm: z.number(),
  reference: speedRangeSchema,
  basis: figureBasisSchema,
  corrections: z.array(
    z.object({ label: z.string(), factor: z.union([z.number(), z.object({ top: z.number(), bottom: z.number() })]) }),
  ),
  correctionBasis: figureBasisSchema.nullable(),
});

export const breakInStepSchema = z.object({
  kind: z.enum(['reduced', 'ramp', 'normal']),
  feedFraction: z.number(),
  bandSpeedFraction: z.number(),
  durationMin: z.number().nullable(),
  areaMm2: z.number().nullable(),
  note: z.string(),
});

export const breakInPlanSchema = z.object({
  mode: z.enum(BREAK_IN_MODES),
  steps: z.array(breakInStepSchema),
  totalDurationMin: z.number().nullable(),
  totalAreaMm2: z.number().nullable(),
  normalCuttingRateMm2PerMin: z.number().nullable(),
  bandSpeed: z
    .object({
      materialGroup: z.enum(MATERIAL_GROUPS),
      normal: recommendedBandSpeedSchema,
      breakInMinMPerMin: z.number(),
      breakInMaxMPerMin: z.number(),
    })
    .nullable(),
  basis: figureBasisSchema,
});

export const breakInAdviceSchema = z.object({
  sawId: idSchema,
  bladeSpecId: idSchema,
  materialGroup: z.enum(MATERIAL_GROUPS).nullable(),
  plan: breakInPlanSchema,
  normalCuttingRateMm2PerMin: z.number().nullable(),
  cuttingRateBasis: z.string(),
  bandSpeed: z
    .object({ recommended: recommendedBandSpeedSchema, reachableMPerMin: speedRangeSchema.nullable() })
    .nullable(),
  warnings: z.array(recordWarningSchema),
});

export const bladeRunInstallResultSchema = z.object({
  run: bladeRunSchema,
  breakIn: breakInAdviceSchema,
  warnings: z.array(recordWarningSchema),
});

export const rankedCauseSchema = z.object({
  cause: z.enum(CAUSE_IDS),
  label: z.string(),
  advice: z.string(),
  baseWeight: z.number(),
  score: z.number(),
  evidence: z.array(z.object({ text: z.string(), effect: z.number() })),
});

export const runDiagnosisSchema = z.object({
  mode: z.enum(FAILURE_MODES),
  modeLabel: z.string(),
  causes: z.array(rankedCauseSchema),
  basis: z.string(),
  runId: idSchema,
  confirmedCause: z.enum(CAUSE_IDS).nullable(),
  evidenceUsed: z.object({
    cutLogs: z.number().int(),
    checks: z.number().int(),
    breakInFollowed: z.boolean().nullable(),
  }),
});

// Compile-time checks: what a wire schema parses can be used as the domain type it mirrors (the wire is stricter
// where the domain says `string`: a material group, a cause id). wire.test.ts parses real domain output.
type Fits<Wire, Domain> = [Wire] extends [Domain] ? true : never;
export const WIRE_FITS_DOMAIN: [
  Fits<z.infer<typeof breakInAdviceSchema>, BreakInAdvice>,
  Fits<z.infer<typeof runDiagnosisSchema>, RunDiagnosis>,
  Fits<z.infer<typeof bladeRunInstallResultSchema>, BladeRunInstallResult>,
] = [true, true, true];

/** The break-in advice as the web parses it (material group and causes typed as the domain's ids). */
export type BreakInAdviceOnWire = z.infer<typeof breakInAdviceSchema>;
export type RunDiagnosisOnWire = z.infer<typeof runDiagnosisSchema>;
