import { ForbiddenError, subject } from '@casl/ability';
import { Op, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  bladeSpecIssues,
  type BladeSpec as BladeSpecDto,
  type BladeSpecCreateParsed,
  type BladeSpecListQuery,
  type BladeSpecUpdate,
} from '@kerfline/domain/blade-specs/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from '../sites/site.model.js';
import { auditCopy, pgError } from '../records/record-support.js';
import { BladeSpec } from './blade-spec.model.js';
import { pitchColumns, toBladeSpecDto } from './blade-spec-dto.js';

const NAME_TAKEN = 'Another blade spec in this catalogue already has that name';

/** Specs the caller may read: the fleet-wide catalogue and their sites' own, or those a site can use. */
export async function listBladeSpecs(ability: AppAbility, q: BladeSpecListQuery): Promise<Page<BladeSpecDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ [Op.or]: [{ siteId: null }, { siteId: q.siteId }] });
  if (q.material) filter.push({ material: q.material });
  if (!q.includeArchived) filter.push({ archived: false });
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    filter.push({ [Op.or]: [{ name: { [Op.iLike]: like } }, { supplier: { [Op.iLike]: like } }] });
  }
  const { rows, count } = await BladeSpec.findAndCountAll({
    where: scopedWhere(ability, 'read', 'BladeSpec', BladeSpec, { [Op.and]: filter }),
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: rows.map(toBladeSpecDto), total: count, limit: q.limit, offset: q.offset };
}

export async function findReadableSpec(ability: AppAbility, id: string): Promise<BladeSpec> {
  const spec = await BladeSpec.findOne({ where: scopedWhere(ability, 'read', 'BladeSpec', BladeSpec, { id }) });
  if (!spec) throw AppError.notFound('Blade spec');
  return spec;
}

export async function getBladeSpec(ability: AppAbility, id: string): Promise<BladeSpecDto> {
  return toBladeSpecDto(await findReadableSpec(ability, id));
}

function nameConflict(err: unknown): never {
  if (pgError(err).constraint === 'blade_specs_name')
    throw new AppError('CONFLICT', NAME_TAKEN, [{ path: 'name', message: 'already taken' }]);
  throw err;
}

export async function createBladeSpec({ ability, userId }: Actor, input: BladeSpecCreateParsed): Promise<BladeSpecDto> {
  if (input.siteId) {
    const site = await Site.findOne({ where: scopedWhere(ability, 'read', 'Site', Site, { id: input.siteId }) });
    if (!site)
      throw AppError.validation('That site does not exist', [{ path: 'siteId', message: 'choose one of your sites' }]);
  }
  ForbiddenError.from(ability)
    .setMessage(
      input.siteId ? 'You cannot add blade specs at this site' : 'Only administrators keep the fleet-wide catalogue',
    )
    .throwUnlessCan('create', subject('BladeSpec', { id: '', siteId: input.siteId }));
  const { pitch, ...rest } = input;
  const spec = await inTransaction(async (transaction) => {
    const created = await BladeSpec.create({ ...rest, ...pitchColumns(pitch) }, { transaction }).catch(nameConflict);
    await writeAudit(transaction, userId, [
      {
        siteId: created.siteId,
        entity: 'BladeSpec',
        entityId: created.id,
        action: 'create',
        after: auditCopy(created),
      },
    ]);
    return created;
  });
  return toBladeSpecDto(spec);
}

export async function updateBladeSpec(
  { ability, userId }: Actor,
  id: string,
  patch: BladeSpecUpdate,
): Promise<BladeSpecDto> {
  const spec = await findReadableSpec(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot change this blade spec')
    .throwUnlessCan('update', subject('BladeSpec', spec.get({ plain: true })));
  const issues = bladeSpecIssues({ ...spec.get({ plain: true }), ...patch });
  if (issues.length > 0) throw AppError.validation('Some fields need fixing', issues);
  const { pitch, ...rest } = patch;
  await inTransaction(async (transaction) => {
    const before = auditCopy(spec);
    await spec.update({ ...rest, ...(pitch ? pitchColumns(pitch) : {}) }, { transaction }).catch(nameConflict);
    await writeAudit(transaction, userId, [
      { siteId: spec.siteId, entity: 'BladeSpec', entityId: spec.id, action: 'update', before, after: auditCopy(spec) },
    ]);
  });
  return toBladeSpecDto(spec);
}

/** Deletes a spec no record uses; a spec with blade runs or stock is archived instead (409 says so). */
export async function deleteBladeSpec({ ability, userId }: Actor, id: string): Promise<void> {
  const spec = await findReadableSpec(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot delete this blade spec')
    .throwUnlessCan('delete', subject('BladeSpec', spec.get({ plain: true })));
  await inTransaction(async (transaction) => {
    const before = auditCopy(spec);
    await spec.destroy({ transaction }).catch((err: unknown) => {
      if (pgError(err).code === '23503')
        throw new AppError(
          'CONFLICT',
          'This blade spec is used by blade runs or stock receipts; archive it instead so it is no longer offered',
        );
      throw err;
    });
    await writeAudit(transaction, userId, [
      { siteId: spec.siteId, entity: 'BladeSpec', entityId: spec.id, action: 'delete', before },
    ]);
  });
}
