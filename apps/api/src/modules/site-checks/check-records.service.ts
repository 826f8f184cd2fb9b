import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import type { FigureBasis } from '@kerfline/domain/figures/basis';
import type { BladeMaterial } from '@kerfline/domain/checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { EffectiveSettings } from '@kerfline/domain/settings/effective';
import {
  judgeCheckReading,
  sawHeadForceBasis,
  siteCheckResult,
  type CheckBlade,
  type CheckSaw,
  type SiteCheckContext,
} from '@kerfline/domain/site-checks/evaluate';
import type {
  CheckCounts,
  CheckRecord as CheckRecordDto,
  CheckRecordCreateParsed,
  CheckRecordListQuery,
  DueCheck,
  DueCheckListQuery,
  SawCheck,
  SawChecks,
} from '@kerfline/domain/site-checks/schema';
import type { RemoveRecordInput } from '@kerfline/domain/removed-records/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { HEAD_FORCE_SET_SQL, Saw } from '../saws/saw.model.js';
import { Site } from '../sites/site.model.js';
import type { PhotoStorage } from '../photos/photo-storage.js';
import { removeToKept } from '../removed-records/keep-records.js';
import { auditCopy, namesOf, orderOf, sawForWrite, select, siteEffectiveSettings } from '../records/record-support.js';
import { CheckRecord } from './check-record.model.js';
import { SiteCheck } from './site-check.model.js';
import { countsBySite, pendingPage, statusRows, type StatusRow } from './check-status.js';
import { activeChecksOf, readableSite, siteCheckDtos } from './site-checks.service.js';

const DERIVED = {
  include: [
    [literal(`(SELECT asset_tag FROM saws WHERE saws.id = "CheckRecord".saw_id)`), 'sawAssetTag'],
    [literal(`(SELECT name FROM site_checks c WHERE c.id = "CheckRecord".site_check_id)`), 'checkName'],
    [literal(`(SELECT count(*)::int FROM photos p WHERE p.check_record_id = "CheckRecord".id)`), 'photoCount'],
  ] as [ReturnType<typeof literal>, string][],
};

const iso = (d: Date | null): string | null => (d ? d.toISOString() : null);

async function toDtos(records: CheckRecord[]): Promise<CheckRecordDto[]> {
  const names = await namesOf(records.map((r) => r.checkedById));
  return records.map((r) => ({
    id: r.id,
    siteId: r.siteId,
    sawId: r.sawId,
    sawAssetTag: String(r.get('sawAssetTag') ?? ''),
    siteCheckId: r.siteCheckId,
    checkName: String(r.get('checkName') ?? ''),
    targetRule: r.targetRule,
    quantity: r.quantity,
    bladeRunId: r.bladeRunId,
    checkedAt: r.checkedAt.toISOString(),
    checkedById: r.checkedById,
    checkedByName: r.checkedById ? (names.get(r.checkedById) ?? null) : null,
    reading: r.reading,
    answers: r.answers,
    target: r.target,
    min: r.minValue,
    max: r.maxValue,
    passed: r.passed,
    basis: r.basis,
    explanation: r.explanation,
    notes: r.notes,
    photoCount: Number(r.get('photoCount') ?? 0),
    createdAt: r.createdAt.toISOString(),
  }));
}

/** Checks recorded at the caller's sites, newest first by default, paged. */
export async function listCheckRecords(ability: AppAbility, q: CheckRecordListQuery): Promise<Page<CheckRecordDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.sawId) filter.push({ sawId: q.sawId });
  if (q.siteCheckId) filter.push({ siteCheckId: q.siteCheckId });
  if (q.passed !== undefined) filter.push({ passed: q.passed });
  if (q.from) filter.push({ checkedAt: { [Op.gte]: q.from } });
  if (q.to) filter.push({ checkedAt: { [Op.lt]: q.to } });
  const { rows, count } = await CheckRecord.findAndCountAll({
    where: scopedWhere(ability, 'read', 'CheckRecord', CheckRecord, { [Op.and]: filter }),
    attributes: DERIVED,
    order: orderOf(q.sort),
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await toDtos(rows), total: count, limit: q.limit, offset: q.offset };
}

