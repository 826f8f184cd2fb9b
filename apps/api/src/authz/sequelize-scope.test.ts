import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createMongoAbility, subject } from '@casl/ability';
import type { Model, ModelStatic } from 'sequelize';
import { ACTIONS, type AppAbility, type AppRawRule, type SubjectName } from '@kerfline/domain/authz/ability';
import { startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildRecords, buildWorld, type World } from '../test-support/fixtures.js';
import { loadSignedIn } from '../modules/auth/auth.service.js';
import { Region } from '../modules/regions/region.model.js';
import { Site } from '../modules/sites/site.model.js';
import { Saw } from '../modules/saws/saw.model.js';
import { User } from '../modules/users/user.model.js';
import { AuditEntry } from '../modules/audit/audit-entry.model.js';
import { SiteSetting } from '../modules/site-settings/site-setting.model.js';
import { Invitation } from '../modules/invitations/invitation.model.js';
import { MailLog } from '../modules/mail/mail-log.model.js';
import { BladeSpec } from '../modules/blade-specs/blade-spec.model.js';
import { StockLevel, StockReceipt } from '../modules/blade-stock/stock-receipt.model.js';
import { BladeRun } from '../modules/blade-runs/blade-run.model.js';
import { Stop } from '../modules/stops/stop.model.js';
import { CutLog } from '../modules/cut-logs/cut-log.model.js';
import { Photo } from '../modules/photos/photo.model.js';
import { Budget } from '../modules/budgets/budget.model.js';
import { FollowUp } from '../modules/follow-ups/follow-up.model.js';
import { ExchangeRate } from '../modules/exchange-rates/exchange-rate.model.js';
import { QueryTypes } from 'sequelize';
import { SiteCheck } from '../modules/site-checks/site-check.model.js';
import { CheckRecord } from '../modules/site-checks/check-record.model.js';
import { ImportBatch, ImportMapping } from '../modules/imports/import-batch.model.js';
import { RemovedRecord } from '../modules/removed-records/removed-record.model.js';
import { SqlParams, scopeSql, scopeWhere } from './sequelize-scope.js';

let ctx: TestContext;
let world: World;

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  // Audit entries of two sites and one fleet-wide entry (site NULL), so the parity check sees every case.
  await AuditEntry.bulkCreate(
    [world.sites.A.id, world.sites.C.id, null].map((siteId, n) => ({
      actorId: world.users.admin.id,
      siteId,
      entity: 'Saw',
      entityId: String(n),
      action: 'create' as const,
      before: null,
      after: { n },
    })),
  );
  // A setting changed at every site, so each role's scope over settings is checked against rows.
  await SiteSetting.bulkCreate(
    [world.sites.A.id, world.sites.B.id, world.sites.C.id].map((siteId) => ({
      siteId,
      key: 'band_tension.bimetal',
      value: { minMPa: 200, maxMPa: 240 },
      changedBy: world.users.admin.id,
    })),
  );
  // Invitations at two sites in each role a site admin may or may not give, and fleet-wide ones (site NULL).
  const invitations: [string | null, 'technician' | 'site_admin' | 'manager' | 'regional_lead' | 'admin'][] = [
    [world.sites.A.id, 'technician'],
    [world.sites.A.id, 'site_admin'],
    [world.sites.C.id, 'technician'],
    [null, 'manager'],
    [null, 'regional_lead'],
    [null, 'admin'],
  ];
  await Invitation.bulkCreate(
    invitations.map(([siteId, role], n) => ({
      email: `invited-${n}@test.example`,
      name: null,
      role,
      siteId,
      regionId: role === 'regional_lead' ? world.regions.north.id : null,
      allSites: role === 'manager',
      tokenHash: String(n).repeat(64).slice(0, 64),
      expiresAt: new Date(Date.now() + 86_400_000),
      invitedBy: world.users.admin.id,
    })),
  );
  // Mail records with and without a person.
  await MailLog.bulkCreate(
    [world.users.leadNorth.id, world.users.techA.id, null].map((userId, n) => ({
      kind: 'weekly_digest' as const,
      userId,
      toAddress: `someone-${n}@test.example`,
      dedupeKey: `parity:${n}`,
    })),
  );
  // Records of sites A and C, a fleet-wide blade spec (site NULL) and one of site A's own.
  await buildRecords(world);
  // Imports into two sites, and a remembered mapping at each of them.
  for (const siteId of [world.sites.A.id, world.sites.C.id]) {
    await ImportBatch.create({
      siteId,
      kind: 'stops',
      state: 'committed',
      fileName: 'stops.csv',
      fileBytes: 10,
      contentSha256: 'a'.repeat(64),
      sheet: null,
      plan: {},
      createdById: world.users.admin.id,
    });
    await ImportMapping.create({ siteId, kind: 'stops', memory: {}, updatedById: world.users.admin.id });
  }
  // Records removed (kept) at two sites.
  await RemovedRecord.bulkCreate(
    [world.sites.A.id, world.sites.C.id].map((siteId, n) => ({
      siteId,
      subject: 'Stop' as const,
      recordId: `00000000-0000-4000-8000-0000000000${String(n).padStart(2, '0')}`,
      sawId: null,
      occurredAt: new Date('2026-11-01T08:00:00Z'),
      keptRow: { n },
      reason: 'entered twice',
      removedById: world.users.admin.id,
    })),
  );
  // Budgets and follow-ups at sites A and C; exchange rates belong to no site.
  for (const [code, assignee] of [
    ['A', world.users.techA],
    ['C', world.users.techC],
  ] as const) {
    await Budget.create({
      siteId: world.sites[code].id,
      month: '2026-11-01',
      amountMinor: 100_000,
      currency: 'EUR',
      setById: world.users.admin.id,
    });
    await FollowUp.create({
      siteId: world.sites[code].id,
      sawId: world.saws[code]![0]!.id,
      title: `Look at ${code}-1`,
      flag: null,
      assigneeId: assignee.id,
      dueOn: '2026-12-20',
      createdById: world.users.admin.id,
    });
  }
  await ExchangeRate.create({
    month: '2026-11-01',
    currency: 'USD',
    reportingCurrency: 'EUR',
    rate: 0.92,
    setById: null,
  });
});
afterAll(async () => ctx.close());

