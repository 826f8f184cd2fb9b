import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';
import { materialGroupSchema, MATERIAL_GROUPS } from '../band-speed/schema.js';
import { REMOVAL_REASONS, failureModeSchema } from '../diagnosis/schema.js';
import { CAUSE_IDS, type Diagnosis } from '../diagnosis/likely-causes.js';
import type { BreakInPlan } from '../break-in/break-in-plan.js';
import type { RecommendedBandSpeed, SpeedRangeMPerMin } from '../band-speed/speed-ranges.js';
import {
  dateRangeQueryFields,
  notesSchema,
  queryFlagSchema,
  recordTimeSchema,
  refineDateRange,
  type RecordWarning,
  exportUnitsField,
} from '../records/schema.js';

/**
 * A blade run is one blade's life on one saw: put on (who, when, the tension set, the material it is for,
 * whether break-in was followed), then taken off (when, why, what it cut). At most one run per saw is open
 * (the blade on the saw now), and runs on one saw never overlap in time; the database enforces both.
 */

/** Where a removed run's area and cuts come from. */
export const AREA_SOURCES = ['entered', 'cut_logs'] as const;
export type AreaSource = (typeof AREA_SOURCES)[number];

/** More than any band saw blade cuts in its life (1 000 m²): a figure above it is a unit slip. */
export const MAX_AREA_CUT_MM2 = 1e9;
/** More cuts than any blade makes (a million). */
export const MAX_CUTS = 1_000_000;

export const bladeRunSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  sawId: idSchema,
  sawAssetTag: z.string(),
  bladeSpecId: idSchema,
  bladeSpecName: z.string(),
  /** The stock receipt the blade was drawn from; null when it did not come from recorded stock. */
  stockReceiptId: idSchema.nullable(),
  installedAt: z.string(),
  installedById: idSchema.nullable(),
  installedByName: z.string().nullable(),
  tensionMpa: z.number().nullable(),
  materialGroup: z.enum(MATERIAL_GROUPS).nullable(),
  /** Null: not recorded yet. */
  breakInFollowed: z.boolean().nullable(),
  installNotes: z.string().nullable(),
  /** The blade's cost, fixed at install from its stock receipt or, failing that, its spec. */
  costMinor: z.number().int(),
  currency: z.string(),
  removedAt: z.string().nullable(),
  removedById: idSchema.nullable(),
  removedByName: z.string().nullable(),
  removalReason: z.enum(REMOVAL_REASONS).nullable(),
  areaCutMm2: z.number().nullable(),
  cuts: z.number().int().nullable(),
  areaSource: z.enum(AREA_SOURCES).nullable(),
  removalNotes: z.string().nullable(),
  /** The likely cause a person confirmed after removal, with who and when. */
  confirmedCause: z.enum(CAUSE_IDS).nullable(),
  confirmedCauseAt: z.string().nullable(),
  confirmedCauseById: idSchema.nullable(),
  photoCount: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type BladeRun = z.infer<typeof bladeRunSchema>;

const tensionSchema = z
  .number({ message: 'Tension must be a number (MPa)' })
  .positive({ message: 'Tension must be greater than 0 MPa' })
  .max(600, { message: 'Tension must be at most 600 MPa (band steel yields well below that)' })
  .nullable();

const areaCutSchema = z
  .number({ message: 'Area cut must be a number (mm²)' })
  .min(0, { message: 'Area cut must not be negative' })
  .max(MAX_AREA_CUT_MM2, { message: 'Area cut must be at most 1,000,000,000 mm² (1 000 m²); check the units' });

const cutsSchema = z
  .number({ message: 'Cuts must be a number' })
  .int({ message: 'Cuts must be a whole number' })
  .min(0, { message: 'Cuts must not be negative' })
  .max(MAX_CUTS, { message: `Cuts must be at most ${MAX_CUTS.toLocaleString('en-US')}` });

const breakInFollowedSchema = z.boolean({ message: 'Break-in followed must be true, false or null' }).nullable();

/** Putting a blade on a saw. The time defaults to now; the site is the saw's. */
export const bladeRunInstallSchema = z
  .object({
    sawId: idSchema,
    bladeSpecId: idSchema,
    installedAt: recordTimeSchema('Installed at').optional(),
    tensionMpa: tensionSchema.default(null),
    materialGroup: materialGroupSchema.nullable().default(null),
    breakInFollowed: breakInFollowedSchema.default(null),
    notes: notesSchema.default(null),
  })
  .strict();
export type BladeRunInstall = z.input<typeof bladeRunInstallSchema>;
export type BladeRunInstallParsed = z.output<typeof bladeRunInstallSchema>;

/**
 * Taking a blade off. Area cut and cuts may be entered, either or both; left out, they are summed from the
 * run's cut logs when there are any.
 */
