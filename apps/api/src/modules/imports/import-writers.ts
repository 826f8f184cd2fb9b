import { QueryTypes, type Transaction } from 'sequelize';
import type { ImportKind, RowVerdict } from '@kerfline/domain/imports/schema';
import type { CollectedRow } from '@kerfline/domain/imports/pipeline';
import { ImportBatch } from './import-batch.model.js';
import { formatAt } from '../records/record-support.js';
import type {
  ImportTarget,
  ImportedReceipt,
  ImportedRun,
  ImportedSaw,
  ImportedStop,
} from '@kerfline/domain/imports/build';

/**
 * How each kind of record is settled against the site's records and written, in SQL, inside the import's
 * transaction. Rows are staged once in a temporary table (one INSERT … SELECT FROM unnest of column arrays), marked
 * there as already present (same natural key) or clashing (an overlap the database would refuse), and the rest go
 * into the real table with one INSERT … SELECT carrying the batch's id. The same queries run for the check, whose
 * transaction is rolled back.
 */

export type Settled = { verdicts: Map<number, { verdict: RowVerdict; message: string | null }> };

export interface KindWriter {
  settle(transaction: Transaction, target: ImportTarget, rows: CollectedRow[]): Promise<Settled>;
  /** Writes the staged rows still marked to add; returns how many. */
  insert(transaction: Transaction, target: ImportTarget, batchId: string, userId: string): Promise<number>;
  /** Later records that depend on what the batch wrote, or its records changed since, in words. */
  dependents(transaction: Transaction, batchId: string, since: Date, at: (d: Date) => string): Promise<string[]>;
  /** Deletes what the batch wrote; returns how many rows per table. */
  remove(transaction: Transaction, batchId: string): Promise<Record<string, number>>;
}

type Column<R> = { name: string; type: string; value: (record: R) => unknown };

async function run(transaction: Transaction, sql: string, bind: unknown[] = []): Promise<void> {
  await ImportBatch.sequelize!.query(sql, { bind, transaction });
}

async function rows<T extends object>(transaction: Transaction, sql: string, bind: unknown[] = []): Promise<T[]> {
  return ImportBatch.sequelize!.query<T>(sql, { bind, transaction, type: QueryTypes.SELECT });
}

/** Stages the records in `import_stage` (dropped at commit or rollback), one statement for all of them. */
async function stage<R>(transaction: Transaction, columns: Column<R>[], collected: CollectedRow[]): Promise<void> {
  await run(
    transaction,
    `CREATE TEMP TABLE import_stage (
       idx integer NOT NULL,
       ${columns.map((c) => `${c.name} ${c.type}`).join(',\n       ')},
       verdict text NOT NULL DEFAULT 'add',
       other_id uuid, other_from timestamptz, other_to timestamptz
     ) ON COMMIT DROP`,
  );
  if (collected.length === 0) return;
  const arrays = columns.map((c) =>
    collected.map((r) => {
      const v = c.value(r.record as R);
      return v instanceof Date ? v.toISOString() : (v ?? null);
    }),
  );
  await run(
    transaction,
    `INSERT INTO import_stage (idx, ${columns.map((c) => c.name).join(', ')})
     SELECT * FROM unnest($1::integer[], ${columns.map((c, i) => `$${i + 2}::${c.type}[]`).join(', ')})`,
    [collected.map((r) => r.rowNumber), ...arrays],
  );
  // The planner knows nothing of a temporary table until it is analysed.
  await run(transaction, 'ANALYZE import_stage');
}

async function countOf(transaction: Transaction, sql: string, bind: unknown[]): Promise<number> {
  const [row] = await rows<{ n: number }>(
    transaction,
    `WITH done AS (${sql} RETURNING 1) SELECT count(*)::int AS n FROM done`,
    bind,
  );
  return row?.n ?? 0;
}

