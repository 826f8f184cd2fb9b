import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  sawRangeIssues,
  type Saw as SawDto,
  type SawCreateParsed,
  type SawListQuery,
  type SawUpdate,
  type SawDown,
  type SawBladeOn,
  type SawHeadForceSet,
} from '@kerfline/domain/saws/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { BLADE_ON_SQL, HAS_OPEN_STOP_SQL, HEAD_FORCE_SET_SQL, OPEN_STOP_SQL, Saw } from './saw.model.js';
import { Site } from '../sites/site.model.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';

/** The derived columns every saw read includes. */
export const sawDerivedAttributes = {
  include: [
    [literal(OPEN_STOP_SQL), 'down'],
    [literal(BLADE_ON_SQL), 'bladeOn'],
    [literal(HEAD_FORCE_SET_SQL), 'headForceSet'],
  ] as [ReturnType<typeof literal>, string][],
};

const iso = (value: string | Date): string => new Date(value).toISOString();

export function toSawDto(saw: Saw): SawDto {
  const s = saw.get({ plain: true });
  const down = saw.get('down') as (Omit<SawDown, 'since'> & { since: string }) | null | undefined;
  const bladeOn = saw.get('bladeOn') as (Omit<SawBladeOn, 'since'> & { since: string }) | null | undefined;
  const headForceSet = saw.get('headForceSet') as SawHeadForceSet | null | undefined;
  return {
    id: s.id,
    siteId: s.siteId,
    assetTag: s.assetTag,
    name: s.name,
    kind: s.kind,
    headFeed: s.headFeed,
    make: s.make,
    model: s.model,
    wheelDiameterMm: s.wheelDiameterMm,
    centreDistanceMm: s.centreDistanceMm,
    bandWidthMm: s.bandWidthMm,
    bandThicknessMm: s.bandThicknessMm,
    bandLengthMm: s.bandLengthMm,
    bandSpeedMinMPerMin: s.bandSpeedMinMPerMin,
    bandSpeedMaxMPerMin: s.bandSpeedMaxMPerMin,
    capacityRoundMm: s.capacityRoundMm,
    capacityRectWidthMm: s.capacityRectWidthMm,
    capacityRectHeightMm: s.capacityRectHeightMm,
    minHeadForceN: s.minHeadForceN ?? null,
    maxHeadForceN: s.maxHeadForceN ?? null,
    headForceSet: headForceSet ? { byName: headForceSet.byName, at: iso(headForceSet.at) } : null,
    status: s.status === 'retired' ? 'retired' : down ? 'down' : 'in_service',
    down: down ? { ...down, since: iso(down.since) } : null,
    bladeOn: bladeOn ? { ...bladeOn, since: iso(bladeOn.since) } : null,
    retiredAt: s.retiredAt ? s.retiredAt.toISOString() : null,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}

export async function listSaws(ability: AppAbility, q: SawListQuery): Promise<Page<SawDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.kind) filter.push({ kind: q.kind });
  if (q.status === 'retired') filter.push({ status: 'retired' });
  else if (q.status === 'down') filter.push({ status: 'in_service' }, literal(HAS_OPEN_STOP_SQL));
  else if (q.status === 'in_service') filter.push({ status: 'in_service' }, literal(`NOT ${HAS_OPEN_STOP_SQL}`));
  else if (!q.includeRetired) filter.push({ status: { [Op.ne]: 'retired' } });
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    filter.push({ [Op.or]: [{ assetTag: { [Op.iLike]: like } }, { name: { [Op.iLike]: like } }] });
  }
  const { rows, count } = await Saw.findAndCountAll({
    where: scopedWhere(ability, 'read', 'Saw', Saw, { [Op.and]: filter }),
    attributes: sawDerivedAttributes,
    order: [
      ['assetTag', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: rows.map(toSawDto), total: count, limit: q.limit, offset: q.offset };
}

/** A saw the caller may read; anything else is "not found", so ids outside the scope reveal nothing. */
async function findReadable(ability: AppAbility, id: string): Promise<Saw> {
  const saw = await Saw.findOne({
    where: scopedWhere(ability, 'read', 'Saw', Saw, { id }),
    attributes: sawDerivedAttributes,
  });
  if (!saw) throw AppError.notFound('Saw');
  return saw;
}

/** The target site must be one the caller can see; otherwise it is reported like a missing site. */
async function assertSiteReadable(ability: AppAbility, siteId: string): Promise<void> {
  const site = await Site.findOne({
    where: scopedWhere(ability, 'read', 'Site', Site, { id: siteId }),
    attributes: ['id'],
  });
  if (!site)
    throw AppError.validation('That site does not exist', [{ path: 'siteId', message: 'choose one of your sites' }]);
}

export async function getSaw(ability: AppAbility, id: string): Promise<SawDto> {
  return toSawDto(await findReadable(ability, id));
}

/**
 * A copy of the saw's stored fields for the audit trail. A copy, because `get({ plain: true })` hands back the
 * instance's own value object, which the update would then change under us.
 */
const auditValues = (saw: Saw): Record<string, unknown> => {
  const {
    down: _down,
    bladeOn: _bladeOn,
    headForceSet: _headForceSet,
    ...stored
  } = saw.get({ plain: true }) as Record<string, unknown>;
  return { ...stored };
};

export async function createSaw({ ability, userId }: Actor, input: SawCreateParsed): Promise<SawDto> {
  await assertSiteReadable(ability, input.siteId);
  ForbiddenError.from(ability)
    .setMessage('You cannot add saws at this site')
    .throwUnlessCan('create', subject('Saw', { id: '', ...input }));
  const saw = await inTransaction(async (transaction) => {
    const created = await Saw.create({ ...input, retiredAt: null }, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: created.siteId, entity: 'Saw', entityId: created.id, action: 'create', after: auditValues(created) },
    ]);
    return created;
  });
  return getSaw(ability, saw.id);
}

