import { QueryTypes, type Transaction } from 'sequelize';
import type { ImportKind, RowVerdict } from '@kerfline/domain/imports/schema';
import type { CollectedRow } from '@kerfline/domain/imports/pipeline';
import { ImportBatch } from './import-batch.model.js';
import { formatAt, namesOf, siteEffectiveSettings } from '../records/record-support.js';
import { SiteCheck } from '../site-checks/site-check.model.js';
import { Site } from '../sites/site.model.js';

import type { CheckAnswers } from '@kerfline/domain/site-checks/schema';
import { judgeCheckReading } from '@kerfline/domain/site-checks/evaluate';
import type { BladeMaterial, HeadFeed } from '@kerfline/domain/checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type {
  ImportedCheck,
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
       other_id uuid, other_from timestamptz, other_to timestamptz, reason text
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
    reason: string | null;
  }>(
    transaction,
    `SELECT idx, verdict, other_id, other_from, other_to, reason FROM import_stage WHERE verdict <> 'add'`,
  );
  return {
    verdicts: new Map(
      settled.map((s) => [
        s.idx,
        s.verdict === 'present'
          ? { verdict: 'present' as const, message: 'Already in Kerfline; skipped' }
          : { verdict: 'rejected' as const, message: s.reason ?? describe(s) },
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
      checks: number;
      changed: Date | null;
    }>(
      transaction,
      `SELECT s.asset_tag, r.installed_at,
              (SELECT count(*)::int FROM cut_logs c WHERE c.blade_run_id = r.id) AS cut_logs,
              (SELECT count(*)::int FROM photos p WHERE p.blade_run_id = r.id) AS photos,
              (SELECT count(*)::int FROM check_records k WHERE k.blade_run_id = r.id) AS checks,
              CASE WHEN r.updated_at > $2 THEN r.updated_at END AS changed
         FROM blade_runs r JOIN saws s ON s.id = r.saw_id
        WHERE r.import_batch_id = $1
          AND (r.updated_at > $2 OR EXISTS (SELECT 1 FROM cut_logs c WHERE c.blade_run_id = r.id)
               OR EXISTS (SELECT 1 FROM photos p WHERE p.blade_run_id = r.id)
               OR EXISTS (SELECT 1 FROM check_records k WHERE k.blade_run_id = r.id))
        ORDER BY r.installed_at LIMIT 51`,
      [batchId, since],
    );
    return found.map((f) => {
      const what = [
        f.changed ? `was changed on ${at(f.changed)}` : null,
        f.cut_logs ? `has ${f.cut_logs} cut log${f.cut_logs > 1 ? 's' : ''}` : null,
        f.photos ? `has ${f.photos} photo${f.photos > 1 ? 's' : ''}` : null,
        f.checks ? `has ${f.checks} check${f.checks > 1 ? 's' : ''} recorded with it` : null,
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
      checks: number;
      changed: Date | null;
    }>(
      transaction,
      `SELECT s.asset_tag,
              (SELECT count(*)::int FROM blade_runs r WHERE r.saw_id = s.id) AS runs,
              (SELECT count(*)::int FROM stops x WHERE x.saw_id = s.id) AS stops,
              (SELECT count(*)::int FROM cut_logs c WHERE c.saw_id = s.id) AS cut_logs,
              (SELECT count(*)::int FROM check_records k WHERE k.saw_id = s.id) AS checks,
              CASE WHEN s.updated_at > $2 THEN s.updated_at END AS changed
         FROM saws s WHERE s.import_batch_id = $1
          AND (s.updated_at > $2 OR EXISTS (SELECT 1 FROM blade_runs r WHERE r.saw_id = s.id)
               OR EXISTS (SELECT 1 FROM stops x WHERE x.saw_id = s.id)
               OR EXISTS (SELECT 1 FROM cut_logs c WHERE c.saw_id = s.id)
               OR EXISTS (SELECT 1 FROM check_records k WHERE k.saw_id = s.id))
        ORDER BY s.asset_tag LIMIT 51`,
      [batchId, since],
    );
    const plural = (n: number, word: string) => (n ? `${n} ${word}${n > 1 ? 's' : ''}` : null);
    return found.map((f) => {
      const held = [
        plural(f.runs, 'blade run'),
        plural(f.stops, 'stop'),
        plural(f.cut_logs, 'cut log'),
        plural(f.checks, 'check'),
      ].filter(Boolean);
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

const checkColumns: Column<ImportedCheck>[] = [
  { name: 'saw_id', type: 'uuid', value: (r) => r.sawId },
  { name: 'site_check_id', type: 'uuid', value: (r) => r.siteCheckId },
  { name: 'checked_at', type: 'timestamptz', value: (r) => r.checkedAt },
  { name: 'reading', type: 'double precision', value: (r) => r.reading },
  { name: 'answers', type: 'jsonb', value: (r) => (r.answers ? JSON.stringify(r.answers) : null) },
  { name: 'notes', type: 'text', value: (r) => r.notes },
  // Filled in on the server once each row is judged.
  { name: 'blade_run_id', type: 'uuid', value: () => null },
  { name: 'target_rule', type: 'text', value: () => null },
  { name: 'quantity', type: 'text', value: () => null },
  { name: 'target', type: 'double precision', value: () => null },
  { name: 'min_value', type: 'double precision', value: () => null },
  { name: 'max_value', type: 'double precision', value: () => null },
  { name: 'passed', type: 'boolean', value: () => null },
  { name: 'basis', type: 'jsonb', value: () => null },
  { name: 'explanation', type: 'text', value: () => null },
];

/**
 * Check sheets. Natural key: the saw, the check and the moment it was done. The verdict is never taken from the
 * file: each reading is judged here, as a check recorded in Kerfline is, against the target for that saw and the
 * blade that was on it then (the run covering the moment, found in one query for the whole file), with the site's
 * settings as they are now. A check that does not apply to the saw is rejected with why.
 */
const checks: KindWriter = {
  async settle(transaction, target, collected) {
    await stage(transaction, checkColumns, collected);
    await run(
      transaction,
      `UPDATE import_stage s SET verdict = 'present'
         FROM check_records x
        WHERE x.saw_id = s.saw_id AND x.site_check_id = s.site_check_id AND x.checked_at = s.checked_at`,
    );
    const staged = await rows<{
      idx: number;
      saw_id: string;
      site_check_id: string;
      reading: number | null;
      answers: CheckAnswers | null;
      run_id: string | null;
      thickness_mm: number | null;
      width_mm: number | null;
      material: BladeMaterial | null;
    }>(
      transaction,
      `SELECT s.idx, s.saw_id, s.site_check_id, s.reading, s.answers, b.run_id, b.thickness_mm, b.width_mm, b.material
         FROM import_stage s
         LEFT JOIN LATERAL (
           SELECT r.id AS run_id, p.thickness_mm, p.width_mm, p.material
             FROM blade_runs r JOIN blade_specs p ON p.id = r.blade_spec_id
            WHERE r.saw_id = s.saw_id AND r.installed_at <= s.checked_at
              AND (r.removed_at IS NULL OR r.removed_at > s.checked_at)
            ORDER BY r.installed_at DESC LIMIT 1) b ON true
        WHERE s.verdict = 'add'`,
    );
    const [siteChecks, sawRows, settings, site] = await Promise.all([
      SiteCheck.findAll({ where: { siteId: target.siteId }, transaction }),
      rows<{ id: string; band_thickness_mm: number; band_width_mm: number; head_feed: HeadFeed }>(
        transaction,
        'SELECT id, band_thickness_mm, band_width_mm, head_feed FROM saws WHERE site_id = $1',
        [target.siteId],
      ),
      siteEffectiveSettings(target.siteId, transaction),
      Site.findByPk(target.siteId, { attributes: ['unitSystem'], transaction }),
    ]);
    const names = await namesOf(siteChecks.map((c) => c.updatedById));
    const checkById = new Map(siteChecks.map((c) => [c.id, c]));
    const sawById = new Map(sawRows.map((w) => [w.id, w]));
    const judged = {
      idx: [] as number[],
      run: [] as (string | null)[],
      rule: [] as string[],
      quantity: [] as string[],
    };
    const figures = { target: [] as (number | null)[], min: [] as (number | null)[], max: [] as (number | null)[] };
    const verdict = { passed: [] as boolean[], basis: [] as (string | null)[], explanation: [] as string[] };
    const refused = { idx: [] as number[], reason: [] as string[] };
    for (const row of staged) {
      const check = checkById.get(row.site_check_id)!;
      const saw = sawById.get(row.saw_id)!;
      const blade =
        row.run_id && row.thickness_mm !== null && row.width_mm !== null && row.material !== null
          ? { thicknessMm: row.thickness_mm, widthMm: row.width_mm, material: row.material }
          : null;
      const outcome = judgeCheckReading(
        check,
        { bandThicknessMm: saw.band_thickness_mm, bandWidthMm: saw.band_width_mm, headFeed: saw.head_feed },
        blade,
        { reading: row.reading, answers: row.answers },
        {
          system: (site?.unitSystem ?? 'metric') as UnitSystem,
          settings,
          fixedBasis: {
            kind: 'site_setting',
            settingKey: `site_check.${check.id}`,
            changedByName: check.updatedById ? (names.get(check.updatedById) ?? null) : null,
            changedAt: check.updatedAt.toISOString(),
            note: 'Set on your site’s list of checks',
          },
        },
      );
      if (!outcome.ok) {
        refused.idx.push(row.idx);
        refused.reason.push(`${check.name}: ${outcome.message}`);
        continue;
      }
      const r = outcome.result;
      judged.idx.push(row.idx);
      judged.run.push(row.run_id);
      judged.rule.push(check.targetRule);
      judged.quantity.push(check.quantity);
      figures.target.push(r.target);
      figures.min.push(r.min);
      figures.max.push(r.max);
      verdict.passed.push(r.passed);
      verdict.basis.push(r.basis ? JSON.stringify(r.basis) : null);
      verdict.explanation.push(r.explanation);
    }
    if (judged.idx.length > 0)
      await run(
        transaction,
        `UPDATE import_stage s SET blade_run_id = j.run, target_rule = j.rule, quantity = j.quantity, target = j.target,
                min_value = j.min, max_value = j.max, passed = j.passed, basis = j.basis, explanation = j.explanation
           FROM unnest($1::int[], $2::uuid[], $3::text[], $4::text[], $5::double precision[], $6::double precision[],
                       $7::double precision[], $8::boolean[], $9::jsonb[], $10::text[])
                AS j(idx, run, rule, quantity, target, min, max, passed, basis, explanation)
          WHERE s.idx = j.idx`,
        [
          judged.idx,
          judged.run,
          judged.rule,
          judged.quantity,
          figures.target,
          figures.min,
          figures.max,
          verdict.passed,
          verdict.basis,
          verdict.explanation,
        ],
      );
    if (refused.idx.length > 0)
      await run(
        transaction,
        `UPDATE import_stage s SET verdict = 'conflict', reason = j.reason
           FROM unnest($1::int[], $2::text[]) AS j(idx, reason) WHERE s.idx = j.idx`,
        [refused.idx, refused.reason],
      );
    return verdictsOf(transaction, () => 'Cannot be recorded');
  },
  async insert(transaction, target, batchId) {
    return countOf(
      transaction,
      `INSERT INTO check_records (site_id, saw_id, site_check_id, blade_run_id, checked_at, target_rule, quantity,
         reading, answers, target, min_value, max_value, passed, basis, explanation, notes, import_batch_id)
       SELECT $1, saw_id, site_check_id, blade_run_id, checked_at, target_rule, quantity,
         CASE WHEN quantity = 'condition' THEN NULL ELSE reading END,
         CASE WHEN quantity = 'condition' THEN answers END,
         target, min_value, max_value, passed, basis, explanation, notes, $2
         FROM import_stage WHERE verdict = 'add' ORDER BY saw_id, checked_at`,
      [target.siteId, batchId],
    );
  },
  async dependents(transaction, batchId, _since, at) {
    const found = await rows<{ asset_tag: string; name: string; checked_at: Date; photos: number }>(
      transaction,
      `SELECT s.asset_tag, c.name, x.checked_at, (SELECT count(*)::int FROM photos p WHERE p.check_record_id = x.id) AS photos
         FROM check_records x JOIN saws s ON s.id = x.saw_id JOIN site_checks c ON c.id = x.site_check_id
        WHERE x.import_batch_id = $1 AND EXISTS (SELECT 1 FROM photos p WHERE p.check_record_id = x.id)
        ORDER BY x.checked_at LIMIT 51`,
      [batchId],
    );
    return found.map(
      (f) =>
        `the ${f.name} check of ${f.asset_tag} on ${at(f.checked_at)} has ${f.photos} photo${f.photos > 1 ? 's' : ''}`,
    );
  },
  async remove(transaction, batchId) {
    return {
      checkRecords: await countOf(transaction, 'DELETE FROM check_records WHERE import_batch_id = $1', [batchId]),
    };
  },
};

/** The kinds this installation writes. */
export const KIND_WRITERS: Partial<Record<ImportKind, KindWriter>> = {
  saws,
  blade_stock: bladeStock,
  blade_runs: bladeRuns,
  stops,
  checks,
};