export async function readableCheckRecord(ability: AppAbility, id: string): Promise<CheckRecord> {
  const record = await CheckRecord.findOne({
    where: scopedWhere(ability, 'read', 'CheckRecord', CheckRecord, { id }),
    attributes: DERIVED,
  });
  if (!record) throw AppError.notFound('Check record');
  return record;
}

export async function getCheckRecord(ability: AppAbility, id: string): Promise<CheckRecordDto> {
  const [dto] = await toDtos([await readableCheckRecord(ability, id)]);
  return dto!;
}

type BladeAt = CheckBlade & { runId: string; specName: string };

/** The blade on a saw at a moment: the run covering it, with its spec's band. */
async function bladeAt(sawId: string, at: Date | null, transaction?: Transaction): Promise<BladeAt | null> {
  const [row] = await select<{
    id: string;
    thickness_mm: number;
    width_mm: number;
    material: BladeMaterial;
    name: string;
  }>(
    `SELECT r.id, b.thickness_mm, b.width_mm, b.material, b.name
       FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
      WHERE r.saw_id = :sawId
        AND (CASE WHEN :at::timestamptz IS NULL THEN r.removed_at IS NULL
                  ELSE r.installed_at <= :at::timestamptz AND (r.removed_at IS NULL OR r.removed_at > :at::timestamptz) END)
      ORDER BY r.installed_at DESC LIMIT 1`,
    { sawId, at },
    transaction,
  );
  return row
    ? {
        runId: row.id,
        thicknessMm: row.thickness_mm,
        widthMm: row.width_mm,
        material: row.material,
        specName: row.name,
      }
    : null;
}

/** Where a fixed check's figures come from: the site's list, who last set them and when. */
function fixedBasisOf(check: SiteCheck, names: Map<string, string>): FigureBasis {
  return {
    kind: 'site_setting',
    settingKey: `site_check.${check.id}`,
    changedByName: check.updatedById ? (names.get(check.updatedById) ?? null) : null,
    changedAt: check.updatedAt.toISOString(),
    note: 'Set on your site’s list of checks',
  };
}

type TargetContext = { settings: EffectiveSettings; system: UnitSystem; names: Map<string, string> };

async function targetContext(siteId: string, checks: SiteCheck[], transaction?: Transaction): Promise<TargetContext> {
  const [settings, site, names] = await Promise.all([
    siteEffectiveSettings(siteId, transaction),
    Site.findByPk(siteId, { attributes: ['unitSystem'], transaction }),
    namesOf(checks.map((c) => c.updatedById)),
  ]);
  return { settings, system: (site?.unitSystem ?? 'metric') as UnitSystem, names };
}

const contextFor = (check: SiteCheck, ctx: TargetContext): SiteCheckContext => ({
  system: ctx.system,
  settings: ctx.settings,
  fixedBasis: fixedBasisOf(check, ctx.names),
});

/**
 * The saw's figures a target needs, with its own head-force limits when it has any and their basis: "this saw's
 * limit, set by … on …" from the audit trail.
 */
async function checkSawOf(saw: Saw): Promise<CheckSaw> {
  const own = { minHeadForceN: saw.minHeadForceN ?? null, maxHeadForceN: saw.maxHeadForceN ?? null };
  const base = { bandThicknessMm: saw.bandThicknessMm, bandWidthMm: saw.bandWidthMm, headFeed: saw.headFeed, ...own };
  if (own.minHeadForceN === null && own.maxHeadForceN === null) return base;
  const [row] = await select<{ set: { byName: string | null; at: string } | null }>(
    `SELECT ${HEAD_FORCE_SET_SQL} AS set FROM saws "Saw" WHERE "Saw".id = :sawId`,
    { sawId: saw.id },
  );
  const set = row?.set ? { byName: row.set.byName, at: new Date(row.set.at).toISOString() } : null;
  return { ...base, headForceBasis: sawHeadForceBasis(own, set) };
}

