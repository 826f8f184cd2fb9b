import { createHash } from 'node:crypto';
import { ForbiddenError, subject } from '@casl/ability';
import { ConnectionError, Op, type Transaction } from 'sequelize';
import iconv from 'iconv-lite';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import {
  memoryFromPlan,
  importMemorySchema,
  type ImportBatch as ImportBatchDto,
  type ImportCommitResult,
  type ImportContext,
  type ImportContextQuery,
  type ImportKind,
  type ImportListQuery,
  type ImportPlan,
  type ImportSummary,
} from '@kerfline/domain/imports/schema';
import {
  ImportCollector,
  TableError,
  bytesSource,
  readRows,
  standardDecoders,
  type DecoderFactory,
  type Opened,
} from '@kerfline/domain/imports/pipeline';
import type { ImportTarget } from '@kerfline/domain/imports/build';
import { normaliseHeader } from '@kerfline/domain/imports/values';
import { csvFile } from '@kerfline/domain/imports/csv-out';
import { IMPORT_KIND_LABELS } from '@kerfline/domain/imports/fields';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from '../sites/site.model.js';
import { formatAt, namesOf, select } from '../records/record-support.js';
import { ImportBatch, ImportMapping } from './import-batch.model.js';
import { KIND_WRITERS, type Settled } from './import-writers.js';

export type ImportLimits = { maxBytes: number; maxRows: number };
/** 50 MiB and 200 000 rows unless IMPORT_MAX_BYTES / IMPORT_MAX_ROWS say otherwise. */
export const DEFAULT_IMPORT_LIMITS: ImportLimits = { maxBytes: 50 * 1024 * 1024, maxRows: 200_000 };

/** The kinds this installation writes; check sheets come with the checks feature. */
export const AVAILABLE_KINDS: ImportKind[] = Object.keys(KIND_WRITERS) as ImportKind[];

/**
 * Node's TextDecoder reads Windows-1252 as ISO-8859-1 (0x80–0x9F come out as control characters instead of €, “,
 * – and the like): that encoding goes through iconv-lite. The rest are right in Node.
 */
export const serverDecoders: DecoderFactory = (encoding, fatal) => {
  if (encoding !== 'windows-1252') return standardDecoders(encoding, fatal);
  const d = iconv.getDecoder('windows-1252');
  return { write: (c) => d.write(Buffer.from(c.buffer, c.byteOffset, c.byteLength)), end: () => d.end() ?? '' };
};

/** A file as the router received it. */
export type ReceivedFile = { bytes: Buffer; fileName: string };

/**
 * The site an import goes into: one the caller cannot read is "not found" (404), as for any record; one they read
 * but may not import into answers 403.
 */
async function siteForImport(ability: AppAbility, siteId: string): Promise<Site> {
  const site = await Site.findOne({ where: scopedWhere(ability, 'read', 'Site', Site, { id: siteId }) });
  if (!site) throw AppError.notFound('Site');
  ForbiddenError.from(ability)
    .setMessage('Only the site’s admins bring files into it')
    .throwUnlessCan('create', subject('ImportBatch', { id: '', siteId: site.id }) as never);
  if (site.retiredAt) throw new AppError('CONFLICT', `${site.name} is retired; its records are kept as they are`);
  return site;
}

