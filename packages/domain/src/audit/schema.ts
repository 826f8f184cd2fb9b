import { z } from 'zod';
import { idSchema, pageQuerySchema } from '../common/schema.js';

/**
 * What happened to a record. `undo` marks rows removed by undoing an import; `retire` and `restore` keep the
 * row and its history (nothing with history is hard-deleted).
 */
export const AUDIT_ACTIONS = ['create', 'update', 'delete', 'retire', 'restore', 'undo'] as const;
export type AuditAction = (typeof AUDIT_ACTIONS)[number];

/** Plain JSON values of a record's fields, as they were stored. */
export type AuditValues = Record<string, unknown>;

/**
 * One change to a record: who made it, when, to what, and the fields before and after. For an update only the
 * fields that changed are kept; a create has no `before`, a delete no `after`.
 */
export const auditEntrySchema = z.object({
  id: idSchema,
  at: z.iso.datetime(),
  actorId: idSchema.nullable(),
  /** The person's name at the time of reading (people are never deleted, so the name is always there). */
  actorName: z.string().nullable(),
  /** Null for records that belong to no one site (the blade-spec catalogue, regions). */
  siteId: idSchema.nullable(),
  /** The CASL subject name of the record: `Saw`, `SiteSetting`, `BladeRun`… */
  entity: z.string(),
  entityId: z.string(),
  action: z.enum(AUDIT_ACTIONS),
  before: z.record(z.string(), z.unknown()).nullable(),
  after: z.record(z.string(), z.unknown()).nullable(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

export const auditListQuerySchema = pageQuerySchema.extend({
  siteId: idSchema.optional(),
  entity: z.string().trim().min(1).max(60).optional(),
  entityId: z.string().trim().min(1).max(100).optional(),
});
export type AuditListQuery = z.output<typeof auditListQuerySchema>;

/**
 * The fields that differ between two plain records, as `{ before, after }` holding only those fields. Dates are
 * compared by their time; other values by their JSON form, so arrays and nested objects compare by content.
 */
export function changedFields(
  before: AuditValues,
  after: AuditValues,
  ignore: readonly string[] = ['updatedAt', 'createdAt'],
): { before: AuditValues; after: AuditValues } {
  const keys = new Set([...Object.keys(before), ...Object.keys(after)].filter((k) => !ignore.includes(k)));
  const b: AuditValues = {};
  const a: AuditValues = {};
  for (const key of keys) {
    if (comparable(before[key]) !== comparable(after[key])) {
      b[key] = before[key] ?? null;
      a[key] = after[key] ?? null;
    }
  }
  return { before: b, after: a };
}

function comparable(value: unknown): string {
  if (value instanceof Date) return `date:${value.getTime()}`;
  return JSON.stringify(value ?? null);
}
