import type { Sequelize } from 'sequelize';
import type { Role } from '@kerfline/domain/users/schema';
import { initModels } from '../db/models.js';
import { hashPassword } from '../security/passwords.js';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { User, UserSite } from '../modules/users/user.model.js';
import { Saw } from '../modules/saws/saw.model.js';
import { BladeSpec } from '../modules/blade-specs/blade-spec.model.js';
import { StockLevel, StockReceipt } from '../modules/blade-stock/stock-receipt.model.js';
import { BladeRun } from '../modules/blade-runs/blade-run.model.js';
import { Stop } from '../modules/stops/stop.model.js';
import { CutLog } from '../modules/cut-logs/cut-log.model.js';
import { Photo } from '../modules/photos/photo.model.js';
import { SiteCheck } from '../modules/site-checks/site-check.model.js';
import { CheckRecord } from '../modules/site-checks/check-record.model.js';
import { seedSiteChecks } from '../modules/site-checks/seed-site-checks.js';
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
  // Each site starts with the shipped list of checks, as the sites service gives a new site.
  for (const s of [siteA, siteB, siteC]) await seedSiteChecks(s.id);

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

/**
 * Records at sites A and C for scope tests, written straight to the tables: a fleet-wide spec (site NULL) and
 * one of site A's own, stock, a removed run and an open run, stops (one open), a cut log and a photo at each
 * site, stock levels, a recorded check with a photo of it, and a retired check on each site's list. Nullable columns are left NULL where they may be.
 */
export async function buildRecords(world: World) {
  const fleetSpec = await BladeSpec.create({
    siteId: null,
    name: 'Fleet 34x1.1 3/4',
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    coarseTpi: 3,
    fineTpi: 4,
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6000,
    currency: 'EUR',
    supplier: null,
  });
  const siteSpec = await BladeSpec.create({
    siteId: world.sites.A.id,
    name: 'A own 34x1.1 2/3',
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    coarseTpi: 2,
    fineTpi: 3,
    toothForm: 'regular',
    toothSet: 'wavy',
    material: 'bimetal',
    unitCostMinor: 5800,
    currency: 'EUR',
    supplier: 'Test supplier',
  });
  const records = {} as Record<'A' | 'C', SiteRecords>;
  for (const code of ['A', 'C'] as const) records[code] = await buildSiteRecords(world, code, fleetSpec);
  return { fleetSpec, siteSpec, ...records };
}

/**
 * One site's records (see `buildRecords`): a stock receipt of the fleet spec, a removed run and an open run on its
 * first saw, an ended and an open stop on its second, a cut log, a photo of the run, stock levels, a recorded check
 * with a photo of it, and a retired check. Site A's cut log belongs to its open run; other sites' to none.
 */