export const bladeRunRemoveSchema = z
  .object({
    removedAt: recordTimeSchema('Removed at').optional(),
    reason: z.enum(REMOVAL_REASONS, { message: `Reason must be one of ${REMOVAL_REASONS.join(', ')}` }),
    areaCutMm2: areaCutSchema.nullable().default(null),
    cuts: cutsSchema.nullable().default(null),
    notes: notesSchema.default(null),
  })
  .strict();
export type BladeRunRemove = z.input<typeof bladeRunRemoveSchema>;
export type BladeRunRemoveParsed = z.output<typeof bladeRunRemoveSchema>;

/** Corrections to a run. Removal fields only apply to a run that has been taken off. */
export const bladeRunUpdateSchema = z
  .object({
    installedAt: recordTimeSchema('Installed at'),
    tensionMpa: tensionSchema,
    materialGroup: materialGroupSchema.nullable(),
    breakInFollowed: breakInFollowedSchema,
    installNotes: notesSchema,
    removedAt: recordTimeSchema('Removed at'),
    removalReason: z.enum(REMOVAL_REASONS, { message: `Reason must be one of ${REMOVAL_REASONS.join(', ')}` }),
    areaCutMm2: areaCutSchema.nullable(),
    cuts: cutsSchema.nullable(),
    removalNotes: notesSchema,
  })
  .partial()
  .strict();
export type BladeRunUpdate = z.infer<typeof bladeRunUpdateSchema>;

export const BLADE_RUN_SORTS = ['installedAt', '-installedAt', 'removedAt', '-removedAt'] as const;

const bladeRunFilterFields = {
  siteId: idSchema.optional(),
  sawId: idSchema.optional(),
  bladeSpecId: idSchema.optional(),
  reason: z.enum(REMOVAL_REASONS).optional(),
  /** true: blades on saws now; false: removed blades only. */
  open: queryFlagSchema.optional(),
  /** On installedAt. */
  ...dateRangeQueryFields,
  sort: z.enum(BLADE_RUN_SORTS).default('-installedAt'),
};

export const bladeRunListQuerySchema = pageQuerySchema.extend(bladeRunFilterFields).superRefine(refineDateRange);
export type BladeRunListQuery = z.infer<typeof bladeRunListQuerySchema>;

/** The list's filters without paging, and the units: the CSV export of the same table. */
export const bladeRunExportQuerySchema = z
  .object({ ...bladeRunFilterFields, ...exportUnitsField })
  .superRefine(refineDateRange);
export type BladeRunExportQuery = z.infer<typeof bladeRunExportQuerySchema>;

/** The ranked likely causes for a run; `reason` defaults to the run's removal reason. */
export const likelyCausesQuerySchema = z.object({ reason: failureModeSchema.optional() });
export type LikelyCausesQuery = z.infer<typeof likelyCausesQuerySchema>;

export const confirmCauseSchema = z
  .object({ cause: z.enum(CAUSE_IDS, { message: `Cause must be one of ${CAUSE_IDS.join(', ')}` }) })
  .strict();
export type ConfirmCause = z.infer<typeof confirmCauseSchema>;

/** Likely causes of a run's failure, with what evidence from the saw fed the ranking. */
export interface RunDiagnosis extends Diagnosis {
  runId: string;
  confirmedCause: string | null;
  evidenceUsed: {
    /** Cut logs of this saw during the run. */
    cutLogs: number;
    /** Maintenance checks of this saw (none until checks are recorded). */
    checks: number;
    breakInFollowed: boolean | null;
  };
}

export const breakInAdviceQuerySchema = z.object({
  bladeSpecId: idSchema,
  materialGroup: materialGroupSchema.optional(),
});
export type BreakInAdviceQuery = z.infer<typeof breakInAdviceQuerySchema>;

/** The break-in plan for a saw, band and material, as the install form shows it. */
export interface BreakInAdvice {
  sawId: string;
  bladeSpecId: string;
  materialGroup: string | null;
  plan: BreakInPlan;
  /**
   * This saw's usual cutting rate for the material, mm²/min, from its recent cut logs (median); null when it
   * has none, and the plan is then given in minutes only.
   */
  normalCuttingRateMm2PerMin: number | null;
  cuttingRateBasis: string;
  /** The recommended band speed for the material and the part of it this saw can run. */
  bandSpeed: { recommended: RecommendedBandSpeed; reachableMPerMin: SpeedRangeMPerMin | null } | null;
  /** A spec that does not match the saw's band, and the like. */
  warnings: RecordWarning[];
}

export type BladeRunInstallResult = { run: BladeRun; breakIn: BreakInAdvice; warnings: RecordWarning[] };
