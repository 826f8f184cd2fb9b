import { subject } from '@casl/ability';
import { Op, literal, UniqueConstraintError } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { detailsFromZodError } from '@kerfline/domain/errors';
import {
  siteCheckValuesSchema,
  type SiteCheck as SiteCheckDto,
  type SiteCheckCreateParsed,
  type SiteCheckUpdate,
} from '@kerfline/domain/site-checks/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from '../sites/site.model.js';
import { auditCopy, namesOf, pgError } from '../records/record-support.js';
import { SiteCheck } from './site-check.model.js';

const RECORD_COUNT = literal(`(SELECT count(*) FROM check_records cr WHERE cr.site_check_id = "SiteCheck".id)`);
const DERIVED = { include: [[RECORD_COUNT, 'recordCount']] as [ReturnType<typeof literal>, string][] };

const auditValues = (check: SiteCheck) => auditCopy(check, ['recordCount']);

export async function siteCheckDtos(checks: SiteCheck[]): Promise<SiteCheckDto[]> {
  const names = await namesOf(checks.map((c) => c.updatedById));
  return checks.map((c) => ({
    id: c.id,
    siteId: c.siteId,
    name: c.name,
    measures: c.measures,
    quantity: c.quantity,
    targetRule: c.targetRule,
    fixedTarget: c.fixedTarget,
    fixedMin: c.fixedMin,
    fixedMax: c.fixedMax,
    schedule: c.schedule,
    intervalDays: c.intervalDays,
    graceHours: c.graceHours,
    position: c.position,
    retiredAt: c.retiredAt ? c.retiredAt.toISOString() : null,
    recordCount: Number(c.get('recordCount') ?? 0),
    createdAt: c.createdAt.toISOString(),
    updatedAt: c.updatedAt.toISOString(),
    updatedById: c.updatedById,
    updatedByName: c.updatedById ? (names.get(c.updatedById) ?? null) : null,
  }));
}

/** A site the caller may read; any other id is "not found", so ids outside the scope reveal nothing. */
export async function readableSite(ability: AppAbility, siteId: string): Promise<Site> {
  const site = await Site.findOne({ where: scopedWhere(ability, 'read', 'Site', Site, { id: siteId }) });
  if (!site) throw AppError.notFound('Site');
  return site;
}

/** A site's list of checks, in its order; retired checks only when asked for. */
export async function listSiteChecks(
  ability: AppAbility,
  siteId: string,
  includeRetired = false,
): Promise<SiteCheckDto[]> {
  await readableSite(ability, siteId);
  const checks = await SiteCheck.findAll({
    where: scopedWhere(ability, 'read', 'SiteCheck', SiteCheck, {
      siteId,
      ...(includeRetired ? {} : { retiredAt: null }),
    }),
    attributes: DERIVED,
    order: [
      [literal('retired_at IS NOT NULL'), 'ASC'],
      ['position', 'ASC'],
      ['name', 'ASC'],
    ],
  });
  return siteCheckDtos(checks);
}

async function readableCheck(ability: AppAbility, id: string): Promise<SiteCheck> {
  const check = await SiteCheck.findOne({
    where: scopedWhere(ability, 'read', 'SiteCheck', SiteCheck, { id }),
    attributes: DERIVED,
  });
  if (!check) throw AppError.notFound('Check');
  return check;
}

export async function getSiteCheck(ability: AppAbility, id: string): Promise<SiteCheckDto> {
  const [dto] = await siteCheckDtos([await readableCheck(ability, id)]);
  return dto!;
}

function assertCanChange(ability: AppAbility, action: 'create' | 'update' | 'delete', siteId: string): void {
  if (ability.cannot(action, subject('SiteCheck', { id: '', siteId })))
    throw new AppError('FORBIDDEN', 'Only an administrator or this site’s admin can change its list of checks');
}

function nameTaken(err: unknown, name: string): unknown {
  if (err instanceof UniqueConstraintError || pgError(err).constraint === 'site_checks_site_name')
    return new AppError('CONFLICT', `A check named “${name}” is already on this site’s list; choose another name`, [
      { path: 'name', message: 'is already on the list' },
    ]);
  return err;
}