async function verdictsOf(
  transaction: Transaction,
  describe: (row: {
    verdict: string;
    other_id: string | null;
    other_from: Date | null;
    other_to: Date | null;
  }) => string,
): Promise<Settled> {
  const settled = await rows<{
    idx: number;
    verdict: string;
    other_id: string | null;
    other_from: Date | null;
    other_to: Date | null;
  }>(transaction, `SELECT idx, verdict, other_id, other_from, other_to FROM import_stage WHERE verdict <> 'add'`);
  return {
    verdicts: new Map(
      settled.map((s) => [
        s.idx,
        s.verdict === 'present'
          ? { verdict: 'present' as const, message: 'Already in Kerfline; skipped' }
          : { verdict: 'rejected' as const, message: describe(s) },
      ]),
    ),
  };
}

/** A moment in the site's own time, with its zone, for messages about clashing records. */
const at = (target: ImportTarget, d: Date | null) => (d ? formatAt(d, target.timeZone) : 'now');

const runColumns: Column<ImportedRun>[] = [
  { name: 'saw_id', type: 'uuid', value: (r) => r.sawId },
  { name: 'blade_spec_id', type: 'uuid', value: (r) => r.bladeSpecId },
  { name: 'installed_at', type: 'timestamptz', value: (r) => r.installedAt },
  { name: 'removed_at', type: 'timestamptz', value: (r) => r.removedAt },
  { name: 'removal_reason', type: 'text', value: (r) => r.removalReason },
  { name: 'tension_mpa', type: 'double precision', value: (r) => r.tensionMpa },
  { name: 'material_group', type: 'text', value: (r) => r.materialGroup },
  { name: 'break_in_followed', type: 'boolean', value: (r) => r.breakInFollowed },
  { name: 'install_notes', type: 'text', value: (r) => r.installNotes },
  { name: 'area_cut_mm2', type: 'double precision', value: (r) => r.areaCutMm2 },
  { name: 'cuts', type: 'integer', value: (r) => r.cuts },
  { name: 'removal_notes', type: 'text', value: (r) => r.removalNotes },
  { name: 'cost_minor', type: 'integer', value: (r) => r.costMinor },
  { name: 'currency', type: 'text', value: (r) => r.currency },
];

/**
 * Blade runs. Natural key: the saw and the moment the blade went on (a saw carries one blade at a time). History
 * is not drawn from today's stock: an imported run has no stock receipt, and its cost is the file's cost column or
 * the spec's unit cost (decided for imports; see the contributor guide).
 */
const bladeRuns: KindWriter = {
  async settle(transaction, target, collected) {
    await stage(transaction, runColumns, collected);
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'present'
         FROM blade_runs r WHERE r.saw_id = s.saw_id AND r.installed_at = s.installed_at`,
    );
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'conflict', other_id = r.id, other_from = r.installed_at, other_to = r.removed_at
         FROM blade_runs r
        WHERE s.verdict = 'add' AND r.saw_id = s.saw_id
          AND tstzrange(r.installed_at, r.removed_at, '[)') && tstzrange(s.installed_at, s.removed_at, '[)')`,
    );
    return verdictsOf(
      transaction,
      (s) =>
        `Overlaps a blade run already recorded on this saw (put on ${at(target, s.other_from)}, ${s.other_to ? `taken off ${at(target, s.other_to)}` : 'still on'}; run ${s.other_id}); a saw carries one blade at a time`,
    );
  },
  async insert(transaction, target, batchId) {
    return countOf(
      transaction,
      `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, tension_mpa, material_group,
         break_in_followed, install_notes, cost_minor, currency, removed_at, removal_reason, area_cut_mm2, cuts,
         area_source, removal_notes, import_batch_id)
       SELECT $1, saw_id, blade_spec_id, installed_at, tension_mpa, material_group, break_in_followed, install_notes,
         cost_minor, currency, removed_at, removal_reason, area_cut_mm2, cuts,
         CASE WHEN removed_at IS NOT NULL AND (area_cut_mm2 IS NOT NULL OR cuts IS NOT NULL) THEN 'entered' END,
         removal_notes, $2
         FROM import_stage WHERE verdict = 'add' ORDER BY saw_id, installed_at`,
      [target.siteId, batchId],
    );
  },
  async dependents(transaction, batchId, since, at) {
    const found = await rows<{
      asset_tag: string;
      installed_at: Date;
      cut_logs: number;
      photos: number;
      changed: Date | null;
    }>(
      transaction,
      `SELECT s.asset_tag, r.installed_at,
              (SELECT count(*)::int FROM cut_logs c WHERE c.blade_run_id = r.id) AS cut_logs,
              (SELECT count(*)::int FROM photos p WHERE p.blade_run_id = r.id) AS photos,
              CASE WHEN r.updated_at > $2 THEN r.updated_at END AS changed
         FROM blade_runs r JOIN saws s ON s.id = r.saw_id
        WHERE r.import_batch_id = $1
          AND (r.updated_at > $2 OR EXISTS (SELECT 1 FROM cut_logs c WHERE c.blade_run_id = r.id)
               OR EXISTS (SELECT 1 FROM photos p WHERE p.blade_run_id = r.id))
        ORDER BY r.installed_at LIMIT 51`,
      [batchId, since],
    );
    return found.map((f) => {
      const what = [
        f.changed ? `was changed on ${at(f.changed)}` : null,
        f.cut_logs ? `has ${f.cut_logs} cut log${f.cut_logs > 1 ? 's' : ''}` : null,
        f.photos ? `has ${f.photos} photo${f.photos > 1 ? 's' : ''}` : null,
      ]
        .filter(Boolean)
        .join(' and ');
      return `the blade run on ${f.asset_tag} put on ${at(f.installed_at)} ${what}`;
    });
  },
  async remove(transaction, batchId) {
    return { bladeRuns: await countOf(transaction, 'DELETE FROM blade_runs WHERE import_batch_id = $1', [batchId]) };
  },
};

