import { ForbiddenError, subject } from '@casl/ability';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Region as RegionDto, RegionCreate, RegionUpdate } from '@kerfline/domain/regions/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Region } from './region.model.js';

const toDto = (r: Region): RegionDto => ({ id: r.id, name: r.name });

export async function listRegions(ability: AppAbility): Promise<Page<RegionDto>> {
  const rows = await Region.findAll({
    where: scopedWhere(ability, 'read', 'Region', Region),
    order: [['name', 'ASC']],
  });
  return { items: rows.map(toDto), total: rows.length, limit: rows.length, offset: 0 };
}

export async function createRegion({ ability, userId }: Actor, input: RegionCreate): Promise<RegionDto> {
  ForbiddenError.from(ability).throwUnlessCan('create', subject('Region', { id: '', ...input }));
  return toDto(
    await inTransaction(async (transaction) => {
      const region = await Region.create(input, { transaction });
      await writeAudit(transaction, userId, [
        { siteId: null, entity: 'Region', entityId: region.id, action: 'create', after: { name: region.name } },
      ]);
      return region;
    }),
  );
}

/** Renames a region (administrators); its sites and history stay as they are. */
export async function updateRegion({ ability, userId }: Actor, id: string, patch: RegionUpdate): Promise<RegionDto> {
  const region = await Region.findOne({ where: scopedWhere(ability, 'read', 'Region', Region, { id }) });
  if (!region) throw AppError.notFound('Region');
  ForbiddenError.from(ability)
    .setMessage('Only an administrator can rename a region')
    .throwUnlessCan('update', subject('Region', { id: region.id }));
  await inTransaction(async (transaction) => {
    const before = { name: region.name };
    await region.update(patch, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: null, entity: 'Region', entityId: region.id, action: 'update', before, after: { name: region.name } },
    ]);
  });
  return toDto(region);
}
