import { z } from 'zod';
import { CHECK_KIND_IDS } from '../checks/schema.js';

/** Why a blade was taken off the saw: the choices of the removal form. */
export const REMOVAL_REASONS = [
  'worn_out',
  'tooth_strippage',
  'fatigue_crack',
  'broken',
  'crooked_cutting',
  'other',
] as const;
export type RemovalReason = (typeof REMOVAL_REASONS)[number];

export const REMOVAL_REASON_LABELS: Record<RemovalReason, string> = {
  worn_out: 'Worn out',
  tooth_strippage: 'Tooth strippage',
  fatigue_crack: 'Fatigue crack',
  broken: 'Broken',
  crooked_cutting: 'Crooked cutting',
  other: 'Other',
};

/** Patterns a technician may see on a band before or at removal, diagnosed like a removal reason. */
export const OBSERVED_PATTERNS = ['dulling', 'one_sided_wear', 'twist'] as const;
export type ObservedPattern = (typeof OBSERVED_PATTERNS)[number];

export const OBSERVED_PATTERN_LABELS: Record<ObservedPattern, string> = {
  dulling: 'Dulling / wearing fast',
  one_sided_wear: 'Wear on one side',
  twist: 'Band twisted',
};

export const FAILURE_MODES = [...REMOVAL_REASONS, ...OBSERVED_PATTERNS] as const;
export type FailureMode = (typeof FAILURE_MODES)[number];

export const failureModeSchema = z.enum(FAILURE_MODES, {
  message: `Failure mode must be one of ${FAILURE_MODES.join(', ')}`,
});

/** Teeth in the work the trade aims for: 3 to 24 (common practice, no source). */
export const DEFAULT_TEETH_IN_WORK_RANGE = { min: 3, max: 24 } as const;

const optionalFlag = (what: string) =>
  z
    .boolean({ message: `${what} must be true, false or null` })
    .nullable()
    .default(null);

/**
 * Plain evidence about one saw, gathered by the caller from its latest checks and recent cut logs.
 * Unknown facts are null or left out; they neither raise nor lower a cause.
 */
export const diagnosisEvidenceSchema = z.object({
  /** The latest check of each kind: `passed` null when it recorded no verdict. */
  checks: z
    .array(
      z.object({
        kind: z.enum(CHECK_KIND_IDS, { message: `Check kind must be one of ${CHECK_KIND_IDS.join(', ')}` }),
        passed: z.boolean().nullable(),
        overdue: z.boolean({ message: 'overdue must be true or false' }),
      }),
    )
    .default([]),
  /** Recent cut logs of this saw with this blade; any field may be null when not recorded. */
  cutLogs: z
    .array(
      z.object({
        teethInWork: z.number().min(0, { message: 'Teeth in work must not be negative' }).nullable(),
        bandSpeedMPerMin: z.number().positive({ message: 'Band speed must be greater than 0 m/min' }).nullable(),
        recommendedMaxMPerMin: z
          .number()
          .positive({ message: 'Recommended band speed must be greater than 0 m/min' })
          .nullable(),
      }),
    )
    .default([]),
  breakInDone: optionalFlag('breakInDone'),
  /** Band bending stress over the limit the caller uses for this band; above 1 the wheel is too small. */
  bendingStressRatio: z
    .number()
    .positive({ message: 'Bending stress ratio must be greater than 0' })
    .nullable()
    .default(null),
  /** Guide arms found set further apart than the work needs. */
  guideArmsSetWide: optionalFlag('guideArmsSetWide'),
  /** Hard spots or scale reported in the material cut. */
  hardSpotsReported: optionalFlag('hardSpotsReported'),
  teethInWorkRange: z
    .object({ min: z.number().min(0), max: z.number().positive() })
    .refine((r) => r.min < r.max, { message: 'Teeth-in-work range: min must be below max' })
    .default({ ...DEFAULT_TEETH_IN_WORK_RANGE }),
});
export type DiagnosisEvidence = z.infer<typeof diagnosisEvidenceSchema>;
export type DiagnosisEvidenceInput = z.input<typeof diagnosisEvidenceSchema>;