const stopColumns: Column<ImportedStop>[] = [
  { name: 'saw_id', type: 'uuid', value: (r) => r.sawId },
  { name: 'started_at', type: 'timestamptz', value: (r) => r.startedAt },
  { name: 'ended_at', type: 'timestamptz', value: (r) => r.endedAt },
  { name: 'category', type: 'text', value: (r) => r.category },
  { name: 'planned', type: 'boolean', value: (r) => r.planned },
  { name: 'notes', type: 'text', value: (r) => r.notes },
];

/** Stops. Natural key: the saw and the moment it stopped (stops of a saw never overlap). */
const stops: KindWriter = {
  async settle(transaction, target, collected) {
    await stage(transaction, stopColumns, collected);
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'present' FROM stops x WHERE x.saw_id = s.saw_id AND x.started_at = s.started_at`,
    );
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'conflict', other_id = x.id, other_from = x.started_at, other_to = x.ended_at
         FROM stops x
        WHERE s.verdict = 'add' AND x.saw_id = s.saw_id
          AND tstzrange(x.started_at, x.ended_at, '[)') && tstzrange(s.started_at, s.ended_at, '[)')`,
    );
    return verdictsOf(
      transaction,
      (s) =>
        `Overlaps a stop already recorded on this saw (from ${at(target, s.other_from)} to ${s.other_to ? at(target, s.other_to) : 'still going on'}; stop ${s.other_id}); stops of a saw do not overlap`,
    );
  },
  async insert(transaction, target, batchId) {
    return countOf(
      transaction,
      `INSERT INTO stops (site_id, saw_id, started_at, ended_at, category, planned, notes, import_batch_id)
       SELECT $1, saw_id, started_at, ended_at, category, planned, notes, $2
         FROM import_stage WHERE verdict = 'add' ORDER BY saw_id, started_at`,
      [target.siteId, batchId],
    );
  },
  async dependents(transaction, batchId, since, at) {
    const found = await rows<{ asset_tag: string; started_at: Date; updated_at: Date }>(
      transaction,
      `SELECT s.asset_tag, x.started_at, x.updated_at FROM stops x JOIN saws s ON s.id = x.saw_id
        WHERE x.import_batch_id = $1 AND x.updated_at > $2 ORDER BY x.started_at LIMIT 51`,
      [batchId, since],
    );
    return found.map((f) => `the stop of ${f.asset_tag} from ${at(f.started_at)} was changed on ${at(f.updated_at)}`);
  },
  async remove(transaction, batchId) {
    return { stops: await countOf(transaction, 'DELETE FROM stops WHERE import_batch_id = $1', [batchId]) };
  },
};