/** What rows of a file may name at a site: its saws (retired ones too, to say so) and the specs it can use. */
async function targetOf(site: Site): Promise<ImportTarget> {
  const saws = await select<{ id: string; asset_tag: string; name: string; status: string }>(
    `SELECT id, asset_tag, name, status FROM saws WHERE site_id = :siteId ORDER BY asset_tag`,
    { siteId: site.id },
  );
  const specs = await select<{
    id: string;
    name: string;
    unit_cost_minor: number;
    currency: string;
    archived: boolean;
  }>(
    `SELECT id, name, unit_cost_minor, currency, archived FROM blade_specs
      WHERE site_id IS NULL OR site_id = :siteId ORDER BY name`,
    { siteId: site.id },
  );
  const checks = await select<{
    id: string;
    name: string;
    quantity: 'length' | 'force' | 'stress' | 'condition';
    retired_at: Date | null;
  }>(`SELECT id, name, quantity, retired_at FROM site_checks WHERE site_id = :siteId ORDER BY position, name`, {
    siteId: site.id,
  });
  return {
    siteId: site.id,
    timeZone: site.timeZone,
    currency: site.currency.trim(),
    unitSystem: site.unitSystem as 'metric' | 'imperial',
    checks: checks.map((c) => ({ id: c.id, name: c.name, quantity: c.quantity, retired: c.retired_at !== null })),
    saws: saws.map((s) => ({ id: s.id, assetTag: s.asset_tag, name: s.name, retired: s.status === 'retired' })),
    specs: specs.map((s) => ({
      id: s.id,
      name: s.name,
      unitCostMinor: s.unit_cost_minor,
      currency: s.currency.trim(),
      archived: s.archived,
    })),
  };
}

async function memoryOf(siteId: string, kind: ImportKind) {
  const row = await ImportMapping.findOne({ where: { siteId, kind } });
  if (!row) return null;
  const names = await namesOf([row.updatedById]);
  const parsed = importMemorySchema.safeParse({
    ...row.memory,
    updatedAt: row.updatedAt.toISOString(),
    updatedByName: row.updatedById ? (names.get(row.updatedById) ?? null) : null,
  });
  return parsed.success ? parsed.data : null;
}

/** What the wizard needs for a site and kind: saws, specs, units, time zone, the remembered mapping, the limits. */
export async function getImportContext(
  ability: AppAbility,
  q: ImportContextQuery,
  limits: ImportLimits,
): Promise<ImportContext> {
  const site = await siteForImport(ability, q.siteId);
  const target = await targetOf(site);
  return {
    site: {
      id: site.id,
      name: site.name,
      timeZone: site.timeZone,
      currency: target.currency,
      unitSystem: site.unitSystem as 'metric' | 'imperial',
    },
    saws: target.saws.map((s) => ({ ...s })),
    specs: target.specs.map((s) => ({ ...s })),
    checks: (target.checks ?? []).map((c) => ({ ...c })),
    memory: await memoryOf(site.id, q.kind),
    limits,
    kinds: AVAILABLE_KINDS,
  };
}

type Prepared = {
  site: Site;
  target: ImportTarget;
  opened: Opened;
  collector: ImportCollector;
  sha256: string;
};

/** Reads the file again on the server with the user's plan; a file that cannot be read is a 400 in words. */
async function prepare(
  ability: AppAbility,
  file: ReceivedFile,
  plan: ImportPlan,
  limits: ImportLimits,
): Promise<Prepared> {
  const site = await siteForImport(ability, plan.siteId);
  if (!AVAILABLE_KINDS.includes(plan.kind))
    throw AppError.validation(
      `${IMPORT_KIND_LABELS[plan.kind].title} cannot be brought in yet: this installation does not record them`,
      [{ path: 'kind', message: `choose one of ${AVAILABLE_KINDS.join(', ')}` }],
    );
  if (file.bytes.length > limits.maxBytes) throw tooLarge(limits);
  const target = await targetOf(site);
  const collector = new ImportCollector(plan.kind, plan, target, {
    previewRows: 20,
    maxProblems: 200,
    keepCells: true,
  });
  let opened: Opened;
  try {
    opened = await readRows(
      bytesSource(new Uint8Array(file.bytes.buffer, file.bytes.byteOffset, file.bytes.byteLength), file.fileName),
      { format: plan.format, encoding: plan.encoding, delimiter: plan.delimiter, sheet: plan.sheet },
      serverDecoders,
      { maxRows: limits.maxRows },
      collector.consumer,
    );
  } catch (err) {
    if (err instanceof TableError) throw AppError.validation(err.message, [{ path: 'file', message: err.message }]);
    throw err;
  }
  const expected = plan.columns.map((c) => normaliseHeader(c.header) || c.header);
  const found = opened.header.map((h) => normaliseHeader(h) || h);
  if (expected.length !== found.length || expected.some((h, i) => h !== found[i]))
    throw AppError.validation(
      'The file’s columns are not the ones the mapping was made for: read the file again in the wizard and check the columns',
      [{ path: 'plan.columns', message: `the file has ${opened.header.map((h) => `“${h}”`).join(', ')}` }],
    );
  collector.finish();
  return { site, target, opened, collector, sha256: createHash('sha256').update(file.bytes).digest('hex') };
}

