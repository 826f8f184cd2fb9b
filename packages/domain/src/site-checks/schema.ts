import { z } from 'zod';
import { idSchema, pageQuerySchema, text } from '../common/schema.js';
import { figureBasisSchema } from '../figures/basis.js';
import {
  dateRangeQueryFields,
  notesSchema,
  queryFlagSchema,
  recordTimeSchema,
  refineDateRange,
  exportUnitsField,
} from '../records/schema.js';
import { CHECK_KIND_IDS, CHECK_KINDS, type CheckKindId } from '../checks/schema.js';
import { DEFAULT_BLADE_CHANGE_GRACE_HOURS, DEFAULT_PERIODIC_GRACE_HOURS, DUE_STATES } from '../checks/check-due.js';

/**
 * A site's own list of maintenance checks, and the checks recorded against it. Each check on the list says what
 * is measured, in which quantity, how its target is found (one of the trade's target rules, whose limits are the
 * site's settings, or a fixed value with its limits typed into the list) and when it falls due (at each blade
 * change, or every so many days). Every site starts from the shipped set (`CHECK_KINDS`) and its admin changes it.
 * Numbers are SI: millimetres, newtons, megapascals.
 */

/** How a check's target is found: one of the trade's rules (`checks/check-targets.ts`), or a fixed value. */
export const CHECK_TARGET_RULES = [...CHECK_KIND_IDS, 'fixed'] as const;
export type CheckTargetRule = (typeof CHECK_TARGET_RULES)[number];

export const CHECK_TARGET_RULE_LABELS: Record<CheckTargetRule, string> = {
  guide_clearance: 'Guide opening from the band thickness',
  tracking: 'Tracking overhang from the band width',
  feed_pressure: 'Head down-force limits',
  bearing_wear: 'Bearing face flat within a gap',
  band_tension: 'Tension range for the blade’s material',
  chip_brush: 'Brush reaches the gullets and is not worn',
  fixed: 'A fixed value with limits',
};

/** What a check reads: a length (mm), a force (N), a stress or pressure (MPa), or a condition (yes/no answers). */
export const CHECK_QUANTITIES = ['length', 'force', 'stress', 'condition'] as const;
export type CheckQuantity = (typeof CHECK_QUANTITIES)[number];

export const CHECK_QUANTITY_LABELS: Record<CheckQuantity, string> = {
  length: 'Length',
  force: 'Force',
  stress: 'Stress or pressure',
  condition: 'Condition (yes/no)',
};

/** The SI unit a check's numbers are stored and sent in. */
export const CHECK_QUANTITY_SI_UNIT: Record<Exclude<CheckQuantity, 'condition'>, string> = {
  length: 'mm',
  force: 'N',
  stress: 'MPa',
};

/** The quantity each rule reads. */
export const RULE_QUANTITY: Record<CheckKindId, CheckQuantity> = {
  guide_clearance: 'length',
  tracking: 'length',
  feed_pressure: 'force',
  bearing_wear: 'length',
  band_tension: 'stress',
  chip_brush: 'condition',
};

/**
 * The site settings each rule reads its limits from (`settings/registry.ts`). The check list names them in words
 * ("your site's setting …") instead of keeping a second copy of the numbers. Band tension reads the setting of the
 * blade's material.
 */
export const RULE_SETTING_KEYS: Record<CheckKindId, readonly string[]> = {
  guide_clearance: ['guide_clearance'],
  tracking: ['tracking'],
  feed_pressure: ['head_force'],
  bearing_wear: ['bearing_wear'],
  band_tension: ['band_tension.carbon', 'band_tension.bimetal', 'band_tension.carbide_tipped'],
  chip_brush: [],
};

export const CHECK_SCHEDULES = ['blade_change', 'periodic'] as const;
export type CheckScheduleName = (typeof CHECK_SCHEDULES)[number];

export const CHECK_SCHEDULE_LABELS: Record<CheckScheduleName, string> = {
  blade_change: 'At each blade change',
  periodic: 'Every so many days',
};

/** Default grace by schedule: one shift after a blade change, a day for periodic checks (our choices). */
export const DEFAULT_GRACE_HOURS: Record<CheckScheduleName, number> = {
  blade_change: DEFAULT_BLADE_CHANGE_GRACE_HOURS,
  periodic: DEFAULT_PERIODIC_GRACE_HOURS,
};

