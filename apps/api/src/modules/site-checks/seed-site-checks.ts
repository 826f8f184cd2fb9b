import type { Transaction } from 'sequelize';
import { defaultSiteChecks } from '@kerfline/domain/site-checks/schema';
import { SiteCheck } from './site-check.model.js';

/**
 * Gives a new site the shipped list of checks (`defaultSiteChecks`), in the transaction that creates the site.
 * Called wherever a site is made (the sites service, the demo); sites that existed before the list did got it
 * from the migration.
 */
export async function seedSiteChecks(siteId: string, transaction?: Transaction): Promise<SiteCheck[]> {
  return SiteCheck.bulkCreate(
    defaultSiteChecks().map((check) => ({ ...check, siteId, updatedById: null })),
    { transaction },
  );
}