export async function updateSaw({ ability, userId }: Actor, id: string, patch: SawUpdate): Promise<SawDto> {
  const saw = await findReadable(ability, id);
  const current = saw.get({ plain: true });
  const forbid = ForbiddenError.from(ability).setMessage('You cannot change this saw');
  forbid.throwUnlessCan('update', subject('Saw', current));
  if (current.status === 'retired')
    throw new AppError('CONFLICT', 'This saw is retired; retired saws are kept for history and cannot be changed');

  const merged = { ...current, ...patch };
  const issues = sawRangeIssues(merged);
  if (issues.length > 0) throw AppError.validation('Some fields need fixing', issues);
  if (patch.siteId && patch.siteId !== current.siteId) {
    await assertSiteReadable(ability, patch.siteId);
    await assertNoRecords(saw.id);
  }
  // Check the record as it will be, so nobody can move a saw into a site they do not manage.
  forbid.throwUnlessCan('update', subject('Saw', merged));

  await inTransaction(async (transaction) => {
    const before = auditValues(saw);
    await saw.update(patch, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: saw.siteId, entity: 'Saw', entityId: saw.id, action: 'update', before, after: auditValues(saw) },
    ]);
  });
  // Read again: who set the head-force limits comes from the audit entry just written.
  return getSaw(ability, id);
}

/**
 * A saw's blade runs, stops and cut logs belong to the site where they happened (each row carries that site,
 * and a composite foreign key ties it to the saw's site), so a saw with records keeps its site. To move such a
 * saw, retire it at the old site and add it at the new one.
 */
async function assertNoRecords(sawId: string): Promise<void> {
  const [row] = (await Saw.sequelize!.query(
    `SELECT EXISTS (SELECT 1 FROM blade_runs WHERE saw_id = :sawId)
         OR EXISTS (SELECT 1 FROM stops WHERE saw_id = :sawId)
         OR EXISTS (SELECT 1 FROM cut_logs WHERE saw_id = :sawId) AS has`,
    { replacements: { sawId }, type: 'SELECT' },
  )) as { has: boolean }[];
  if (row?.has)
    throw new AppError(
      'CONFLICT',
      'This saw has blade runs, stops or cut logs at its site, which stay with that site; retire it here and add it at the new site instead',
    );
}

export async function retireSaw({ ability, userId }: Actor, id: string): Promise<SawDto> {
  const saw = await findReadable(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot retire this saw')
    .throwUnlessCan('update', subject('Saw', saw.get({ plain: true })));
  if (saw.status === 'retired') throw new AppError('CONFLICT', 'This saw is already retired');
  const dto = toSawDto(saw);
  if (dto.down) throw new AppError('CONFLICT', 'This saw has an open stop; end the stop before retiring the saw');
  if (dto.bladeOn)
    throw new AppError('CONFLICT', 'This saw still has a blade on; take the blade off before retiring the saw');
  await inTransaction(async (transaction) => {
    const before = auditValues(saw);
    await saw.update({ status: 'retired', retiredAt: new Date() }, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: saw.siteId, entity: 'Saw', entityId: saw.id, action: 'retire', before, after: auditValues(saw) },
    ]);
  });
  return toSawDto(saw);
}

/**
 * Brings a retired saw back into service (whoever may change it: an administrator, its site's site admin), so a
 * saw retired by mistake is never lost. Its site must be in use; its asset tag must still be free there.
 */
export async function restoreSaw({ ability, userId }: Actor, id: string): Promise<SawDto> {
  const saw = await findReadable(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot bring this saw back')
    .throwUnlessCan('update', subject('Saw', saw.get({ plain: true })));
  if (saw.status !== 'retired') throw new AppError('CONFLICT', 'This saw is in service already');
  const site = await Site.findByPk(saw.siteId, { attributes: ['retiredAt'] });
  if (site?.retiredAt)
    throw new AppError('CONFLICT', 'This saw’s site is retired; an administrator must bring the site back first');
  await inTransaction(async (transaction) => {
    const before = auditValues(saw);
    await saw.update({ status: 'in_service', retiredAt: null }, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: saw.siteId, entity: 'Saw', entityId: saw.id, action: 'restore', before, after: auditValues(saw) },
    ]);
  });
  return getSaw(ability, id);
}