/** One check on a site's list, as the API returns it. */
export const siteCheckSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  name: z.string(),
  measures: z.string().nullable(),
  quantity: z.enum(CHECK_QUANTITIES),
  targetRule: z.enum(CHECK_TARGET_RULES),
  /** Fixed-value checks only, in the quantity's SI unit; null otherwise. */
  fixedTarget: z.number().nullable(),
  fixedMin: z.number().nullable(),
  fixedMax: z.number().nullable(),
  schedule: z.enum(CHECK_SCHEDULES),
  /** Periodic checks only. */
  intervalDays: z.number().int().nullable(),
  graceHours: z.number(),
  position: z.number().int(),
  /** Null while the check is on the list; a retired check keeps its records and is no longer due. */
  retiredAt: z.string().nullable(),
  recordCount: z.number().int(),
  createdAt: z.string(),
  updatedAt: z.string(),
  updatedById: idSchema.nullable(),
  updatedByName: z.string().nullable(),
});
export type SiteCheck = z.infer<typeof siteCheckSchema>;

const siFigure = (label: string) =>
  z
    .number({ message: `${label} must be a number` })
    .min(-100000, { message: `${label} must be at least −100,000` })
    .max(100000, { message: `${label} must be at most 100,000` });

/** The fields a site admin sets; the rules between them are in `refineSiteCheck`. */
const siteCheckFields = {
  name: text(120),
  measures: z
    .string()
    .trim()
    .max(300, { message: 'must be at most 300 characters' })
    .transform((v) => (v === '' ? null : v))
    .nullable(),
  targetRule: z.enum(CHECK_TARGET_RULES, { message: `Target rule must be one of ${CHECK_TARGET_RULES.join(', ')}` }),
  quantity: z.enum(CHECK_QUANTITIES, { message: `Quantity must be one of ${CHECK_QUANTITIES.join(', ')}` }),
  fixedTarget: siFigure('Target').nullable(),
  fixedMin: siFigure('Lowest passing value').nullable(),
  fixedMax: siFigure('Highest passing value').nullable(),
  schedule: z.enum(CHECK_SCHEDULES, { message: 'When due must be blade_change or periodic' }),
  intervalDays: z
    .number({ message: 'Interval must be a number of days' })
    .int({ message: 'Interval must be a whole number of days' })
    .min(1, { message: 'Interval must be at least 1 day' })
    .max(3650, { message: 'Interval must be at most 3650 days' })
    .nullable(),
  graceHours: z
    .number({ message: 'Grace must be a number of hours' })
    .min(0, { message: 'Grace must not be negative' })
    .max(720, { message: 'Grace must be at most 720 hours (30 days)' }),
  position: z.number().int().min(0).max(10000),
};

type SiteCheckFields = {
  targetRule: CheckTargetRule;
  quantity: CheckQuantity;
  fixedTarget: number | null;
  fixedMin: number | null;
  fixedMax: number | null;
  schedule: CheckScheduleName;
  intervalDays: number | null;
};

/**
 * The rules between a check's fields: a rule's quantity is the rule's own, and its limits are the site's settings
 * (no numbers on the list); a fixed check reads a length, force or stress and has a target with at least one limit
 * around it; a periodic check has an interval and a blade-change check none.
 */
export function refineSiteCheck(v: SiteCheckFields, ctx: z.RefinementCtx): void {
  const issue = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
  if (v.targetRule === 'fixed') {
    if (v.quantity === 'condition') issue('quantity', 'A fixed value reads a length, a force or a stress');
    if (v.fixedTarget === null) issue('fixedTarget', 'Give the target value');
    if (v.fixedMin === null && v.fixedMax === null)
      issue('fixedMax', 'Give the lowest or the highest passing value, or both');
    if (v.fixedMin !== null && v.fixedMax !== null && v.fixedMin > v.fixedMax)
      issue('fixedMax', 'The highest passing value must not be below the lowest');
    if (v.fixedTarget !== null && v.fixedMin !== null && v.fixedTarget < v.fixedMin)
      issue('fixedTarget', 'The target must not be below the lowest passing value');
    if (v.fixedTarget !== null && v.fixedMax !== null && v.fixedTarget > v.fixedMax)
      issue('fixedTarget', 'The target must not be above the highest passing value');
  } else {
    if (v.quantity !== RULE_QUANTITY[v.targetRule])
      issue('quantity', `This rule reads a ${RULE_QUANTITY[v.targetRule]}, not a ${v.quantity}`);
    for (const field of ['fixedTarget', 'fixedMin', 'fixedMax'] as const)
      if (v[field] !== null)
        issue(field, 'This rule takes its limits from your site’s settings: leave the fixed values empty');
  }
  if (v.schedule === 'periodic' && v.intervalDays === null) issue('intervalDays', 'Say every how many days');
  if (v.schedule === 'blade_change' && v.intervalDays !== null)
    issue('intervalDays', 'A check due at each blade change has no interval: leave it empty');
}

