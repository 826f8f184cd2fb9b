import { Op } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Assignment } from '@kerfline/domain/users/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { Site } from '../sites/site.model.js';
import { Region } from '../regions/region.model.js';

/**
 * Checks that an assignment names a site, region and sites that exist, are in the caller's own view and
 * are in use. Shared by adding, inviting and editing people.
 */
export async function assertAssignmentTargets(
  ability: AppAbility,
  a: Pick<Assignment, 'siteId' | 'regionId' | 'managedSiteIds'>,
): Promise<void> {
  const details: { path: string; message: string }[] = [];
  const inUse = { retiredAt: { [Op.is]: null } };
  if (a.siteId) {
    const site = await Site.findOne({ where: scopedWhere(ability, 'read', 'Site', Site, { id: a.siteId, ...inUse }) });
    if (!site) details.push({ path: 'siteId', message: 'choose one of your sites that is in use' });
  }
  if (
    a.regionId &&
    !(await Region.findOne({ where: scopedWhere(ability, 'read', 'Region', Region, { id: a.regionId }) }))
  )
    details.push({ path: 'regionId', message: 'no such region' });
  const unique = [...new Set(a.managedSiteIds)];
  if (unique.length > 0) {
    const found = await Site.count({
      where: scopedWhere(ability, 'read', 'Site', Site, { id: { [Op.in]: unique }, ...inUse }),
    });
    if (found !== unique.length)
      details.push({ path: 'managedSiteIds', message: 'one or more of these sites do not exist or are retired' });
  }
  if (details.length > 0) throw AppError.validation('Some assignments refer to records that do not exist', details);
}
