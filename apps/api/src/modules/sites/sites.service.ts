import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Site as SiteDto, SiteCreate, SiteListQuery, SiteUpdate } from '@kerfline/domain/sites/schema';
import type { Page } from '@kerfline/domain/common/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from './site.model.js';
import { Region } from '../regions/region.model.js';
import { seedSiteChecks } from '../site-checks/seed-site-checks.js';

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
    retiredAt: site.retiredAt ? site.retiredAt.toISOString() : null,
  };
}

/** A copy of the stored fields for the audit trail (`get({ plain: true })` is the instance's own object). */
const auditValues = (site: Site): Record<string, unknown> => {
  const { activeSawCount: _count, ...values } = site.get({ plain: true }) as Record<string, unknown>;
  return { ...values };
};

export async function listSites(ability: AppAbility, q: SiteListQuery): Promise<Page<SiteDto>> {
  const filter: WhereOptions[] = [];
  if (q.regionId) filter.push({ regionId: q.regionId });
  // Retired sites keep their history but leave lists and pickers unless asked for.
  if (!q.includeRetired) filter.push({ retiredAt: { [Op.is]: null } });
  const { rows, count } = await Site.findAndCountAll({
    where: scopedWhere(ability, 'read', 'Site', Site, { [Op.and]: filter }),
    attributes: { include: [activeSawCount as unknown as [ReturnType<typeof literal>, string]] },
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
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

async function assertRegionExists(regionId: string): Promise<void> {
  if (!(await Region.findByPk(regionId, { attributes: ['id'] }))) {
    throw AppError.validation('That region does not exist', [
      { path: 'regionId', message: 'choose an existing region' },
    ]);
  }
}

export async function createSite({ ability, userId }: Actor, input: SiteCreate): Promise<SiteDto> {
  ForbiddenError.from(ability).throwUnlessCan('create', subject('Site', { id: '', ...input }));
  await assertRegionExists(input.regionId);
  const site = await inTransaction(async (transaction) => {
    const created = await Site.create(input, { transaction });
    // A new site starts with the shipped list of checks, which its admin then makes its own.
    await seedSiteChecks(created.id, transaction);
    await writeAudit(transaction, userId, [
      { siteId: created.id, entity: 'Site', entityId: created.id, action: 'create', after: auditValues(created) },
    ]);
    return created;
  });
  return getSite(ability, site.id);
}

/**
 * Changes a site. Every field named is checked on its own: a site admin may change their site's everyday
 * details but not move it to another region, and nobody changes a retired site until it is brought back.
 */
export async function updateSite({ ability, userId }: Actor, id: string, patch: SiteUpdate): Promise<SiteDto> {
  const site = await findReadable(ability, id);
  const forbid = ForbiddenError.from(ability).setMessage('You cannot change this site');
  const current = site.get({ plain: true });
  forbid.throwUnlessCan('update', subject('Site', current));
  for (const field of Object.keys(patch)) {
    forbid
      .setMessage(
        field === 'regionId'
          ? 'Only an administrator can move a site to another region'
          : 'You cannot change this site',
      )
      .throwUnlessCan('update', subject('Site', current), field);
  }
  if (site.retiredAt) throw new AppError('CONFLICT', 'This site is retired; bring it back into use before changing it');
  if (patch.regionId && patch.regionId !== site.regionId) await assertRegionExists(patch.regionId);
  await inTransaction(async (transaction) => {
    const before = auditValues(site);
    await site.update(patch, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: site.id, entity: 'Site', entityId: site.id, action: 'update', before, after: auditValues(site) },
    ]);
  });
  return getSite(ability, id);
}

/**
 * Retires a site (administrators): it keeps its saws, people and history, leaves lists and pickers, and
 * stays readable by id and with `includeRetired`. `restore` brings it back.
 */
export async function setSiteRetired({ ability, userId }: Actor, id: string, retired: boolean): Promise<SiteDto> {
  const site = await findReadable(ability, id);
  ForbiddenError.from(ability)
    .setMessage(retired ? 'Only an administrator can retire a site' : 'Only an administrator can bring a site back')
    .throwUnlessCan('update', subject('Site', site.get({ plain: true })), 'retiredAt');
  if (Boolean(site.retiredAt) === retired)
    throw new AppError('CONFLICT', retired ? 'This site is already retired' : 'This site is in use already');
  await inTransaction(async (transaction) => {
    const before = auditValues(site);
    await site.update({ retiredAt: retired ? new Date() : null }, { transaction });
    await writeAudit(transaction, userId, [
      {
        siteId: site.id,
        entity: 'Site',
        entityId: site.id,
        action: retired ? 'retire' : 'restore',
        before,
        after: auditValues(site),
      },
    ]);
  });
  return getSite(ability, id);
}