/**
 * A new check on a site's list. For a rule the quantity follows from it; for a fixed value the quantity, target
 * and limits are given. Grace defaults to 8 h after a blade change, 24 h for periodic checks.
 */
export const siteCheckCreateSchema = z
  .object({
    name: siteCheckFields.name,
    measures: siteCheckFields.measures.default(null),
    targetRule: siteCheckFields.targetRule,
    quantity: siteCheckFields.quantity.optional(),
    fixedTarget: siteCheckFields.fixedTarget.default(null),
    fixedMin: siteCheckFields.fixedMin.default(null),
    fixedMax: siteCheckFields.fixedMax.default(null),
    schedule: siteCheckFields.schedule,
    intervalDays: siteCheckFields.intervalDays.default(null),
    graceHours: siteCheckFields.graceHours.optional(),
    position: siteCheckFields.position.optional(),
  })
  .strict()
  .transform((v, ctx) => {
    const quantity = v.quantity ?? (v.targetRule === 'fixed' ? undefined : RULE_QUANTITY[v.targetRule]);
    if (quantity === undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['quantity'],
        message: 'Say what the fixed value reads: length, force or stress',
      });
      return z.NEVER;
    }
    return { ...v, quantity, graceHours: v.graceHours ?? DEFAULT_GRACE_HOURS[v.schedule] };
  })
  .superRefine(refineSiteCheck);
export type SiteCheckCreate = z.input<typeof siteCheckCreateSchema>;
export type SiteCheckCreateParsed = z.output<typeof siteCheckCreateSchema>;

/** Changes to a check: any of its fields; the result is checked whole (`siteCheckValuesSchema`). */
export const siteCheckUpdateSchema = z.object(siteCheckFields).partial().strict();
export type SiteCheckUpdate = z.infer<typeof siteCheckUpdateSchema>;

/** A check's fields as they will be stored, checked together (a change merged with the stored check). */
export const siteCheckValuesSchema = z.object(siteCheckFields).superRefine(refineSiteCheck);
export type SiteCheckValues = z.infer<typeof siteCheckValuesSchema>;

export const siteCheckListQuerySchema = z.object({ includeRetired: queryFlagSchema.optional() });

/** The shipped list every site starts from, in its order. */
export function defaultSiteChecks(): SiteCheckValues[] {
  return CHECK_KINDS.map((kind, position) => ({
    name: kind.label,
    measures: kind.measures,
    targetRule: kind.kind,
    quantity: RULE_QUANTITY[kind.kind],
    fixedTarget: null,
    fixedMin: null,
    fixedMax: null,
    schedule: kind.due,
    intervalDays: kind.defaultIntervalDays,
    graceHours: kind.defaultGraceHours,
    position,
  }));
}

/** A condition check's answers (the chip brush). */
export const checkAnswersSchema = z
  .object({
    reachesGullets: z.boolean({ message: 'Say whether the brush reaches into the gullets' }),
    worn: z.boolean({ message: 'Say whether the brush is worn' }),
  })
  .strict();
export type CheckAnswers = z.infer<typeof checkAnswersSchema>;

/**
 * Recording a check on a saw: the reading in the check's SI unit (mm, N or MPa), or the answers of a condition
 * check. The server finds the target for this saw and the blade on it, and decides pass or fail itself.
 */
export const checkRecordCreateSchema = z
  .object({
    sawId: idSchema,
    siteCheckId: idSchema,
    checkedAt: recordTimeSchema('Checked at').optional(),
    reading: z
      .number({ message: 'Reading must be a number in the check’s unit (mm, N or MPa)' })
      .min(-100000, { message: 'Reading must be at least −100,000' })
      .max(1000000, { message: 'Reading must be at most 1,000,000' })
      .nullable()
      .default(null),
    answers: checkAnswersSchema.nullable().default(null),
    notes: notesSchema.default(null),
  })
  .strict();
export type CheckRecordCreate = z.input<typeof checkRecordCreateSchema>;
export type CheckRecordCreateParsed = z.output<typeof checkRecordCreateSchema>;

/** A recorded check: what was read, against which target and limits, and the verdict the server worked out. */
export const checkRecordSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  sawId: idSchema,
  sawAssetTag: z.string(),
  siteCheckId: idSchema,
  checkName: z.string(),
  targetRule: z.enum(CHECK_TARGET_RULES),
  quantity: z.enum(CHECK_QUANTITIES),
  /** The blade on the saw when the check was recorded, if any. */
  bladeRunId: idSchema.nullable(),
  checkedAt: z.string(),
  checkedById: idSchema.nullable(),
  checkedByName: z.string().nullable(),
  reading: z.number().nullable(),
  answers: checkAnswersSchema.nullable(),
  target: z.number().nullable(),
  min: z.number().nullable(),
  max: z.number().nullable(),
  passed: z.boolean(),
  /** Where the target came from when it was recorded. */
  basis: figureBasisSchema.nullable(),
  /** The target and verdict in words, in the site's units, as shown when recorded. */
  explanation: z.string(),
  notes: z.string().nullable(),
  photoCount: z.number().int(),
  createdAt: z.string(),
});
export type CheckRecord = z.infer<typeof checkRecordSchema>;

