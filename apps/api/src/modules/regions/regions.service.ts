import { subject } from '@casl/ability';
import { ForbiddenError } from '@casl/ability';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Region as RegionDto, RegionCreate } from '@kerfline/domain/regions/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { Region } from './region.model.js';

const toDto = (r: Region): RegionDto => ({ id: r.id, name: r.name });

export async function listRegions(ability: AppAbility): Promise<Page<RegionDto>> {
  const rows = await Region.findAll({
    where: scopedWhere(ability, 'read', 'Region', Region),
    order: [['name', 'ASC']],
  });
  return { items: rows.map(toDto), total: rows.length, limit: rows.length, offset: 0 };
}

export async function createRegion(ability: AppAbility, input: RegionCreate): Promise<RegionDto> {
  ForbiddenError.from(ability).throwUnlessCan('create', subject('Region', { id: '', ...input }));
  return toDto(await Region.create(input));
}
