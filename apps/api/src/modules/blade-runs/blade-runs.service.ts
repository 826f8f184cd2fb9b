import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import type { RecordWarning } from '@kerfline/domain/records/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { REMOVAL_REASON_LABELS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { CAUSES } from '@kerfline/domain/diagnosis/likely-causes';
import type {
  BladeRun as BladeRunDto,
  BladeRunInstallParsed,
  BladeRunInstallResult,
  BladeRunListQuery,
  BladeRunRemoveParsed,
  BladeRunUpdate,
  BreakInAdvice,
  BreakInAdviceQuery,
  ConfirmCause,
  LikelyCausesQuery,
  RunDiagnosis,
} from '@kerfline/domain/blade-runs/schema';
import type { RemoveRecordInput } from '@kerfline/domain/removed-records/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Saw } from '../saws/saw.model.js';
import { Site } from '../sites/site.model.js';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { BladeSpec } from '../blade-specs/blade-spec.model.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import { removeToKept } from '../removed-records/keep-records.js';
import {
  auditCopy,
  formatAt,
  namesOf,
  orderOf,
  pgError,
  sawForWrite,
  select,
  siteEffectiveSettings,
  siteTimeZone,
} from '../records/record-support.js';
import { breakInAdvice, diagnose, type DiagnosisCutLog } from '../records/trade.js';
import { checksEvidence } from '../site-checks/recent-checks.js';
import { BladeRun } from './blade-run.model.js';

/** Names of the saw and the spec, and the photo count, read in the same query as the runs. */
const DERIVED = {
  include: [
    [literal(`(SELECT asset_tag FROM saws WHERE saws.id = "BladeRun".saw_id)`), 'sawAssetTag'],
    [literal(`(SELECT name FROM blade_specs WHERE blade_specs.id = "BladeRun".blade_spec_id)`), 'bladeSpecName'],
    [literal(`(SELECT count(*)::int FROM photos WHERE photos.blade_run_id = "BladeRun".id)`), 'photoCount'],
  ] as [ReturnType<typeof literal>, string][],
};

const iso = (d: Date | null): string | null => (d ? d.toISOString() : null);

async function toDtos(runs: BladeRun[]): Promise<BladeRunDto[]> {
  const names = await namesOf(runs.flatMap((r) => [r.installedById, r.removedById]));
  return runs.map((r) => ({
    id: r.id,
    siteId: r.siteId,
    sawId: r.sawId,
    sawAssetTag: String(r.get('sawAssetTag') ?? ''),
    bladeSpecId: r.bladeSpecId,
    bladeSpecName: String(r.get('bladeSpecName') ?? ''),
    stockReceiptId: r.stockReceiptId,
    installedAt: r.installedAt.toISOString(),
    installedById: r.installedById,
    installedByName: r.installedById ? (names.get(r.installedById) ?? null) : null,
    tensionMpa: r.tensionMpa,
    materialGroup: r.materialGroup,
    breakInFollowed: r.breakInFollowed,
    installNotes: r.installNotes,
    costMinor: r.costMinor,
    currency: r.currency.trim(),
    removedAt: iso(r.removedAt),
    removedById: r.removedById,
    removedByName: r.removedById ? (names.get(r.removedById) ?? null) : null,
    removalReason: r.removalReason,
    areaCutMm2: r.areaCutMm2,
    cuts: r.cuts,
    areaSource: r.areaSource,
    removalNotes: r.removalNotes,
    confirmedCause: r.confirmedCause as BladeRunDto['confirmedCause'],
    confirmedCauseAt: iso(r.confirmedCauseAt),
    confirmedCauseById: r.confirmedCauseById,
    photoCount: Number(r.get('photoCount') ?? 0),
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  }));
}

const auditValues = (run: BladeRun) => auditCopy(run, ['sawAssetTag', 'bladeSpecName', 'photoCount']);