export const CHECK_RECORD_SORTS = ['checkedAt', '-checkedAt'] as const;

const checkRecordFilterFields = {
  siteId: idSchema.optional(),
  sawId: idSchema.optional(),
  siteCheckId: idSchema.optional(),
  passed: queryFlagSchema.optional(),
  /** On checkedAt. */
  ...dateRangeQueryFields,
  sort: z.enum(CHECK_RECORD_SORTS).default('-checkedAt'),
};

export const checkRecordListQuerySchema = pageQuerySchema.extend(checkRecordFilterFields).superRefine(refineDateRange);
export type CheckRecordListQuery = z.infer<typeof checkRecordListQuerySchema>;

/** The list's filters without paging, and the units: the CSV export of the same table. */
export const checkRecordExportQuerySchema = z
  .object({ ...checkRecordFilterFields, ...exportUnitsField })
  .superRefine(refineDateRange);
export type CheckRecordExportQuery = z.infer<typeof checkRecordExportQuerySchema>;

/** One check on one saw that needs doing: due now, or overdue. */
export const dueCheckSchema = z.object({
  siteId: idSchema,
  sawId: idSchema,
  sawAssetTag: z.string(),
  sawName: z.string(),
  siteCheckId: idSchema,
  checkName: z.string(),
  targetRule: z.enum(CHECK_TARGET_RULES),
  schedule: z.enum(CHECK_SCHEDULES),
  state: z.enum(DUE_STATES),
  fallsDueAt: z.string().nullable(),
  overdueAt: z.string().nullable(),
  lastCheckedAt: z.string().nullable(),
  lastPassed: z.boolean().nullable(),
  /** The blade on the saw now (blade-change checks are due for it). */
  bladeRunId: idSchema.nullable(),
});
export type DueCheck = z.infer<typeof dueCheckSchema>;

/** Which pending checks a list shows: the overdue ones (default), the due ones, or both. */
export const DUE_LIST_STATES = ['overdue', 'due', 'pending'] as const;
export type DueListState = (typeof DUE_LIST_STATES)[number];

export const dueCheckListQuerySchema = pageQuerySchema.extend({
  state: z.enum(DUE_LIST_STATES, { message: 'State must be overdue, due or pending' }).default('overdue'),
  sawId: idSchema.optional(),
  siteCheckId: idSchema.optional(),
  schedule: z.enum(CHECK_SCHEDULES, { message: 'Schedule must be blade_change or periodic' }).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type DueCheckListQuery = z.infer<typeof dueCheckListQuerySchema>;

/** Checks due and overdue at one site, for its tile. */
export const checkCountsSchema = z.object({ siteId: idSchema, due: z.number().int(), overdue: z.number().int() });
export type CheckCounts = z.infer<typeof checkCountsSchema>;

export const checkCountsQuerySchema = z.object({ siteId: idSchema.optional() });

/** A check's target for one saw and the blade on it, as the record form shows it. */
export const checkTargetSchema = z.object({
  applicable: z.boolean(),
  target: z.number().nullable(),
  min: z.number().nullable(),
  max: z.number().nullable(),
  basis: figureBasisSchema.nullable(),
  /** What to do and what passes, in the site's units first; for a check that does not apply, why. */
  explanation: z.string(),
});
export type CheckTarget = z.infer<typeof checkTargetSchema>;

/** Every check of a saw's site for this saw: its target now, and whether it is due. */
export const sawCheckSchema = z.object({
  check: siteCheckSchema,
  target: checkTargetSchema,
  state: z.enum(DUE_STATES),
  fallsDueAt: z.string().nullable(),
  overdueAt: z.string().nullable(),
  lastRecordId: idSchema.nullable(),
  lastCheckedAt: z.string().nullable(),
  lastPassed: z.boolean().nullable(),
});
export type SawCheck = z.infer<typeof sawCheckSchema>;

export const sawChecksSchema = z.object({
  sawId: idSchema,
  siteId: idSchema,
  bladeRunId: idSchema.nullable(),
  bladeSpecName: z.string().nullable(),
  items: z.array(sawCheckSchema),
});
export type SawChecks = z.infer<typeof sawChecksSchema>;