export function tooLarge(limits: ImportLimits): AppError {
  const mb = Math.floor(limits.maxBytes / (1024 * 1024));
  return new AppError(
    'PAYLOAD_TOO_LARGE',
    `The file is larger than ${mb} MB, the most one import takes: split it (by year, say) and bring the parts in one after another`,
    [{ path: 'file', message: `must be at most ${mb} MB` }],
  );
}

async function earlierImports(siteId: string, sha256: string, exceptId: string | null = null) {
  const rows = await select<{ id: string; created_at: Date; state: string; created_by_id: string | null }>(
    `SELECT id, created_at, state, created_by_id FROM import_batches
      WHERE site_id = :siteId AND content_sha256 = :sha256 AND (:exceptId::uuid IS NULL OR id <> :exceptId::uuid)
      ORDER BY created_at DESC LIMIT 5`,
    { siteId, sha256, exceptId },
  );
  const names = await namesOf(rows.map((r) => r.created_by_id));
  return rows.map((r) => ({
    id: r.id,
    createdAt: r.created_at.toISOString(),
    state: r.state,
    createdByName: r.created_by_id ? (names.get(r.created_by_id) ?? null) : null,
  }));
}

/** The records of the file that would be written, staged and settled against the database in `transaction`. */
async function settle(transaction: Transaction, p: Prepared): Promise<Settled> {
  const writer = KIND_WRITERS[p.collector.kind]!;
  const adds = p.collector.rows.filter((_, i) => p.collector.verdictOf(i).verdict === 'add');
  await ImportBatch.sequelize!.query(`SELECT pg_advisory_xact_lock(hashtext('kerfline-import:' || $1))`, {
    bind: [p.site.id],
    transaction,
  });
  return writer.settle(transaction, p.target, adds);
}

function summaryOf(p: Prepared, file: ReceivedFile, settled: Settled['verdicts'], earlier: ImportSummary['earlier']) {
  return {
    fileName: file.fileName,
    bytes: file.bytes.length,
    sha256: p.sha256,
    format: p.opened.format,
    encoding: p.opened.encoding,
    delimiter: p.opened.delimiter,
    sheet: p.opened.sheet,
    ...p.collector.summary(settled),
    earlier,
  } satisfies ImportSummary;
}

class DryRun extends Error {
  constructor(readonly settled: Settled) {
    super('dry run');
  }
}

/**
 * Reads the file with the plan and settles every row against the site's records without writing anything: the
 * counts of rows to add, already present, repeated and rejected, the first rows as they would be stored, the
 * problems, and what matched nothing.
 */
export async function checkImport(
  ability: AppAbility,
  file: ReceivedFile,
  plan: ImportPlan,
  limits: ImportLimits,
): Promise<ImportSummary> {
  const p = await prepare(ability, file, plan, limits);
  let settled: Settled | null = null;
  try {
    await inTransaction(async (transaction) => {
      throw new DryRun(await settle(transaction, p));
    });
  } catch (err) {
    if (!(err instanceof DryRun)) throw err;
    settled = err.settled;
  }
  return summaryOf(p, file, settled!.verdicts, await earlierImports(p.site.id, p.sha256));
}