/** Blade runs the caller may read, newest first by default, paged; never a whole history. */
export async function listBladeRuns(ability: AppAbility, q: BladeRunListQuery): Promise<Page<BladeRunDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.sawId) filter.push({ sawId: q.sawId });
  if (q.bladeSpecId) filter.push({ bladeSpecId: q.bladeSpecId });
  if (q.reason) filter.push({ removalReason: q.reason });
  if (q.open === true) filter.push({ removedAt: null });
  if (q.open === false) filter.push({ removedAt: { [Op.ne]: null } });
  if (q.from) filter.push({ installedAt: { [Op.gte]: q.from } });
  if (q.to) filter.push({ installedAt: { [Op.lt]: q.to } });
  const { rows, count } = await BladeRun.findAndCountAll({
    where: scopedWhere(ability, 'read', 'BladeRun', BladeRun, { [Op.and]: filter }),
    attributes: DERIVED,
    order: orderOf(q.sort),
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await toDtos(rows), total: count, limit: q.limit, offset: q.offset };
}

async function findReadableRun(ability: AppAbility, id: string, transaction?: Transaction): Promise<BladeRun> {
  const run = await BladeRun.findOne({
    where: scopedWhere(ability, 'read', 'BladeRun', BladeRun, { id }),
    attributes: DERIVED,
    transaction,
  });
  if (!run) throw AppError.notFound('Blade run');
  return run;
}

export async function getBladeRun(ability: AppAbility, id: string): Promise<BladeRunDto> {
  const [dto] = await toDtos([await findReadableRun(ability, id)]);
  return dto!;
}

/** A spec a blade on this saw may use: fleet-wide or the saw's own site's, and not archived. */
async function specForSaw(ability: AppAbility, saw: Saw, bladeSpecId: string): Promise<BladeSpec> {
  const spec = await BladeSpec.findOne({
    where: scopedWhere(ability, 'read', 'BladeSpec', BladeSpec, { id: bladeSpecId }),
  });
  if (!spec || (spec.siteId !== null && spec.siteId !== saw.siteId))
    throw AppError.validation('That blade spec is not in this site’s catalogue', [
      { path: 'bladeSpecId', message: 'choose a blade spec of this site’s catalogue' },
    ]);
  if (spec.archived)
    throw AppError.validation(`Blade spec ${spec.name} is archived`, [
      { path: 'bladeSpecId', message: 'choose a spec that is still offered' },
    ]);
  return spec;
}

/** Median cutting rate (mm²/min) of this saw's timed cut logs for the material in the last 90 days. */
async function usualCuttingRate(sawId: string, materialGroup: MaterialGroup | null): Promise<number | null> {
  if (!materialGroup) return null;
  const [row] = await select<{ rate: number | null }>(
    `SELECT percentile_cont(0.5) WITHIN GROUP (ORDER BY area_per_cut_mm2 / (cut_time_s / 60.0)) AS rate
       FROM (SELECT area_per_cut_mm2, cut_time_s FROM cut_logs
              WHERE saw_id = :sawId AND material_group = :materialGroup AND cut_time_s IS NOT NULL
                AND cut_at > now() - interval '90 days'
              ORDER BY cut_at DESC LIMIT 200) recent`,
    { sawId, materialGroup },
  );
  return row?.rate ?? null;
}

/** The saw's site's unit system, for the wording of speeds in the break-in plan. */
async function unitSystemOf(saw: Saw): Promise<UnitSystem> {
  const site = await Site.findByPk(saw.siteId, { attributes: ['unitSystem'] });
  return (site?.unitSystem ?? 'metric') as UnitSystem;
}

async function readableSaw(ability: AppAbility, sawId: string): Promise<Saw> {
  const saw = await Saw.findOne({ where: scopedWhere(ability, 'read', 'Saw', Saw, { id: sawId }) });
  if (!saw) throw AppError.notFound('Saw');
  return saw;
}