/** Adds a check to a site's list (at the end unless a position is given); audited in the same transaction. */
export async function createSiteCheck(
  { ability, userId }: Actor,
  siteId: string,
  input: SiteCheckCreateParsed,
): Promise<SiteCheckDto> {
  await readableSite(ability, siteId);
  assertCanChange(ability, 'create', siteId);
  const created = await inTransaction(async (transaction) => {
    const last = (await SiteCheck.max('position', { where: { siteId }, transaction })) as number | null;
    const check = await SiteCheck.create(
      { ...input, siteId, position: input.position ?? (last ?? -1) + 1, updatedById: userId },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId, entity: 'SiteCheck', entityId: check.id, action: 'create', after: auditValues(check) },
    ]);
    return check;
  }).catch((err: unknown) => {
    throw nameTaken(err, input.name);
  });
  return getSiteCheck(ability, created.id);
}

async function checkForWrite(ability: AppAbility, id: string, action: 'update' | 'delete'): Promise<SiteCheck> {
  const check = await readableCheck(ability, id);
  assertCanChange(ability, action, check.siteId);
  return check;
}

/**
 * Changes a check: the change is merged with the check as stored and the whole checked again (a fixed value
 * keeps its limits, a rule keeps none), so no change leaves a check half one kind and half another. Records keep
 * the target they were recorded against. Audited in the same transaction.
 */
export async function updateSiteCheck({ ability, userId }: Actor, id: string, patch: SiteCheckUpdate) {
  const check = await checkForWrite(ability, id, 'update');
  if (check.retiredAt) throw new AppError('CONFLICT', 'This check is retired; bring it back before changing it');
  const current = auditValues(check) as Record<string, unknown>;
  const merged = siteCheckValuesSchema.safeParse({
    name: check.name,
    measures: check.measures,
    targetRule: check.targetRule,
    quantity: check.quantity,
    fixedTarget: check.fixedTarget,
    fixedMin: check.fixedMin,
    fixedMax: check.fixedMax,
    schedule: check.schedule,
    intervalDays: check.intervalDays,
    graceHours: check.graceHours,
    position: check.position,
    ...patch,
  });
  if (!merged.success)
    throw AppError.validation('This change would leave the check inconsistent', detailsFromZodError(merged.error));
  await inTransaction(async (transaction) => {
    await check.update({ ...merged.data, updatedById: userId }, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: check.siteId,
        entity: 'SiteCheck',
        entityId: check.id,
        action: 'update',
        before: current,
        after: auditValues(check),
      },
    ]);
  }).catch((err: unknown) => {
    throw nameTaken(err, merged.data.name);
  });
  return getSiteCheck(ability, id);
}

/** Takes a check off the list (no longer due) or brings it back; its records stay either way. Audited. */
export async function setSiteCheckRetired({ ability, userId }: Actor, id: string, retired: boolean) {
  const check = await checkForWrite(ability, id, 'update');
  if (Boolean(check.retiredAt) === retired)
    throw new AppError('CONFLICT', retired ? 'This check is already retired' : 'This check is on the list already');
  await inTransaction(async (transaction) => {
    const before = auditValues(check);
    await check.update({ retiredAt: retired ? new Date() : null, updatedById: userId }, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: check.siteId,
        entity: 'SiteCheck',
        entityId: check.id,
        action: 'update',
        before,
        after: auditValues(check),
      },
    ]);
  }).catch((err: unknown) => {
    throw nameTaken(err, check.name);
  });
  return getSiteCheck(ability, id);
}

/**
 * Deletes a check that was never recorded (a slip). One with records is kept (retire it instead): the count here
 * says so, and the foreign key from `check_records` refuses a delete racing a new record.
 */
export async function deleteSiteCheck({ ability, userId }: Actor, id: string): Promise<void> {
  const check = await checkForWrite(ability, id, 'delete');
  const records = Number(check.get('recordCount') ?? 0);
  const keep = () =>
    new AppError(
      'CONFLICT',
      `“${check.name}” has ${records > 0 ? records : 'some'} recorded check${records === 1 ? '' : 's'}; retire it instead, so its history stays`,
    );
  if (records > 0) throw keep();
  await inTransaction(async (transaction) => {
    const before = auditValues(check);
    await SiteCheck.destroy({ where: { id: check.id }, transaction });
    await writeAudit(transaction, userId, [
      { siteId: check.siteId, entity: 'SiteCheck', entityId: check.id, action: 'delete', before },
    ]);
  }).catch((err: unknown) => {
    throw pgError(err).code === '23503' ? keep() : err;
  });
}

/** The active checks of a site, for the record form and the saw page (not scoped: the caller read the saw). */
export function activeChecksOf(siteId: string): Promise<SiteCheck[]> {
  return SiteCheck.findAll({
    where: { siteId, retiredAt: { [Op.is]: null } },
    attributes: DERIVED,
    order: [
      ['position', 'ASC'],
      ['name', 'ASC'],
    ],
  });
}
