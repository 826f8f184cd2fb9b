import { ForbiddenError, subject as asSubject } from '@casl/ability';
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import { MATERIAL_GROUP_LABELS, type MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { REMOVAL_REASON_LABELS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { STOP_CATEGORY_LABELS, type StopCategory } from '@kerfline/domain/stops/schema';
import type {
  RemovableSubject,
  RemovedRecord as RemovedRecordDto,
  RemovedRecordListQuery,
  RestoredRecord,
} from '@kerfline/domain/removed-records/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor, type AuditRecord } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import { formatAt, namesOf, select, siteTimeZone } from '../records/record-support.js';
import { camelKeys, KEPT_TABLES } from './keep-records.js';
import { RemovedRecord, type Relinks } from './removed-record.model.js';

/** The saw's tag, the photo count (never the kept photo rows), and the name of the run's blade spec or the recorded check's check, read with the page. */
const DERIVED = {
  include: [
    [literal(`(SELECT asset_tag FROM saws WHERE saws.id = "RemovedRecord".saw_id)`), 'sawAssetTag'],
    [
      literal(`CASE "RemovedRecord".subject
        WHEN 'BladeRun' THEN (SELECT name FROM blade_specs
                               WHERE blade_specs.id = ("RemovedRecord".kept_row->>'blade_spec_id')::uuid)
        WHEN 'CheckRecord' THEN (SELECT name FROM site_checks
                                  WHERE site_checks.id = ("RemovedRecord".kept_row->>'site_check_id')::uuid)
      END`),
      'relatedName',
    ],
    [literal(`jsonb_array_length("RemovedRecord".kept_photos)`), 'photoCount'],
  ] as [ReturnType<typeof literal>, string][],
};

type Row = Record<string, unknown>;
const str = (row: Row, key: string) => (row[key] === null || row[key] === undefined ? null : String(row[key]));
const isoOrNull = (value: string | null) => (value ? new Date(value).toISOString() : null);

/** What the record was, in a few words (times are separate fields, shown in the site's zone by the screen). */
function describe(subject: RemovableSubject, row: Row, relatedName: string | null): string {
  switch (subject) {
    case 'BladeRun': {
      const reason = str(row, 'removal_reason') as RemovalReason | null;
      const how = reason ? `taken off: ${REMOVAL_REASON_LABELS[reason].toLowerCase()}` : 'still on the saw';
      return `${relatedName ?? 'Blade'} (${how})`;
    }
    case 'Stop': {
      const label = STOP_CATEGORY_LABELS[str(row, 'category') as StopCategory] ?? 'Stop';
      return row.planned === true ? `${label} (planned)` : label;
    }
    case 'CutLog': {
      const cuts = Number(row.quantity ?? 0);
      const material = MATERIAL_GROUP_LABELS[str(row, 'material_group') as MaterialGroup] ?? '';
      return `${cuts} ${cuts === 1 ? 'cut' : 'cuts'}, ${material.toLowerCase()}`;
    }
    case 'Photo': {
      const of = row.blade_run_id ? 'a blade run' : 'a recorded check';
      const caption = str(row, 'caption');
      return caption ? `Photo of ${of}: ${caption}` : `Photo of ${of}`;
    }
    case 'CheckRecord':
      return `${relatedName ?? 'Check'}: ${row.passed === true ? 'passed' : 'failed'}`;
  }
}

async function toDtos(records: RemovedRecord[]): Promise<RemovedRecordDto[]> {
  const names = await namesOf(records.map((r) => r.removedById));
  return records.map((r) => {
    const row = r.keptRow;
    const endedAt =
      r.subject === 'BladeRun' ? str(row, 'removed_at') : r.subject === 'Stop' ? str(row, 'ended_at') : null;
    const related = r.get('relatedName');
    const tag = r.get('sawAssetTag');
    return {
      id: r.id,
      siteId: r.siteId,
      subject: r.subject,
      recordId: r.recordId,
      sawId: r.sawId,
      sawAssetTag: tag === null || tag === undefined ? null : String(tag),
      what: describe(r.subject, row, related === null || related === undefined ? null : String(related)),
      occurredAt: r.occurredAt.toISOString(),
      endedAt: isoOrNull(endedAt),
      photoCount: Number(r.get('photoCount') ?? 0),
      reason: r.reason,
      removedById: r.removedById,
      removedByName: r.removedById ? (names.get(r.removedById) ?? null) : null,
      removedAt: r.removedAt.toISOString(),
    };
  });
}

/** The removed records the caller may put back, newest removal first, paged in SQL. */
export async function listRemovedRecords(
  ability: AppAbility,
  q: RemovedRecordListQuery,
): Promise<Page<RemovedRecordDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.subject) filter.push({ subject: q.subject });
  if (q.sawId) filter.push({ sawId: q.sawId });
  const { rows, count } = await RemovedRecord.findAndCountAll({
    where: scopedWhere(ability, 'read', 'RemovedRecord', RemovedRecord, { [Op.and]: filter }),
    attributes: { ...DERIVED, exclude: ['keptPhotos'] },
    order: [
      ['removedAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await toDtos(rows), total: count, limit: q.limit, offset: q.offset };
}

async function findReadable(ability: AppAbility, id: string, transaction?: Transaction): Promise<RemovedRecord> {
  const kept = await RemovedRecord.findOne({
    where: scopedWhere(ability, 'read', 'RemovedRecord', RemovedRecord, { id }),
    attributes: { ...DERIVED, exclude: ['keptPhotos'] },
    transaction,
  });
  if (!kept) throw AppError.notFound('Removed record');
  return kept;
}

export async function getRemovedRecord(ability: AppAbility, id: string): Promise<RemovedRecordDto> {
  const [dto] = await toDtos([await findReadable(ability, id)]);
  return dto!;
}

const conflict = (message: string) => new AppError('CONFLICT', message);

/** A removed run of this id, if one is kept: it names who removed it and when, for "put that back first". */
async function keptRun(runId: string, transaction: Transaction) {
  return RemovedRecord.findOne({ where: { subject: 'BladeRun', recordId: runId }, transaction });
}

/**
 * A record's link to a run that is no longer live: kept (removed too) — the record comes back without the
 * link, and the kept run will link it again when it is put back; gone for good (its import undone) — it comes
 * back without the link. The same happens to live records when their run is removed.
 */
async function settleRunLink(row: Row, kind: keyof Relinks, transaction: Transaction): Promise<void> {
  const runId = str(row, 'blade_run_id');
  if (!runId) return;
  const [live] = await select<{ id: string }>(`SELECT id FROM blade_runs WHERE id = :runId`, { runId }, transaction);
  if (live) return;
  row.blade_run_id = null;
  const run = await keptRun(runId, transaction);
  if (run) {
    const relinks = { ...run.relinks, [kind]: [...(run.relinks[kind] ?? []), String(row.id)] };
    await run.update({ relinks }, { transaction });
  }
}

/** The spans of time in a 409: "from … to …" or "open since …", in the site's zone. */
function span(from: Date, to: Date | null, tz: string, open: string): string {
  return to ? `from ${formatAt(from, tz)} to ${formatAt(to, tz)}` : `${open} ${formatAt(from, tz)}`;
}

/**
 * Whether the kept record still fits among the live records; throws a 409 naming what is in the way. Adjusts the
 * row where the live tables already did the same to others (a link to a run that is gone).
 */
async function assertFits(kept: RemovedRecord, row: Row, transaction: Transaction): Promise<void> {
  const tz = await siteTimeZone(kept.siteId);
  const [site] = await select<{ name: string; retired_at: Date | null }>(
    `SELECT name, retired_at FROM sites WHERE id = :siteId`,
    { siteId: kept.siteId },
    transaction,
  );
  if (site?.retired_at) throw conflict(`Site ${site.name} is retired; an administrator must restore it first`);
  if (kept.sawId) {
    const [saw] = await select<{ asset_tag: string; status: string }>(
      `SELECT asset_tag, status FROM saws WHERE id = :sawId FOR SHARE`,
      { sawId: kept.sawId },
      transaction,
    );
    if (saw?.status === 'retired')
      throw conflict(`Saw ${saw.asset_tag} is retired; bring it back into service first, then put this back`);
  }
  const batchId = str(row, 'import_batch_id');
  if (batchId) {
    const [batch] = await select<{ state: string; file_name: string }>(
      `SELECT state, file_name FROM import_batches WHERE id = :batchId`,
      { batchId },
      transaction,
    );
    if (batch?.state === 'undone')
      throw conflict(
        `It came in with the import of ${batch.file_name}, which was undone since; bring that file in again instead`,
      );
  }

  switch (kept.subject) {
    case 'BladeRun': {
      const [spec] = await select<{ name: string; archived: boolean }>(
        `SELECT name, archived FROM blade_specs WHERE id = :id`,
        { id: str(row, 'blade_spec_id') },
        transaction,
      );
      if (!spec) throw conflict('Its blade spec no longer exists, so this blade run cannot come back');
      if (spec.archived)
        throw conflict(`Blade spec ${spec.name} is archived; offer it again first, then put this blade run back`);
      const receiptId = str(row, 'stock_receipt_id');
      if (receiptId) {
        const [receipt] = await select<{ quantity: number; received_on: string; drawn: number }>(
          `SELECT r.quantity, r.received_on::text AS received_on,
                  (SELECT count(*)::int FROM blade_runs b WHERE b.stock_receipt_id = r.id) AS drawn
             FROM stock_receipts r WHERE r.id = :receiptId FOR UPDATE`,
          { receiptId },
          transaction,
        );
        if (!receipt)
          throw conflict('The stock delivery its blade was drawn from was deleted since, so this run cannot come back');
        if (receipt.drawn >= receipt.quantity)
          throw conflict(
            `Every blade of the delivery it was drawn from (received ${receipt.received_on}, ${receipt.quantity} blades) is on a saw or used since; putting it back would draw one blade twice`,
          );
      }
      const from = new Date(String(row.installed_at));
      const to = row.removed_at ? new Date(String(row.removed_at)) : null;
      const [other] = await select<{ id: string; installed_at: Date; removed_at: Date | null; name: string }>(
        `SELECT r.id, r.installed_at, r.removed_at, b.name FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
          WHERE r.saw_id = :sawId AND tstzrange(r.installed_at, r.removed_at, '[)') && tstzrange(:from, :to, '[)')
          ORDER BY r.installed_at LIMIT 1`,
        { sawId: str(row, 'saw_id'), from, to },
        transaction,
      );
      if (other)
        throw conflict(
          `It would overlap blade run ${other.id} (${other.name}, ${span(other.installed_at, other.removed_at, tz, 'on since')}), entered since; a saw carries one blade at a time, so change or remove that run first`,
        );
      return;
    }
    case 'Stop': {
      const from = new Date(String(row.started_at));
      const to = row.ended_at ? new Date(String(row.ended_at)) : null;
      const [other] = await select<{ id: string; started_at: Date; ended_at: Date | null; category: StopCategory }>(
        `SELECT id, started_at, ended_at, category FROM stops
          WHERE saw_id = :sawId AND tstzrange(started_at, ended_at, '[)') && tstzrange(:from, :to, '[)')
          ORDER BY started_at LIMIT 1`,
        { sawId: str(row, 'saw_id'), from, to },
        transaction,
      );
      if (other)
        throw conflict(
          `It would overlap stop ${other.id} (${STOP_CATEGORY_LABELS[other.category].toLowerCase()}, ${span(other.started_at, other.ended_at, tz, 'open since')}), entered since; change or remove that stop first`,
        );
      return;
    }
    case 'CutLog':
      await settleRunLink(row, 'cutLogIds', transaction);
      return;
    case 'CheckRecord': {
      const [check] = await select<{ id: string }>(
        `SELECT id FROM site_checks WHERE id = :id`,
        { id: str(row, 'site_check_id') },
        transaction,
      );
      if (!check) throw conflict('Its check was deleted from the site’s list, so this record cannot come back');
      await settleRunLink(row, 'checkRecordIds', transaction);
      return;
    }
    case 'Photo': {
      const runId = str(row, 'blade_run_id');
      const recordId = str(row, 'check_record_id');
      const parentTable = runId ? 'blade_runs' : 'check_records';
      const parentId = runId ?? recordId;
      const [parent] = await select<{ id: string }>(
        `SELECT id FROM ${parentTable} WHERE id = :parentId`,
        { parentId },
        transaction,
      );
      if (parent) return;
      const what = runId ? 'blade run' : 'recorded check';
      const removed = await RemovedRecord.findOne({
        where: { subject: runId ? 'BladeRun' : 'CheckRecord', recordId: parentId! },
        transaction,
      });
      if (removed)
        throw conflict(
          `The ${what} it belongs to was removed too (on ${formatAt(removed.removedAt, tz)}); put that back first, then this photo`,
        );
      throw conflict(`The ${what} it belongs to no longer exists, so this photo cannot come back`);
    }
  }
}

/**
 * Puts a removed record back in one transaction, with its own id, its photos (rows and bytes) and, for a blade
 * run, its links from the cut logs and recorded checks that lost them; audited. Only who may put back at the
 * record's site (its site admin, administrators); 404 for a kept record outside the caller's scope. A record that
 * no longer fits answers 409 naming what is in the way, and nothing changes.
 */
export async function restoreRemovedRecord(
  storage: PhotoStorage,
  { ability, userId }: Actor,
  id: string,
): Promise<RestoredRecord> {
  const first = await findReadable(ability, id);
  ForbiddenError.from(ability)
    .setMessage('Only an administrator or this site’s admin can put a removed record back')
    .throwUnlessCan('update', asSubject('RemovedRecord', { id: first.id, siteId: first.siteId }));
  ForbiddenError.from(ability)
    .setMessage('You cannot add records at this site')
    .throwUnlessCan('create', asSubject(first.subject, { id: first.recordId, siteId: first.siteId }) as never);

  return inTransaction(async (transaction) => {
    // Locked, so two people putting the same record back get one success and one "already put back".
    const kept = await RemovedRecord.findOne({ where: { id }, transaction, lock: transaction.LOCK.UPDATE });
    if (!kept) throw conflict('This record was put back by someone else just now; reload to see it');
    const row: Row = { ...kept.keptRow };
    await assertFits(kept, row, transaction);

    const { table } = KEPT_TABLES[kept.subject];
    const sequelize = kept.sequelize;
    await sequelize.query(
      `INSERT INTO ${table} SELECT * FROM jsonb_populate_record(NULL::${table}, CAST(:row AS jsonb))`,
      { replacements: { row: JSON.stringify(row) }, transaction },
    );
    if (kept.keptPhotos.length > 0)
      await sequelize.query(
        `INSERT INTO photos SELECT * FROM jsonb_populate_recordset(NULL::photos, CAST(:photos AS jsonb))`,
        { replacements: { photos: JSON.stringify(kept.keptPhotos) }, transaction },
      );
    const photoIds = kept.subject === 'Photo' ? [kept.recordId] : kept.keptPhotos.map((p) => String(p.id));
    await storage.bringBack(photoIds, transaction);

    // Links the run's cut logs and recorded checks again where nothing has linked them elsewhere meanwhile.
    for (const [kind, from] of [
      ['cutLogIds', 'cut_logs'],
      ['checkRecordIds', 'check_records'],
    ] as const) {
      const ids = kept.relinks[kind] ?? [];
      if (ids.length > 0)
        await sequelize.query(
          `UPDATE ${from} SET blade_run_id = :runId WHERE id IN (:ids) AND blade_run_id IS NULL AND saw_id = :sawId`,
          { replacements: { runId: kept.recordId, ids, sawId: str(row, 'saw_id') }, transaction },
        );
    }
    await kept.destroy({ transaction });

    const audit: AuditRecord[] = [
      { siteId: kept.siteId, entity: kept.subject, entityId: kept.recordId, action: 'restore', after: camelKeys(row) },
      ...kept.keptPhotos.map((p) => ({
        siteId: kept.siteId,
        entity: 'Photo',
        entityId: String(p.id),
        action: 'restore' as const,
        after: camelKeys(p),
      })),
      {
        siteId: kept.siteId,
        entity: 'RemovedRecord',
        entityId: kept.id,
        action: 'delete',
        before: {
          subject: kept.subject,
          recordId: kept.recordId,
          reason: kept.reason,
          removedById: kept.removedById,
          removedAt: kept.removedAt.toISOString(),
        },
      },
    ];
    await writeAudit(transaction, userId, audit);
    return {
      subject: kept.subject,
      recordId: kept.recordId,
      siteId: kept.siteId,
      sawId: kept.sawId,
      photoCount: photoIds.length,
    };
  });
}
