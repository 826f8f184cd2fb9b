import { ForbiddenError, subject } from '@casl/ability';
import { Op, type Sequelize, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { User as UserDto, UserCreateParsed, UserListQuery } from '@kerfline/domain/users/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { hashPassword } from '../../security/passwords.js';
import { Site } from '../sites/site.model.js';
import { Region } from '../regions/region.model.js';
import { User, UserSite } from './user.model.js';
import { toUserDto } from './user-dto.js';

async function managedSitesOf(userIds: string[]): Promise<Map<string, string[]>> {
  const map = new Map<string, string[]>();
  if (userIds.length === 0) return map;
  for (const row of await UserSite.findAll({ where: { userId: { [Op.in]: userIds } } })) {
    map.set(row.userId, [...(map.get(row.userId) ?? []), row.siteId]);
  }
  return map;
}

export async function listUsers(ability: AppAbility, q: UserListQuery): Promise<Page<UserDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.role) filter.push({ role: q.role });
  const { rows, count } = await User.findAndCountAll({
    where: scopedWhere(ability, 'read', 'User', User, { [Op.and]: filter }),
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  const managed = await managedSitesOf(rows.map((u) => u.id));
  return {
    items: rows.map((u) => toUserDto(u, managed.get(u.id) ?? [])),
    total: count,
    limit: q.limit,
    offset: q.offset,
  };
}

export async function createUser(sequelize: Sequelize, ability: AppAbility, input: UserCreateParsed): Promise<UserDto> {
  ForbiddenError.from(ability)
    .setMessage('You cannot add people')
    .throwUnlessCan('create', subject('User', { id: '', siteId: input.siteId }));

  const details: { path: string; message: string }[] = [];
  if (input.siteId && !(await Site.findByPk(input.siteId, { attributes: ['id'] })))
    details.push({ path: 'siteId', message: 'no such site' });
  if (input.regionId && !(await Region.findByPk(input.regionId, { attributes: ['id'] })))
    details.push({ path: 'regionId', message: 'no such region' });
  const uniqueManaged = [...new Set(input.managedSiteIds)];
  if (uniqueManaged.length > 0) {
    const found = await Site.count({ where: { id: { [Op.in]: uniqueManaged } } });
    if (found !== uniqueManaged.length)
      details.push({ path: 'managedSiteIds', message: 'one or more of these sites do not exist' });
  }
  if (details.length > 0) throw AppError.validation('Some assignments refer to records that do not exist', details);

  const passwordHash = await hashPassword(input.password);
  // The user and their site assignments land together or not at all.
  const user = await sequelize.transaction(async (transaction) => {
    const created = await User.create(
      {
        email: input.email,
        name: input.name,
        role: input.role,
        passwordHash,
        siteId: input.siteId,
        regionId: input.regionId,
        allSites: input.allSites,
      },
      { transaction },
    );
    if (uniqueManaged.length > 0) {
      await UserSite.bulkCreate(
        uniqueManaged.map((siteId) => ({ userId: created.id, siteId })),
        { transaction },
      );
    }
    return created;
  });
  return toUserDto(user, uniqueManaged);
}