const MODELS: Record<SubjectName, ModelStatic<Model>> = {
  Region,
  Site,
  Saw,
  User,
  AuditEntry,
  SiteSetting,
  Invitation,
  MailLog,
  BladeSpec,
  StockReceipt,
  StockLevel,
  BladeRun,
  Stop,
  CutLog,
  Photo,
  Budget,
  FollowUp,
  ExchangeRate,
  SiteCheck,
  CheckRecord,
  ImportBatch,
  ImportMapping,
  RemovedRecord,
};

/** For every row: does the scoped query return it exactly when `ability.can` says yes? */
async function mismatches(ability: AppAbility, action: (typeof ACTIONS)[number], type: SubjectName): Promise<string[]> {
  const model = MODELS[type];
  const all = (await model.findAll()).map((m) => m.get({ plain: true }) as { id: string });
  const scoped = new Set(
    (await model.findAll({ where: scopeWhere(ability, action, type, model), attributes: ['id'] })).map(
      (m) => m.get('id') as string,
    ),
  );
  return all
    .filter((row) => ability.can(action, subject(type, row) as Parameters<AppAbility['can']>[1]) !== scoped.has(row.id))
    .map((row) => `${type} ${row.id}`);
}

/** The same check for the SQL rendering used by the aggregate queries (`scopeSql`, bound parameters). */
async function sqlMismatches(
  ability: AppAbility,
  action: (typeof ACTIONS)[number],
  type: SubjectName,
): Promise<string[]> {
  const model = MODELS[type];
  const all = (await model.findAll()).map((m) => m.get({ plain: true }) as { id: string });
  const params = new SqlParams();
  const condition = scopeSql(ability, action, type, model, 't', params);
  const rows = await ctx.sequelize.query<{ id: string }>(
    `SELECT t.id FROM ${model.getTableName() as string} t WHERE ${condition}`,
    { bind: params.values, type: QueryTypes.SELECT },
  );
  const scoped = new Set(rows.map((r) => r.id));
  return all
    .filter((row) => ability.can(action, subject(type, row) as Parameters<AppAbility['can']>[1]) !== scoped.has(row.id))
    .map((row) => `${type} ${row.id}`);
}