const sawColumns: Column<ImportedSaw>[] = [
  { name: 'asset_tag', type: 'text', value: (r) => r.assetTag },
  { name: 'name', type: 'text', value: (r) => r.name },
  { name: 'kind', type: 'text', value: (r) => r.kind },
  { name: 'head_feed', type: 'text', value: (r) => r.headFeed },
  { name: 'make', type: 'text', value: (r) => r.make },
  { name: 'model', type: 'text', value: (r) => r.model },
  { name: 'wheel_diameter_mm', type: 'double precision', value: (r) => r.wheelDiameterMm },
  { name: 'centre_distance_mm', type: 'double precision', value: (r) => r.centreDistanceMm },
  { name: 'band_width_mm', type: 'double precision', value: (r) => r.bandWidthMm },
  { name: 'band_thickness_mm', type: 'double precision', value: (r) => r.bandThicknessMm },
  { name: 'band_length_mm', type: 'double precision', value: (r) => r.bandLengthMm },
  { name: 'band_speed_min_m_per_min', type: 'double precision', value: (r) => r.bandSpeedMinMPerMin },
  { name: 'band_speed_max_m_per_min', type: 'double precision', value: (r) => r.bandSpeedMaxMPerMin },
  { name: 'capacity_round_mm', type: 'double precision', value: (r) => r.capacityRoundMm },
  { name: 'capacity_rect_width_mm', type: 'double precision', value: (r) => r.capacityRectWidthMm },
  { name: 'capacity_rect_height_mm', type: 'double precision', value: (r) => r.capacityRectHeightMm },
];