/** The break-in plan for this saw, a spec and a material, as the install form shows it before saving. */
export async function getBreakInAdvice(
  ability: AppAbility,
  sawId: string,
  q: BreakInAdviceQuery,
): Promise<BreakInAdvice> {
  const saw = await readableSaw(ability, sawId);
  const spec = await BladeSpec.findOne({
    where: scopedWhere(ability, 'read', 'BladeSpec', BladeSpec, { id: q.bladeSpecId }),
  });
  if (!spec)
    throw AppError.validation('That blade spec does not exist', [
      { path: 'bladeSpecId', message: 'choose a blade spec' },
    ]);
  const materialGroup = q.materialGroup ?? null;
  return breakInAdvice(
    saw,
    spec,
    materialGroup,
    await usualCuttingRate(saw.id, materialGroup),
    await unitSystemOf(saw),
    await siteEffectiveSettings(saw.siteId),
  );
}

/** The run whose time range collides with [from, to) on this saw, named for a 409. */
async function collidingRunMessage(sawId: string, selfId: string | null, from: Date, to: Date | null, siteId: string) {
  const [other] = await select<{ id: string; installed_at: Date; removed_at: Date | null; name: string }>(
    `SELECT r.id, r.installed_at, r.removed_at, b.name FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
      WHERE r.saw_id = :sawId AND (:selfId::uuid IS NULL OR r.id <> :selfId::uuid)
        AND tstzrange(r.installed_at, r.removed_at, '[)') && tstzrange(:from, :to, '[)')
      ORDER BY r.installed_at LIMIT 1`,
    { sawId, selfId, from, to },
  );
  if (!other) return 'Another blade run on this saw overlaps these times; reload and try again';
  const tz = await siteTimeZone(siteId);
  const span = other.removed_at
    ? `from ${formatAt(other.installed_at, tz)} to ${formatAt(other.removed_at, tz)}`
    : `on since ${formatAt(other.installed_at, tz)} and not yet taken off`;
  return `These times overlap blade run ${other.id} (${other.name}, ${span}); a saw carries one blade at a time, so change the times or take that blade off first`;
}

/** Turns the database's "one blade at a time" refusals into a 409 naming the run it collides with. */
async function runConflict(
  err: unknown,
  sawId: string,
  selfId: string | null,
  from: Date,
  to: Date | null,
  siteId: string,
) {
  const { constraint } = pgError(err);
  if (constraint === 'blade_runs_one_open_per_saw' || constraint === 'blade_runs_no_overlap')
    return new AppError('CONFLICT', await collidingRunMessage(sawId, selfId, from, to, siteId), [
      { path: 'installedAt', message: 'overlaps another blade run on this saw' },
    ]);
  return err;
}

/**
 * The oldest receipt of this spec at the site that still has a blade (first in, first out), locked so two
 * installs cannot draw the same last blade: the candidates are locked first, then counted again in a new
 * statement, which sees every draw committed while we waited for the lock.
 */
async function drawFromStock(
  transaction: Transaction,
  siteId: string,
  bladeSpecId: string,
): Promise<{ id: string; unit_cost_minor: number; currency: string } | null> {
  const candidates = await select<{ id: string }>(
    `SELECT r.id FROM stock_receipts r
      WHERE r.site_id = :siteId AND r.blade_spec_id = :bladeSpecId
        AND r.quantity > (SELECT count(*) FROM blade_runs b WHERE b.stock_receipt_id = r.id)
      ORDER BY r.received_on, r.created_at, r.id
      FOR UPDATE`,
    { siteId, bladeSpecId },
    transaction,
  );
  if (candidates.length === 0) return null;
  const [receipt] = await select<{ id: string; unit_cost_minor: number; currency: string }>(
    `SELECT r.id, r.unit_cost_minor, r.currency FROM stock_receipts r
      WHERE r.id IN (:ids) AND r.quantity > (SELECT count(*) FROM blade_runs b WHERE b.stock_receipt_id = r.id)
      ORDER BY r.received_on, r.created_at, r.id LIMIT 1`,
    { ids: candidates.map((c) => c.id) },
    transaction,
  );
  return receipt ?? null;
}