/**
 * Records a check on a saw. The target, limits and verdict are worked out here with the domain, for this saw and
 * the blade on it at the time, with the site's settings — whatever the browser thought. A check that does not
 * apply to the saw is refused with why. Audited in the same transaction.
 */
export async function recordCheck({ ability, userId }: Actor, input: CheckRecordCreateParsed): Promise<CheckRecordDto> {
  const saw = await sawForWrite(ability, input.sawId, 'create', 'CheckRecord');
  const check = await SiteCheck.findOne({ where: { id: input.siteCheckId, siteId: saw.siteId } });
  if (!check)
    throw AppError.validation('That check is not on this saw’s site’s list', [
      { path: 'siteCheckId', message: 'choose one of the site’s checks' },
    ]);
  if (check.retiredAt)
    throw AppError.validation(`“${check.name}” is retired from the site’s list and is no longer recorded`, [
      { path: 'siteCheckId', message: 'choose a check on the list' },
    ]);
  const checkedAt = input.checkedAt ?? new Date();
  const blade = await bladeAt(saw.id, input.checkedAt ?? null);
  const ctx = await targetContext(saw.siteId, [check]);
  const judged = judgeCheckReading(
    check,
    await checkSawOf(saw),
    blade,
    { reading: input.reading, answers: input.answers },
    contextFor(check, ctx),
  );
  if (!judged.ok) throw AppError.validation(judged.message, [{ path: judged.path, message: judged.message }]);
  const { result } = judged;
  const record = await inTransaction(async (transaction) => {
    const created = await CheckRecord.create(
      {
        siteId: saw.siteId,
        sawId: saw.id,
        siteCheckId: check.id,
        bladeRunId: blade?.runId ?? null,
        checkedAt,
        checkedById: userId,
        targetRule: check.targetRule,
        quantity: check.quantity,
        reading: check.quantity === 'condition' ? null : input.reading,
        answers: check.quantity === 'condition' ? input.answers : null,
        target: result.target,
        minValue: result.min,
        maxValue: result.max,
        passed: result.passed,
        basis: result.basis,
        explanation: result.explanation,
        notes: input.notes,
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: saw.siteId, entity: 'CheckRecord', entityId: created.id, action: 'create', after: auditCopy(created) },
    ]);
    return created;
  });
  return getCheckRecord(ability, record.id);
}

/** Removes a recorded check (a site admin's correction) with its photos to the kept records; it can be put back. */
export async function deleteCheckRecord(
  storage: PhotoStorage,
  { ability, userId }: Actor,
  id: string,
  { reason }: RemoveRecordInput,
): Promise<void> {
  const record = await readableCheckRecord(ability, id);
  ForbiddenError.from(ability)
    .setMessage('Only an administrator or this site’s admin can remove a recorded check')
    .throwUnlessCan('delete', subject('CheckRecord', { id: record.id, siteId: record.siteId }));
  await inTransaction((transaction) =>
    removeToKept(transaction, storage, { subject: 'CheckRecord', recordId: record.id, reason, userId }),
  );
}

const dueDto = (r: StatusRow): DueCheck => ({
  siteId: r.site_id,
  sawId: r.saw_id,
  sawAssetTag: r.asset_tag,
  sawName: r.saw_name,
  siteCheckId: r.site_check_id,
  checkName: r.check_name,
  targetRule: r.target_rule,
  schedule: r.schedule,
  state: r.state,
  fallsDueAt: iso(r.falls_due_at),
  overdueAt: iso(r.overdue_at),
  lastCheckedAt: iso(r.last_checked_at),
  lastPassed: r.last_passed,
  bladeRunId: r.blade_run_id,
});