export async function buildSiteRecords(world: World, code: 'A' | 'B' | 'C', fleetSpec: BladeSpec) {
  const day = 86_400_000;
  const now = Date.now();
  const site = world.sites[code];
  const [saw1, saw2] = world.saws[code]!;
  const receipt = await StockReceipt.create({
    siteId: site.id,
    bladeSpecId: fleetSpec.id,
    quantity: 5,
    unitCostMinor: 6100,
    currency: 'EUR',
    receivedOn: new Date(now - 40 * day).toISOString().slice(0, 10),
    reference: code === 'A' ? 'LOT-1' : null,
    notes: null,
    createdById: null,
  });
  const run = await BladeRun.create({
    siteId: site.id,
    sawId: saw1!.id,
    bladeSpecId: fleetSpec.id,
    stockReceiptId: receipt.id,
    installedAt: new Date(now - 30 * day),
    installedById: null,
    tensionMpa: null,
    materialGroup: null,
    breakInFollowed: null,
    installNotes: null,
    costMinor: 6100,
    currency: 'EUR',
    removedAt: new Date(now - 20 * day),
    removalReason: 'worn_out',
  });
  const openRun = await BladeRun.create({
    siteId: site.id,
    sawId: saw1!.id,
    bladeSpecId: fleetSpec.id,
    stockReceiptId: null,
    installedAt: new Date(now - 20 * day),
    installedById: null,
    tensionMpa: 220,
    materialGroup: 'carbon_steel',
    breakInFollowed: true,
    installNotes: null,
    costMinor: 6000,
    currency: 'EUR',
  });
  const stop = await Stop.create({
    siteId: site.id,
    sawId: saw2!.id,
    startedAt: new Date(now - 3 * day),
    endedAt: new Date(now - 2 * day),
    category: 'mechanical',
    planned: false,
    notes: null,
    createdById: null,
    endedById: null,
  });
  await Stop.create({
    siteId: site.id,
    sawId: saw2!.id,
    startedAt: new Date(now - day),
    endedAt: null,
    category: 'hydraulic',
    planned: false,
    notes: 'Open',
    createdById: null,
    endedById: null,
  });
  await CutLog.create({
    siteId: site.id,
    sawId: saw1!.id,
    bladeRunId: code === 'A' ? openRun.id : null,
    cutAt: new Date(now - 5 * day),
    shape: { kind: 'round_bar', diameterMm: 100 },
    pieceCount: 1,
    piecesAcross: 1,
    materialGroup: 'carbon_steel',
    quantity: 10,
    bandSpeedMPerMin: null,
    feedMmPerMin: null,
    cutTimeS: null,
    areaPerCutMm2: 7854,
    areaCutMm2: 78540,
    teethInWorkMin: null,
    teethInWorkMax: null,
    warnings: [],
    notes: null,
    createdById: null,
  });
  await Photo.create({
    siteId: site.id,
    bladeRunId: run.id,
    contentType: 'image/png',
    byteSize: 10,
    widthPx: 1,
    heightPx: 1,
    caption: null,
    uploadedById: null,
  });
  await StockLevel.create({
    siteId: site.id,
    bladeSpecId: fleetSpec.id,
    leadTimeDays: 10,
    safetyStock: 1,
    updatedById: null,
  });
  // A check recorded on the open run, with a photo of it; and a retired fixed check with no records.
  const guide = await SiteCheck.findOne({ where: { siteId: site.id, targetRule: 'guide_clearance' } });
  const checkRecord = await CheckRecord.create({
    siteId: site.id,
    sawId: saw1!.id,
    siteCheckId: guide!.id,
    bladeRunId: openRun.id,
    checkedAt: new Date(now - 19 * day),
    checkedById: null,
    targetRule: 'guide_clearance',
    quantity: 'length',
    reading: 1.13,
    answers: null,
    target: 1.1254,
    minValue: 1.1254,
    maxValue: 1.1508,
    passed: true,
    basis: null,
    explanation: 'Fixture',
    notes: null,
  });
  await Photo.create({
    siteId: site.id,
    bladeRunId: null,
    checkRecordId: checkRecord.id,
    contentType: 'image/png',
    byteSize: 10,
    widthPx: 1,
    heightPx: 1,
    caption: null,
    uploadedById: null,
  });
  await SiteCheck.create({
    siteId: site.id,
    name: 'Old coolant check',
    measures: null,
    quantity: 'stress',
    targetRule: 'fixed',
    fixedTarget: 0.3,
    fixedMin: 0.2,
    fixedMax: null,
    schedule: 'periodic',
    intervalDays: 7,
    graceHours: 24,
    position: 10,
    retiredAt: new Date(),
    updatedById: null,
  });
  return { receipt, run, openRun, stop, checkRecord };
}
export type SiteRecords = Awaited<ReturnType<typeof buildSiteRecords>>;
export type Records = Awaited<ReturnType<typeof buildRecords>>;
export type World = Awaited<ReturnType<typeof buildWorld>>;

/** A valid blade spec body (a 34 × 1.1 mm bi-metal band for the fixture saws, 3/4 TPI). */
export function specBody(siteId: string | null, overrides: Record<string, unknown> = {}) {
  return {
    siteId,
    name: `Spec ${Math.random().toString(36).slice(2, 8)}`,
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    pitch: { kind: 'variable', coarseTpi: 3, fineTpi: 4 },
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6450,
    currency: 'EUR',
    ...overrides,
  };
}

/** An ISO time `minutes` before now. */
export const minutesAgo = (minutes: number): string => new Date(Date.now() - minutes * 60_000).toISOString();