/** Rejected rows: the file's cells and the reason, written with the batch for the download. */
async function writeRejects(transaction: Transaction, batchId: string, p: Prepared, settled: Settled) {
  const numbers: number[] = [];
  const cells: string[] = [];
  const reasons: string[] = [];
  p.collector.rows.forEach((row, i) => {
    const db = settled.verdicts.get(row.rowNumber);
    const verdict = db ?? p.collector.verdictOf(i);
    if (verdict.verdict !== 'rejected') return;
    numbers.push(row.rowNumber);
    cells.push(row.cellsJson ?? '[]');
    reasons.push(db?.message ?? row.error ?? verdict.message ?? 'Not readable');
  });
  if (numbers.length === 0) return;
  await ImportBatch.sequelize!.query(
    `INSERT INTO import_rejects (batch_id, row_number, cells, reason)
     SELECT $1, n, c, r FROM unnest($2::int[], $3::jsonb[], $4::text[]) AS t(n, c, r)`,
    { bind: [batchId, numbers, cells, reasons], transaction },
  );
}

/**
 * Brings a file into the caller's site: read again with the plan, every row checked with the records' own
 * schemas, rows already present (same natural key) skipped and counted, and the rest written in one transaction
 * with bulk inserts, each carrying the batch's id. The batch is recorded first, on its own, so a failure part way
 * (the database connection lost, say) rolls the rows back and leaves the batch marked failed with the reason; the
 * same file can then simply be sent again.
 */
export async function commitImport(
  { ability, userId }: Actor,
  file: ReceivedFile,
  plan: ImportPlan,
  limits: ImportLimits,
): Promise<ImportCommitResult> {
  const p = await prepare(ability, file, plan, limits);
  const earlier = await earlierImports(p.site.id, p.sha256);
  const batch = await ImportBatch.create({
    siteId: p.site.id,
    kind: plan.kind,
    state: 'running',
    fileName: file.fileName,
    fileBytes: file.bytes.length,
    contentSha256: p.sha256,
    sheet: p.opened.sheet,
    plan: plan as unknown as Record<string, unknown>,
    columns: p.opened.header,
    rowsTotal: p.collector.rows.length,
    createdById: userId,
  });
  try {
    const summary = await inTransaction(async (transaction) => {
      const settled = await settle(transaction, p);
      const added = await KIND_WRITERS[plan.kind]!.insert(transaction, p.target, batch.id, userId);
      await writeRejects(transaction, batch.id, p, settled);
      const summary = summaryOf(p, file, settled.verdicts, earlier);
      if (added !== summary.rowsValid) throw new Error(`import wrote ${added} rows, expected ${summary.rowsValid}`);
      await batch.update(
        {
          state: 'committed',
          rowsAdded: added,
          rowsPresent: summary.rowsPresent,
          rowsRepeated: summary.rowsRepeated,
          rowsRejected: summary.rowsRejected,
          finishedAt: new Date(),
        },
        { transaction },
      );
      await writeAudit(transaction, userId, [
        {
          siteId: p.site.id,
          entity: 'ImportBatch',
          entityId: batch.id,
          action: 'create',
          after: {
            kind: plan.kind,
            fileName: file.fileName,
            sha256: p.sha256,
            rowsTotal: summary.rowsTotal,
            rowsAdded: added,
            rowsPresent: summary.rowsPresent,
            rowsRepeated: summary.rowsRepeated,
            rowsRejected: summary.rowsRejected,
          },
        },
      ]);
      await rememberMapping(transaction, p.site.id, plan, userId);
      return summary;
    });
    return { batch: await getImport(ability, batch.id), summary };
  } catch (err) {
    await markFailed(batch.id, err);
    if (err instanceof AppError) throw err;
    throw new AppError(
      'UNAVAILABLE',
      `The import stopped before it finished${err instanceof ConnectionError || isConnectionLoss(err) ? ' (the database connection was lost)' : ''}; nothing from this file was written. Send the same file again to retry.`,
    );
  }
}