/** Saws. Natural key: the asset tag within the site, whatever its case. */
const saws: KindWriter = {
  async settle(transaction, target, collected) {
    await stage(transaction, sawColumns, collected);
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'present'
         FROM saws x WHERE x.site_id = $1 AND lower(x.asset_tag) = lower(s.asset_tag)`,
      [target.siteId],
    );
    return verdictsOf(transaction, () => 'Clashes with a saw already recorded');
  },
  async insert(transaction, target, batchId) {
    return countOf(
      transaction,
      `INSERT INTO saws (site_id, ${sawColumns.map((c) => c.name).join(', ')}, status, import_batch_id)
       SELECT $1, ${sawColumns.map((c) => c.name).join(', ')}, 'in_service', $2
         FROM import_stage WHERE verdict = 'add' ORDER BY asset_tag`,
      [target.siteId, batchId],
    );
  },
  async dependents(transaction, batchId, since, at) {
    const found = await rows<{
      asset_tag: string;
      runs: number;
      stops: number;
      cut_logs: number;
      receipts: number;
      changed: Date | null;
    }>(
      transaction,
      `SELECT s.asset_tag,
              (SELECT count(*)::int FROM blade_runs r WHERE r.saw_id = s.id) AS runs,
              (SELECT count(*)::int FROM stops x WHERE x.saw_id = s.id) AS stops,
              (SELECT count(*)::int FROM cut_logs c WHERE c.saw_id = s.id) AS cut_logs,
              0 AS receipts,
              CASE WHEN s.updated_at > $2 THEN s.updated_at END AS changed
         FROM saws s WHERE s.import_batch_id = $1
          AND (s.updated_at > $2 OR EXISTS (SELECT 1 FROM blade_runs r WHERE r.saw_id = s.id)
               OR EXISTS (SELECT 1 FROM stops x WHERE x.saw_id = s.id)
               OR EXISTS (SELECT 1 FROM cut_logs c WHERE c.saw_id = s.id))
        ORDER BY s.asset_tag LIMIT 51`,
      [batchId, since],
    );
    const plural = (n: number, word: string) => (n ? `${n} ${word}${n > 1 ? 's' : ''}` : null);
    return found.map((f) => {
      const held = [plural(f.runs, 'blade run'), plural(f.stops, 'stop'), plural(f.cut_logs, 'cut log')].filter(
        Boolean,
      );
      const parts = [
        held.length ? `has ${held.join(', ')} recorded since` : null,
        f.changed ? `was changed on ${at(f.changed)}` : null,
      ].filter(Boolean);
      return `saw ${f.asset_tag} ${parts.join(' and ')}`;
    });
  },
  async remove(transaction, batchId) {
    return { saws: await countOf(transaction, 'DELETE FROM saws WHERE import_batch_id = $1', [batchId]) };
  },
};

const receiptColumns: Column<ImportedReceipt>[] = [
  { name: 'blade_spec_id', type: 'uuid', value: (r) => r.bladeSpecId },
  { name: 'quantity', type: 'integer', value: (r) => r.quantity },
  { name: 'unit_cost_minor', type: 'integer', value: (r) => r.unitCostMinor },
  { name: 'currency', type: 'text', value: (r) => r.currency },
  { name: 'received_on', type: 'date', value: (r) => r.receivedOn },
  { name: 'reference', type: 'text', value: (r) => r.reference },
  { name: 'notes', type: 'text', value: (r) => r.notes },
];

/** Stock receipts. Fingerprint: spec, day, quantity, unit cost, currency and reference (case aside). */
const bladeStock: KindWriter = {
  async settle(transaction, target, collected) {
    await stage(transaction, receiptColumns, collected);
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'present'
         FROM stock_receipts x
        WHERE x.site_id = $1 AND x.blade_spec_id = s.blade_spec_id AND x.received_on = s.received_on
          AND x.quantity = s.quantity AND x.unit_cost_minor = s.unit_cost_minor AND x.currency = s.currency
          AND lower(coalesce(x.reference, '')) = lower(coalesce(s.reference, ''))`,
      [target.siteId],
    );
    return verdictsOf(transaction, () => 'Clashes with a receipt already recorded');
  },
  async insert(transaction, target, batchId, userId) {
    return countOf(
      transaction,
      `INSERT INTO stock_receipts (site_id, blade_spec_id, quantity, unit_cost_minor, currency, received_on, reference,
         notes, created_by_id, import_batch_id)
       SELECT $1, blade_spec_id, quantity, unit_cost_minor, currency, received_on, reference, notes, $3, $2
         FROM import_stage WHERE verdict = 'add' ORDER BY received_on`,
      [target.siteId, batchId, userId],
    );
  },
  async dependents(transaction, batchId, since, at) {
    const found = await rows<{ received_on: string; name: string; drawn: number; changed: Date | null }>(
      transaction,
      `SELECT to_char(x.received_on, 'YYYY-MM-DD') AS received_on, b.name,
              (SELECT count(*)::int FROM blade_runs r WHERE r.stock_receipt_id = x.id) AS drawn,
              CASE WHEN x.updated_at > $2 THEN x.updated_at END AS changed
         FROM stock_receipts x JOIN blade_specs b ON b.id = x.blade_spec_id
        WHERE x.import_batch_id = $1
          AND (x.updated_at > $2 OR EXISTS (SELECT 1 FROM blade_runs r WHERE r.stock_receipt_id = x.id))
        ORDER BY x.received_on LIMIT 51`,
      [batchId, since],
    );
    return found.map((f) => {
      const parts = [
        f.drawn ? `has ${f.drawn} blade${f.drawn > 1 ? 's' : ''} drawn onto saws` : null,
        f.changed ? `was changed on ${at(f.changed)}` : null,
      ].filter(Boolean);
      return `the ${f.name} receipt of ${f.received_on} ${parts.join(' and ')}`;
    });
  },
  async remove(transaction, batchId) {
    return {
      stockReceipts: await countOf(transaction, 'DELETE FROM stock_receipts WHERE import_batch_id = $1', [batchId]),
    };
  },
};

/** The kinds this installation writes. Check sheets join when the checks feature records checks. */
export const KIND_WRITERS: Partial<Record<ImportKind, KindWriter>> = {
  saws,
  blade_stock: bladeStock,
  blade_runs: bladeRuns,
  stops,
};
