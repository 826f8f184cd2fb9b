import type { Sequelize } from 'sequelize';
import type { Role } from '@kerfline/domain/users/schema';
import { initModels } from '../db/models.js';
import { hashPassword } from '../security/passwords.js';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { User, UserSite } from '../modules/users/user.model.js';
import { Saw } from '../modules/saws/saw.model.js';
import { resetData } from './test-db.js';

export const PASSWORD = 'fixture-password-123';

/** A valid saw body for a site (SI units), for create requests. */
export function sawBody(siteId: string, overrides: Record<string, unknown> = {}) {
  return {
    siteId,
    assetTag: `T-${Math.random().toString(36).slice(2, 8).toUpperCase()}`,
    name: 'Test bar saw',
    kind: 'horizontal',
    wheelDiameterMm: 455,
    centreDistanceMm: 1343,
    bandWidthMm: 34,
    bandThicknessMm: 1.1,
    bandLengthMm: 4115,
    bandSpeedMinMPerMin: 18,
    bandSpeedMaxMPerMin: 110,
    ...overrides,
  };
}

function sawAttrs(siteId: string, overrides: Record<string, unknown>) {
  return sawBody(siteId, overrides) as ReturnType<typeof sawBody> & {
    kind: 'horizontal';
    make: string | null;
    model: string | null;
  };
}

/**
 * A small world for authorization tests: region North has sites A and B, region South has site C.
 * Each site has two active saws; site A also has a retired one with NULL make and model.
 */
export async function buildWorld(sequelize: Sequelize) {
  initModels(sequelize);
  await resetData(sequelize);
  const passwordHash = await hashPassword(PASSWORD);
  const north = await Region.create({ name: 'North' });
  const south = await Region.create({ name: 'South' });
  const site = (code: string, regionId: string) =>
    Site.create({
      code,
      name: `Site ${code}`,
      city: null,
      timeZone: 'Europe/Berlin',
      currency: 'EUR',
      unitSystem: 'metric',
      regionId,
    });
  const siteA = await site('A', north.id);
  const siteB = await site('B', north.id);
  const siteC = await site('C', south.id);

  const saws: Record<string, Saw[]> = {};
  for (const s of [siteA, siteB, siteC]) {
    saws[s.code] = [];
    for (const n of [1, 2]) {
      saws[s.code]!.push(
        await Saw.create({
          ...sawAttrs(s.id, { assetTag: `${s.code}-${n}`, make: 'Testmake', model: 'Testmodel' }),
          retiredAt: null,
        }),
      );
    }
  }
  const retiredA = await Saw.create({
    ...sawAttrs(siteA.id, { assetTag: 'A-OLD', make: null, model: null }),
    status: 'retired',
    retiredAt: new Date(),
  });

  const user = (
    email: string,
    role: Role,
    extra: Partial<{ siteId: string; regionId: string; allSites: boolean }> = {},
  ) =>
    User.create({
      email,
      name: email.split('@')[0]!,
      role,
      passwordHash,
      siteId: extra.siteId ?? null,
      regionId: extra.regionId ?? null,
      allSites: extra.allSites ?? false,
    });

  const users = {
    admin: await user('admin@test.example', 'admin'),
    managerAll: await user('manager-all@test.example', 'manager', { allSites: true }),
    managerAC: await user('manager-ac@test.example', 'manager'),
    leadNorth: await user('lead-north@test.example', 'regional_lead', { regionId: north.id }),
    siteAdminA: await user('siteadmin-a@test.example', 'site_admin', { siteId: siteA.id }),
    techA: await user('tech-a@test.example', 'technician', { siteId: siteA.id }),
    techC: await user('tech-c@test.example', 'technician', { siteId: siteC.id }),
  };
  await UserSite.bulkCreate([
    { userId: users.managerAC.id, siteId: siteA.id },
    { userId: users.managerAC.id, siteId: siteC.id },
  ]);
  return { regions: { north, south }, sites: { A: siteA, B: siteB, C: siteC }, saws, retiredA, users };
}
export type World = Awaited<ReturnType<typeof buildWorld>>;
