import type { Transaction } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { changedFields, type AuditAction, type AuditValues } from '@kerfline/domain/audit/schema';
import { AuditEntry } from '../modules/audit/audit-entry.model.js';

/** Who is acting: their ability decides what they may do; their id is written into the audit trail. */
export type Actor = { ability: AppAbility; userId: string };

export type AuditRecord = {
  siteId: string | null;
  entity: string;
  entityId: string;
  action: AuditAction;
  before?: AuditValues | null;
  after?: AuditValues | null;
};

/** JSON-safe copy of a plain record (Dates become ISO strings) for the jsonb columns. */
function jsonValues(values: AuditValues | null | undefined): AuditValues | null {
  if (values === null || values === undefined) return null;
  return JSON.parse(JSON.stringify(values)) as AuditValues;
}

/**
 * Writes audit entries inside the caller's transaction, so the change and its record commit or roll back
 * together. An update that changed nothing writes nothing; otherwise only the changed fields are kept.
 */
export async function writeAudit(
  transaction: Transaction,
  actorId: string | null,
  records: readonly AuditRecord[],
): Promise<void> {
  const rows = [];
  for (const r of records) {
    let before = jsonValues(r.before);
    let after = jsonValues(r.after);
    if (r.action === 'update' && before !== null && after !== null) {
      const diff = changedFields(before, after);
      if (Object.keys(diff.after).length === 0) continue;
      before = diff.before;
      after = diff.after;
    }
    rows.push({ actorId, siteId: r.siteId, entity: r.entity, entityId: r.entityId, action: r.action, before, after });
  }
  if (rows.length > 0) await AuditEntry.bulkCreate(rows, { transaction });
}