/**
 * Puts a blade on a saw. The blade is drawn from the site's recorded stock when there is one of that spec (its
 * cost is the receipt's), otherwise its cost is the spec's and a warning says it did not come from stock. The
 * database refuses a second open run or an overlap; the 409 names the run it collides with.
 */
export async function installBladeRun(
  { ability, userId }: Actor,
  input: BladeRunInstallParsed,
): Promise<BladeRunInstallResult> {
  const saw = await sawForWrite(ability, input.sawId, 'create', 'BladeRun', { path: 'sawId' });
  const spec = await specForSaw(ability, saw, input.bladeSpecId);
  const installedAt = input.installedAt ?? new Date();
  const warnings: RecordWarning[] = [];

  const run = await inTransaction(async (transaction) => {
    const receipt = await drawFromStock(transaction, saw.siteId, spec.id);
    if (!receipt)
      warnings.push({
        code: 'not_from_stock',
        message: `No ${spec.name} blades are recorded in this site’s stock, so this blade was not taken from stock; its cost is the spec’s unit cost.`,
      });
    const created = await BladeRun.create(
      {
        siteId: saw.siteId,
        sawId: saw.id,
        bladeSpecId: spec.id,
        stockReceiptId: receipt?.id ?? null,
        installedAt,
        installedById: userId,
        tensionMpa: input.tensionMpa,
        materialGroup: input.materialGroup,
        breakInFollowed: input.breakInFollowed,
        installNotes: input.notes,
        costMinor: receipt?.unit_cost_minor ?? spec.unitCostMinor,
        currency: (receipt?.currency ?? spec.currency).trim(),
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      {
        siteId: created.siteId,
        entity: 'BladeRun',
        entityId: created.id,
        action: 'create',
        after: auditValues(created),
      },
    ]);
    return created;
  }).catch(async (err: unknown) => {
    throw await runConflict(err, saw.id, null, installedAt, null, saw.siteId);
  });

  const advice = breakInAdvice(
    saw,
    spec,
    input.materialGroup,
    await usualCuttingRate(saw.id, input.materialGroup),
    await unitSystemOf(saw),
    await siteEffectiveSettings(saw.siteId),
  );
  return { run: await getBladeRun(ability, run.id), breakIn: advice, warnings: [...advice.warnings, ...warnings] };
}

/** The area and cuts the run's cut logs add up to. */
async function cutLogTotals(runId: string, transaction?: Transaction) {
  const [row] = await select<{ logs: number; area: number | null; cuts: number | null }>(
    `SELECT count(*)::int AS logs, sum(area_cut_mm2) AS area, sum(quantity)::int AS cuts
       FROM cut_logs WHERE blade_run_id = :runId`,
    { runId },
    transaction,
  );
  return row ?? { logs: 0, area: null, cuts: null };
}