describe('CASL rules → SQL where', () => {
  it('returns exactly the rows the ability allows, for every role, action and subject (rows with NULLs included)', async () => {
    let checks = 0;
    for (const [name, user] of Object.entries(world.users)) {
      const signedIn = (await loadSignedIn(user.id))!;
      for (const action of ACTIONS) {
        for (const type of Object.keys(MODELS) as SubjectName[]) {
          expect(await mismatches(signedIn.ability, action, type), `${name} ${action} ${type}`).toEqual([]);
          expect(await sqlMismatches(signedIn.ability, action, type), `SQL: ${name} ${action} ${type}`).toEqual([]);
          checks += 1;
        }
      }
    }
    expect(checks).toBe(Object.keys(world.users).length * ACTIONS.length * Object.keys(MODELS).length);
  });

  it('agrees with CASL for random rule sets over nullable columns, including cannot rules', async () => {
    const siteIds = [world.sites.A.id, world.sites.B.id, world.sites.C.id];
    const value = (field: string) =>
      field === 'siteId'
        ? fc.constantFrom(...siteIds)
        : field === 'make'
          ? fc.constantFrom('Testmake', null)
          : fc.constantFrom('in_service', 'retired', 'down');
    const condition = fc.constantFrom('siteId', 'make', 'status').chain((field) =>
      fc.oneof(
        value(field).map((v) => ({ [field]: v })),
        value(field).map((v) => ({ [field]: { $ne: v } })),
        fc.array(value(field), { maxLength: 3 }).map((vs) => ({ [field]: { $in: vs } })),
        fc.array(value(field), { maxLength: 3 }).map((vs) => ({ [field]: { $nin: vs } })),
      ),
    );
    const rule = fc.record({ inverted: fc.boolean(), conditions: fc.option(condition, { nil: undefined }) });
    await fc.assert(
      fc.asyncProperty(fc.array(rule, { minLength: 0, maxLength: 4 }), async (rules) => {
        const ability = createMongoAbility(
          rules.map((r) => ({ action: 'read', subject: 'Saw', ...r })) as AppRawRule[],
        ) as AppAbility;
        expect(await mismatches(ability, 'read', 'Saw')).toEqual([]);
        expect(await sqlMismatches(ability, 'read', 'Saw')).toEqual([]);
      }),
      { numRuns: 60 },
    );
  });

  it('returns no rows when no rule grants the action', async () => {
    const ability = createMongoAbility([{ action: 'update', subject: 'Saw' }]) as AppAbility;
    expect(await Saw.count({ where: scopeWhere(ability, 'read', 'Saw', Saw) })).toBe(0);
    expect(scopeSql(ability, 'read', 'Saw', Saw, 't', new SqlParams())).toBe('FALSE');
  });

  it('binds every rule value as a parameter and refuses an unsafe alias', () => {
    const ability = createMongoAbility([
      { action: 'read', subject: 'Saw', conditions: { siteId: { $in: ["x'); DROP TABLE saws; --"] } } },
    ]) as AppAbility;
    const params = new SqlParams();
    const sql = scopeSql(ability, 'read', 'Saw', Saw, 'w', params);
    expect(sql).toBe('(w."site_id" IS NOT NULL AND w."site_id" IN ($1))');
    expect(params.values).toEqual(["x'); DROP TABLE saws; --"]);
    expect(() => scopeSql(ability, 'read', 'Saw', Saw, 'w; DROP', new SqlParams())).toThrow(/Unsafe table alias/);
  });

  it('refuses operators and fields it cannot translate, instead of leaking rows', () => {
    const gt = createMongoAbility([
      { action: 'read', subject: 'Saw', conditions: { bandWidthMm: { $gt: 10 } } },
    ]) as AppAbility;
    expect(() => scopeWhere(gt, 'read', 'Saw', Saw)).toThrow(/Unsupported CASL operator 'gt'/);
    const unknown = createMongoAbility([
      { action: 'read', subject: 'Saw', conditions: { regionId: 'x' } },
    ]) as AppAbility;
    expect(() => scopeWhere(unknown, 'read', 'Saw', Saw)).toThrow(/not a column/);
    expect(() => scopeSql(gt, 'read', 'Saw', Saw, 't', new SqlParams())).toThrow(/Unsupported CASL operator 'gt'/);
    expect(() => scopeSql(unknown, 'read', 'Saw', Saw, 't', new SqlParams())).toThrow(/not a column/);
  });
});
