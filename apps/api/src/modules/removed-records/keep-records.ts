import type { Transaction } from 'sequelize';
import type { RemovableSubject } from '@kerfline/domain/removed-records/schema';
import { writeAudit, type AuditRecord } from '../../audit/write-audit.js';
import { AppError } from '../../errors.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import { select } from '../records/record-support.js';
import { RemovedRecord, type Relinks } from './removed-record.model.js';

/**
 * Moving a record out of the live tables into the kept records, and where each subject lives. The services of
 * the records call `removeToKept` from their delete routes after their own checks (who may, which saw), inside
 * their transaction; putting back is `removed-records.service.ts`.
 */

/** Each removable subject's live table and the column that says when it happened. */
export const KEPT_TABLES: Record<RemovableSubject, { table: string; occurred: string }> = {
  BladeRun: { table: 'blade_runs', occurred: 'installed_at' },
  Stop: { table: 'stops', occurred: 'started_at' },
  CutLog: { table: 'cut_logs', occurred: 'cut_at' },
  Photo: { table: 'photos', occurred: 'created_at' },
  CheckRecord: { table: 'check_records', occurred: 'checked_at' },
};

/** The column of `photos` that points at a parent of this subject (runs and recorded checks have photos). */
const PHOTO_PARENT: Partial<Record<RemovableSubject, string>> = {
  BladeRun: 'blade_run_id',
  CheckRecord: 'check_record_id',
};

/** `installed_at` → `installedAt`: the audit trail names fields as the API does. */
export function camelKeys(row: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(
    Object.entries(row).map(([key, value]) => [key.replace(/_([a-z0-9])/g, (_m, c: string) => c.toUpperCase()), value]),
  );
}

export type RemoveInput = { subject: RemovableSubject; recordId: string; reason: string; userId: string };

/**
 * Moves one live record into the kept records, in the caller's transaction: its row, the photos that belong to
 * it (rows and bytes), and — for a blade run — the ids of the cut logs and recorded checks that pointed at it and
 * lose that link (they stay live: the cuts and checks happened). Writes the audit entries: a `delete` of the
 * record and of each photo (every field before), and the kept record's `create` (with the reason).
 * Returns the kept record's id.
 */
export async function removeToKept(
  transaction: Transaction,
  storage: PhotoStorage | null,
  { subject, recordId, reason, userId }: RemoveInput,
): Promise<string> {
  const { table, occurred } = KEPT_TABLES[subject];
  const sawOf =
    subject === 'Photo'
      ? `COALESCE((SELECT r.saw_id FROM blade_runs r WHERE r.id = t.blade_run_id),
                  (SELECT c.saw_id FROM check_records c WHERE c.id = t.check_record_id))`
      : 't.saw_id';
  const [live] = await select<{ row: Record<string, unknown>; site_id: string; saw_id: string | null; at: Date }>(
    `SELECT to_jsonb(t) AS row, t.site_id, ${sawOf} AS saw_id, t.${occurred} AS at
       FROM ${table} t WHERE t.id = :recordId FOR UPDATE`,
    { recordId },
    transaction,
  );
  if (!live) throw new AppError('CONFLICT', 'This record was removed by someone else just now; reload to see it');

  const parentColumn = PHOTO_PARENT[subject];
  const photos = parentColumn
    ? (
        await select<{ row: Record<string, unknown> }>(
          `SELECT to_jsonb(p) AS row FROM photos p WHERE p.${parentColumn} = :recordId ORDER BY p.created_at, p.id
             FOR UPDATE`,
          { recordId },
          transaction,
        )
      ).map((p) => p.row)
    : [];
  const relinks: Relinks = {};
  if (subject === 'BladeRun') {
    const ids = async (from: string) =>
      (
        await select<{ id: string }>(
          `SELECT id FROM ${from} WHERE blade_run_id = :recordId ORDER BY id`,
          { recordId },
          transaction,
        )
      ).map((r) => r.id);
    relinks.cutLogIds = await ids('cut_logs');
    relinks.checkRecordIds = await ids('check_records');
  }

  const kept = await RemovedRecord.create(
    {
      siteId: live.site_id,
      subject,
      recordId,
      sawId: live.saw_id,
      occurredAt: live.at,
      keptRow: live.row,
      keptPhotos: photos,
      relinks,
      reason,
      removedById: userId,
    },
    { transaction },
  );
  const photoIds = subject === 'Photo' ? [recordId] : photos.map((p) => String(p.id));
  if (photoIds.length > 0) {
    if (!storage) throw new Error(`removeToKept(${subject}) needs the photo store: it has photos`);
    await storage.keep(photoIds, kept.id, transaction);
  }
  // The live row goes; its photos follow by cascade, and links to a run become NULL (the foreign keys say so).
  await kept.sequelize.query(`DELETE FROM ${table} WHERE id = :recordId`, {
    replacements: { recordId },
    transaction,
  });
  if (subject === 'Photo' && storage) await storage.remove(recordId, transaction);

  const audit: AuditRecord[] = photos.map((p) => ({
    siteId: live.site_id,
    entity: 'Photo',
    entityId: String(p.id),
    action: 'delete',
    before: camelKeys(p),
  }));
  audit.push(
    { siteId: live.site_id, entity: subject, entityId: recordId, action: 'delete', before: camelKeys(live.row) },
    {
      siteId: live.site_id,
      entity: 'RemovedRecord',
      entityId: kept.id,
      action: 'create',
      after: { subject, recordId, reason, photoIds, relinks },
    },
  );
  await writeAudit(transaction, userId, audit);
  return kept.id;
}