async function runForWrite(ability: AppAbility, id: string, action: 'update' | 'delete'): Promise<BladeRun> {
  const run = await findReadableRun(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot change this blade run')
    .throwUnlessCan(action, subject('BladeRun', auditValues(run) as { id: string; siteId: string }));
  await sawForWrite(ability, run.sawId, action, 'BladeRun');
  return run;
}

/**
 * Takes a blade off. Closing is a conditional update (only while the run is open), so two people closing the
 * same run at once get one success and one 409, never two removals.
 */
export async function removeBladeRun(
  { ability, userId }: Actor,
  id: string,
  input: BladeRunRemoveParsed,
): Promise<BladeRunDto> {
  const run = await runForWrite(ability, id, 'update');
  const tz = await siteTimeZone(run.siteId);
  if (run.removedAt)
    throw new AppError('CONFLICT', `This blade was already taken off on ${formatAt(run.removedAt, tz)}`);
  const removedAt = input.removedAt ?? new Date();
  if (removedAt.getTime() < run.installedAt.getTime())
    throw AppError.validation('The blade cannot come off before it went on', [
      { path: 'removedAt', message: `must be on or after ${formatAt(run.installedAt, tz)}, when the blade was put on` },
    ]);

  await inTransaction(async (transaction) => {
    const logs = input.areaCutMm2 === null || input.cuts === null ? await cutLogTotals(run.id, transaction) : null;
    const fromLogs = logs !== null && logs.logs > 0;
    const areaCutMm2 = input.areaCutMm2 ?? (fromLogs ? logs.area : null);
    const values = {
      removedAt,
      removedById: userId,
      removalReason: input.reason,
      areaCutMm2,
      cuts: input.cuts ?? (fromLogs ? logs.cuts : null),
      areaSource: input.areaCutMm2 !== null ? ('entered' as const) : areaCutMm2 !== null ? ('cut_logs' as const) : null,
      removalNotes: input.notes,
    };
    const before = auditValues(run);
    const [count] = await BladeRun.update(values, { where: { id: run.id, removedAt: null }, transaction });
    if (count === 0)
      throw new AppError('CONFLICT', 'This blade was taken off by someone else just now; reload to see it');
    await run.reload({ transaction, attributes: DERIVED });
    await writeAudit(transaction, userId, [
      { siteId: run.siteId, entity: 'BladeRun', entityId: run.id, action: 'update', before, after: auditValues(run) },
    ]);
  });
  return getBladeRun(ability, id);
}

/** Corrections to a run: times (the database keeps runs from overlapping), tension, break-in, removal details. */
export async function updateBladeRun(
  { ability, userId }: Actor,
  id: string,
  patch: BladeRunUpdate,
): Promise<BladeRunDto> {
  const run = await runForWrite(ability, id, 'update');
  const removalFields = ['removedAt', 'removalReason', 'areaCutMm2', 'cuts', 'removalNotes'] as const;
  if (!run.removedAt && removalFields.some((f) => patch[f] !== undefined))
    throw new AppError('CONFLICT', 'This blade is still on the saw; take it off before recording how it came off');
  const installedAt = patch.installedAt ?? run.installedAt;
  const removedAt = patch.removedAt ?? run.removedAt;
  if (removedAt && removedAt.getTime() < installedAt.getTime()) {
    const tz = await siteTimeZone(run.siteId);
    throw AppError.validation('The blade cannot come off before it went on', [
      {
        path: patch.removedAt ? 'removedAt' : 'installedAt',
        message: `put on ${formatAt(installedAt, tz)} is after taken off ${formatAt(removedAt, tz)}`,
      },
    ]);
  }
  const values: Partial<BladeRun> = { ...patch };
  if (patch.areaCutMm2 !== undefined) values.areaSource = patch.areaCutMm2 === null ? null : 'entered';
  // A confirmed cause belongs to the reason it was confirmed for; a new reason needs its own.
  if (patch.removalReason && patch.removalReason !== run.removalReason)
    Object.assign(values, { confirmedCause: null, confirmedCauseAt: null, confirmedCauseById: null });
  await inTransaction(async (transaction) => {
    const before = auditValues(run);
    await run.update(values, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: run.siteId, entity: 'BladeRun', entityId: run.id, action: 'update', before, after: auditValues(run) },
    ]);
  }).catch(async (err: unknown) => {
    throw await runConflict(err, run.sawId, run.id, installedAt, removedAt, run.siteId);
  });
  return getBladeRun(ability, id);
}

/**
 * Removes a run entered by mistake to the kept records, with its photos; its cut logs and recorded checks stay
 * (the cuts and checks happened) without the link, which putting the run back restores. The blade goes back into
 * the stock it was drawn from. Site admins only.
 */