async function readableSawOf(ability: AppAbility, sawId: string): Promise<Saw> {
  const saw = await Saw.findOne({ where: scopedWhere(ability, 'read', 'Saw', Saw, { id: sawId }) });
  if (!saw) throw AppError.notFound('Saw');
  return saw;
}

function assertReadsChecks(ability: AppAbility, siteId: string): void {
  // Whoever reads a site reads its checks; a rule that one day says otherwise answers "not found" here.
  if (ability.cannot('read', subject('SiteCheck', { id: '', siteId }))) throw AppError.notFound('Site');
}

/**
 * Every check of a saw's site for this saw: its target for this saw and the blade on it now (or why it does not
 * apply), and whether it is due, from the same SQL as the site's lists.
 */
export async function sawChecks(ability: AppAbility, sawId: string, asOf = new Date()): Promise<SawChecks> {
  const saw = await readableSawOf(ability, sawId);
  assertReadsChecks(ability, saw.siteId);
  const [checks, blade, rows] = await Promise.all([
    activeChecksOf(saw.siteId),
    bladeAt(saw.id, null),
    saw.status === 'retired' ? Promise.resolve([]) : statusRows({ siteIds: [saw.siteId], sawId: saw.id, asOf }),
  ]);
  const [ctx, dtos, checkSaw] = await Promise.all([
    targetContext(saw.siteId, checks),
    siteCheckDtos(checks),
    checkSawOf(saw),
  ]);
  const byCheck = new Map(rows.map((r) => [r.site_check_id, r]));
  const items: SawCheck[] = checks.map((check, i) => {
    const result = siteCheckResult(check, checkSaw, blade, {}, contextFor(check, ctx));
    const row = byCheck.get(check.id);
    return {
      check: dtos[i]!,
      target: {
        applicable: result.applicable,
        target: result.target,
        min: result.min,
        max: result.max,
        basis: result.basis,
        explanation: result.explanation,
      },
      state: row?.state ?? 'ok',
      fallsDueAt: iso(row?.falls_due_at ?? null),
      overdueAt: iso(row?.overdue_at ?? null),
      lastRecordId: row?.last_record_id ?? null,
      lastCheckedAt: iso(row?.last_checked_at ?? null),
      lastPassed: row?.last_passed ?? null,
    };
  });
  return {
    sawId: saw.id,
    siteId: saw.siteId,
    bladeRunId: blade?.runId ?? null,
    bladeSpecName: blade?.specName ?? null,
    items,
  };
}

/** A site's pending checks (overdue by default), the longest overdue first, paged on the server. */
export async function siteDueChecks(
  ability: AppAbility,
  siteId: string,
  q: DueCheckListQuery,
): Promise<Page<DueCheck>> {
  await readableSite(ability, siteId);
  assertReadsChecks(ability, siteId);
  const { rows, total } = await pendingPage(
    { siteIds: [siteId], sawId: q.sawId, siteCheckId: q.siteCheckId, schedule: q.schedule },
    q.state,
    { limit: q.limit, offset: q.offset },
  );
  return { items: rows.map(dueDto), total, limit: q.limit, offset: q.offset };
}

/** Checks due and overdue per site, for every site the caller reads that is not retired (or one of them). */
export async function checkCounts(ability: AppAbility, siteId?: string): Promise<CheckCounts[]> {
  const sites = await Site.findAll({
    where: scopedWhere(ability, 'read', 'Site', Site, siteId ? { id: siteId } : { retiredAt: null }),
    attributes: ['id'],
    order: [['name', 'ASC']],
  });
  if (siteId && sites.length === 0) throw AppError.notFound('Site');
  const readable = sites.filter((s) => ability.can('read', subject('SiteCheck', { id: '', siteId: s.id })));
  const counts = await countsBySite({ siteIds: readable.map((s) => s.id) });
  return readable.map((s) => ({
    siteId: s.id,
    due: counts.get(s.id)?.due ?? 0,
    overdue: counts.get(s.id)?.overdue ?? 0,
  }));
}
