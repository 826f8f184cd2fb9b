import { ForbiddenError, subject } from '@casl/ability';
import { literal } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Site as SiteDto, SiteCreate, SiteListQuery, SiteUpdate } from '@kerfline/domain/sites/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { Site } from './site.model.js';
import { Region } from '../regions/region.model.js';

// Saws that are not retired, counted in the same query as the site rows.
const activeSawCount = [
  literal(`(SELECT count(*)::int FROM saws WHERE saws.site_id = "Site".id AND saws.status <> 'retired')`),
  'activeSawCount',
] as const;

function toDto(site: Site): SiteDto {
  return {
    id: site.id,
    regionId: site.regionId,
    code: site.code,
    name: site.name,
    city: site.city,
    timeZone: site.timeZone,
    currency: site.currency,
    unitSystem: site.unitSystem,
    activeSawCount: Number(site.get('activeSawCount') ?? 0),
  };
}

export async function listSites(ability: AppAbility, q: SiteListQuery): Promise<Page<SiteDto>> {
  const where = scopedWhere(ability, 'read', 'Site', Site, q.regionId ? { regionId: q.regionId } : {});
  const { rows, count } = await Site.findAndCountAll({
    where,
    attributes: { include: [activeSawCount as unknown as [ReturnType<typeof literal>, string]] },
    order: [['name', 'ASC']],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: rows.map(toDto), total: count, limit: q.limit, offset: q.offset };
}

async function findReadable(ability: AppAbility, id: string): Promise<Site> {
  const site = await Site.findOne({
    where: scopedWhere(ability, 'read', 'Site', Site, { id }),
    attributes: { include: [activeSawCount as unknown as [ReturnType<typeof literal>, string]] },
  });
  if (!site) throw AppError.notFound('Site');
  return site;
}

export async function getSite(ability: AppAbility, id: string): Promise<SiteDto> {
  return toDto(await findReadable(ability, id));
}

export async function createSite(ability: AppAbility, input: SiteCreate): Promise<SiteDto> {
  ForbiddenError.from(ability).throwUnlessCan('create', subject('Site', { id: '', ...input }));
  if (!(await Region.findByPk(input.regionId))) {
    throw AppError.validation('That region does not exist', [
      { path: 'regionId', message: 'choose an existing region' },
    ]);
  }
  const site = await Site.create(input);
  return getSite(ability, site.id);
}

export async function updateSite(ability: AppAbility, id: string, patch: SiteUpdate): Promise<SiteDto> {
  const site = await findReadable(ability, id);
  ForbiddenError.from(ability).throwUnlessCan('update', subject('Site', site.get({ plain: true })));
  await site.update(patch);
  return getSite(ability, id);
}