function isConnectionLoss(err: unknown): boolean {
  const e = err as { parent?: { code?: string }; original?: { code?: string }; message?: string } | null;
  const code = e?.parent?.code ?? e?.original?.code;
  return code === '57P01' || code === '57P02' || code === '08006' || /terminat|Connection/i.test(e?.message ?? '');
}

/** Marks a batch failed after its transaction rolled back; if even that fails, the batch reads as stopped. */
async function markFailed(batchId: string, err: unknown): Promise<void> {
  const reason =
    err instanceof AppError
      ? err.message
      : isConnectionLoss(err)
        ? 'The database connection was lost while writing'
        : 'Writing failed';
  try {
    await ImportBatch.update(
      { state: 'failed', error: reason, finishedAt: new Date() },
      { where: { id: batchId, state: 'running' } },
    );
  } catch {
    // The database is unreachable: the batch stays 'running' and is shown as stopped (see batchDto).
  }
}

async function rememberMapping(transaction: Transaction, siteId: string, plan: ImportPlan, userId: string) {
  const memory = memoryFromPlan(plan);
  await ImportBatch.sequelize!.query(
    `INSERT INTO import_mappings (site_id, kind, memory, updated_by_id) VALUES ($1, $2, $3::jsonb, $4)
     ON CONFLICT (site_id, kind) DO UPDATE SET memory = EXCLUDED.memory, updated_by_id = EXCLUDED.updated_by_id,
       updated_at = now()`,
    { bind: [siteId, plan.kind, JSON.stringify(memory), userId], transaction },
  );
}

/** A batch still "running" an hour after it started was cut off without being marked (the database was down). */
const STALE_RUNNING_MS = 60 * 60 * 1000;

async function toDtos(batches: ImportBatch[]): Promise<ImportBatchDto[]> {
  const names = await namesOf(batches.flatMap((b) => [b.createdById, b.undoneById]));
  return batches.map((b) => {
    const stale = b.state === 'running' && Date.now() - b.createdAt.getTime() > STALE_RUNNING_MS;
    return {
      id: b.id,
      siteId: b.siteId,
      kind: b.kind,
      state: stale ? 'failed' : b.state,
      fileName: b.fileName,
      bytes: b.fileBytes,
      sha256: b.contentSha256,
      sheet: b.sheet,
      rowsTotal: b.rowsTotal,
      rowsAdded: b.rowsAdded,
      rowsPresent: b.rowsPresent,
      rowsRepeated: b.rowsRepeated,
      rowsRejected: b.rowsRejected,
      error: stale ? 'The import was cut off before it finished; nothing from it was written' : b.error,
      createdById: b.createdById,
      createdByName: b.createdById ? (names.get(b.createdById) ?? null) : null,
      createdAt: b.createdAt.toISOString(),
      finishedAt: b.finishedAt?.toISOString() ?? null,
      undoneAt: b.undoneAt?.toISOString() ?? null,
      undoneByName: b.undoneById ? (names.get(b.undoneById) ?? null) : null,
    };
  });
}