export async function deleteBladeRun(
  storage: PhotoStorage,
  { ability, userId }: Actor,
  id: string,
  { reason }: RemoveRecordInput,
): Promise<void> {
  const run = await runForWrite(ability, id, 'delete');
  await inTransaction((transaction) =>
    removeToKept(transaction, storage, { subject: 'BladeRun', recordId: run.id, reason, userId }),
  );
}

/** Cut logs of the run (latest 200), as the diagnosis needs them. */
async function runCutLogs(runId: string): Promise<DiagnosisCutLog[]> {
  const rows = await select<{
    teeth_in_work_min: number | null;
    teeth_in_work_max: number | null;
    band_speed_m_per_min: number | null;
    material_group: MaterialGroup;
  }>(
    `SELECT teeth_in_work_min, teeth_in_work_max, band_speed_m_per_min, material_group FROM cut_logs
      WHERE blade_run_id = :runId ORDER BY cut_at DESC LIMIT 200`,
    { runId },
  );
  return rows.map((r) => ({
    teethInWorkMin: r.teeth_in_work_min,
    teethInWorkMax: r.teeth_in_work_max,
    bandSpeedMPerMin: r.band_speed_m_per_min,
    materialGroup: r.material_group,
  }));
}

/**
 * The ranked likely causes of a run's failure, from the domain's diagnosis fed with this saw's cut logs during
 * the run, the run's break-in record and the saw's latest checks up to the removal (or now, while it is on).
 */
export async function getLikelyCauses(ability: AppAbility, id: string, q: LikelyCausesQuery): Promise<RunDiagnosis> {
  const run = await findReadableRun(ability, id);
  const mode = q.reason ?? run.removalReason;
  if (!mode)
    throw AppError.validation('Choose a failure reason: this blade is still on the saw', [
      { path: 'reason', message: 'choose a reason to see its likely causes' },
    ]);
  const [cutLogs, checks, settings] = await Promise.all([
    runCutLogs(run.id),
    checksEvidence(run.sawId, run, run.removedAt ?? new Date()),
    siteEffectiveSettings(run.siteId),
  ]);
  const diagnosis = diagnose(mode, { cutLogs, breakInFollowed: run.breakInFollowed, checks, settings });
  return {
    ...diagnosis,
    runId: run.id,
    confirmedCause: run.confirmedCause,
    evidenceUsed: {
      cutLogs: cutLogs.length,
      checks: checks.filter((c) => c.passed !== null || c.overdue).length,
      breakInFollowed: run.breakInFollowed,
    },
  };
}

/** Stores the likely cause a person confirmed; it must be one of the causes of the run's removal reason. */
export async function confirmCause({ ability, userId }: Actor, id: string, input: ConfirmCause): Promise<BladeRunDto> {
  const run = await runForWrite(ability, id, 'update');
  if (!run.removalReason)
    throw new AppError(
      'CONFLICT',
      'This blade is still on the saw; take it off with a reason before confirming a cause',
    );
  const causes = diagnose(run.removalReason, { cutLogs: [], breakInFollowed: null }).causes.map((c) => c.cause);
  if (!causes.includes(input.cause))
    throw AppError.validation(
      `That cause is not a likely cause of ${REMOVAL_REASON_LABELS[run.removalReason as RemovalReason].toLowerCase()}`,
      [{ path: 'cause', message: `choose one of: ${causes.map((c) => CAUSES[c].label).join('; ')}` }],
    );
  await inTransaction(async (transaction) => {
    const before = auditValues(run);
    await run.update(
      { confirmedCause: input.cause, confirmedCauseAt: new Date(), confirmedCauseById: userId },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: run.siteId, entity: 'BladeRun', entityId: run.id, action: 'update', before, after: auditValues(run) },
    ]);
  });
  return getBladeRun(ability, id);
}
