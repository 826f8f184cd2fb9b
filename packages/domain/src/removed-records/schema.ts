import { z } from 'zod';
import { idSchema, isPlainText, pageQuerySchema } from '../common/schema.js';

/**
 * Records a site admin may remove to correct a mistaken entry. Removing one moves it (with the photos that belong
 * to it) out of the live records into the kept records, with who removed it, when and why; putting it back
 * restores it with its own id. Everything else with history is retired or archived instead (sites, saws, people,
 * specs, checks).
 */
export const REMOVABLE_SUBJECTS = ['BladeRun', 'Stop', 'CutLog', 'Photo', 'CheckRecord'] as const;
export type RemovableSubject = (typeof REMOVABLE_SUBJECTS)[number];

/** What a kept record is, in the words the screens use. */
export const REMOVABLE_SUBJECT_LABELS: Record<RemovableSubject, string> = {
  BladeRun: 'Blade run',
  Stop: 'Stop',
  CutLog: 'Cut log',
  Photo: 'Photo',
  CheckRecord: 'Recorded check',
};

export const REMOVAL_REASON_MAX = 300;

/** Why a record is removed: required, one line, kept with the record and shown to whoever may put it back. */
export const removeRecordSchema = z.object({
  reason: z
    .string({ message: 'Say why this record is being removed' })
    .trim()
    .min(1, { message: 'Say why this record is being removed' })
    .max(REMOVAL_REASON_MAX, { message: `must be at most ${REMOVAL_REASON_MAX} characters` })
    .refine((value) => isPlainText(value), {
      message: 'must be one line, without control or invisible characters',
    }),
});
export type RemoveRecordInput = z.infer<typeof removeRecordSchema>;

/** One kept record, as the list of removed records shows it. */
export const removedRecordSchema = z.object({
  id: idSchema,
  siteId: idSchema,
  subject: z.enum(REMOVABLE_SUBJECTS),
  /** The record's own id, which it gets back when put back. */
  recordId: idSchema,
  sawId: idSchema.nullable(),
  sawAssetTag: z.string().nullable(),
  /** What the record was, in words (the blade and how it came off, the stop's category, the check…). */
  what: z.string(),
  /** When it happened (put on, stopped, cut, checked, photo taken in) and, for runs and stops, until when. */
  occurredAt: z.string(),
  endedAt: z.string().nullable(),
  /** Photos removed with it, which come back with it. */
  photoCount: z.number().int().min(0),
  reason: z.string(),
  removedById: idSchema.nullable(),
  removedByName: z.string().nullable(),
  removedAt: z.string(),
});
export type RemovedRecord = z.infer<typeof removedRecordSchema>;

export const removedRecordListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  subject: z.enum(REMOVABLE_SUBJECTS, { message: `must be one of ${REMOVABLE_SUBJECTS.join(', ')}` }).optional(),
  sawId: idSchema.optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type RemovedRecordListQuery = z.output<typeof removedRecordListQuerySchema>;

/** What putting a record back answers: the subject and id it has again, so a screen can link to it. */
export const restoredRecordSchema = z.object({
  subject: z.enum(REMOVABLE_SUBJECTS),
  recordId: idSchema,
  siteId: idSchema,
  sawId: idSchema.nullable(),
  photoCount: z.number().int().min(0),
});
export type RestoredRecord = z.infer<typeof restoredRecordSchema>;