/** The imports the caller may see, newest first, paged. */
export async function listImports(ability: AppAbility, q: ImportListQuery): Promise<Page<ImportBatchDto>> {
  const filter: Record<string, unknown>[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.kind) filter.push({ kind: q.kind });
  const { rows, count } = await ImportBatch.findAndCountAll({
    where: scopedWhere(ability, 'read', 'ImportBatch', ImportBatch, { [Op.and]: filter }),
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await toDtos(rows), total: count, limit: q.limit, offset: q.offset };
}

async function readableBatch(ability: AppAbility, id: string, transaction?: Transaction): Promise<ImportBatch> {
  const batch = await ImportBatch.findOne({
    where: scopedWhere(ability, 'read', 'ImportBatch', ImportBatch, { id }),
    transaction,
    ...(transaction ? { lock: transaction.LOCK.UPDATE } : {}),
  });
  if (!batch) throw AppError.notFound('Import');
  return batch;
}

export async function getImport(ability: AppAbility, id: string): Promise<ImportBatchDto> {
  const [dto] = await toDtos([await readableBatch(ability, id)]);
  return dto!;
}

/** The rejected rows of an import as CSV: the file's own columns and a last column saying why. */
export async function rejectedRowsCsv(ability: AppAbility, id: string): Promise<{ fileName: string; csv: string }> {
  const batch = await readableBatch(ability, id);
  const rows = await select<{ row_number: number; cells: unknown[]; reason: string }>(
    `SELECT row_number, cells, reason FROM import_rejects WHERE batch_id = :id ORDER BY row_number`,
    { id },
  );
  const header = ['Row', ...batch.columns, 'Why Kerfline did not bring it in'];
  const base = batch.fileName.replace(/\.[^.]+$/, '').replace(/[^\w.-]+/g, '-') || 'import';
  return {
    fileName: `${base}-rejected-rows.csv`,
    csv: csvFile(
      header,
      rows.map((r) => [r.row_number, ...batch.columns.map((_, i) => r.cells[i] ?? null), r.reason]),
    ),
  };
}

/**
 * Takes a whole import back out, in one transaction: every record it wrote is deleted, and nothing else. The batch
 * and its audit entries stay, the batch marked undone. Refused (409) while later records depend on the imported
 * ones (a blade run on an imported saw, a blade drawn from an imported receipt, a cut log or photo of an imported
 * run, an imported record changed since), naming them.
 */
export async function undoImport({ ability, userId }: Actor, id: string): Promise<ImportBatchDto> {
  await inTransaction(async (transaction) => {
    const batch = await readableBatch(ability, id, transaction);
    ForbiddenError.from(ability)
      .setMessage('Only the site’s admins take an import back out')
      .throwUnlessCan('update', subject('ImportBatch', { id: batch.id, siteId: batch.siteId }) as never);
    if (batch.state === 'undone')
      throw new AppError(
        'CONFLICT',
        `This import was already taken back out on ${batch.undoneAt!.toISOString().slice(0, 10)}`,
      );
    if (batch.state !== 'committed')
      throw new AppError('CONFLICT', 'This import did not finish, so it wrote nothing to take out');
    // Imports into the same site wait: what depends on this batch cannot change while it is checked and removed.
    await ImportBatch.sequelize!.query(`SELECT pg_advisory_xact_lock(hashtext('kerfline-import:' || $1))`, {
      bind: [batch.siteId],
      transaction,
    });
    const writer = KIND_WRITERS[batch.kind]!;
    const site = await Site.findByPk(batch.siteId, { attributes: ['timeZone'], transaction });
    const tz = site?.timeZone ?? 'UTC';
    const blockers = await writer.dependents(transaction, batch.id, batch.finishedAt!, (d) => formatAt(d, tz));
    if (blockers.length > 0)
      throw new AppError(
        'CONFLICT',
        `This import cannot be taken out: ${blockers.length === 1 ? 'a later record depends' : `${blockers.length} later records depend`} on what it brought in. ${blockers.slice(0, 3).join('; ')}${blockers.length > 3 ? `; and ${blockers.length - 3} more` : ''}. Undo or change those first.`,
        blockers.slice(0, 50).map((message) => ({ path: 'records', message })),
      );
    const removed = await writer.remove(transaction, batch.id);
    await batch.update({ state: 'undone', undoneAt: new Date(), undoneById: userId }, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: batch.siteId,
        entity: 'ImportBatch',
        entityId: batch.id,
        action: 'undo',
        before: { kind: batch.kind, fileName: batch.fileName, state: 'committed', rowsAdded: batch.rowsAdded, removed },
      },
    ]);
  });
  return getImport(ability, id);
}
