import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import sharp from 'sharp';
import { QueryTypes } from 'sequelize';
import { defaultSiteChecks } from '@kerfline/domain/site-checks/schema';
import { evaluateCheck } from '@kerfline/domain/checks/check-targets';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';
import { SHIPPED_LIST } from '../../db/migrations/20261204-0101-site-checks.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const rows = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
  ctx.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT });
const count = async (sql: string, replacements: Record<string, unknown> = {}) =>
  Number((await rows<{ n: number }>(`SELECT count(*)::int AS n FROM ${sql}`, replacements))[0]!.n);

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

type CheckDto = { id: string; name: string; targetRule: string; schedule: string; recordCount: number };
async function checksOf(agent: supertest.Agent, siteId: string): Promise<CheckDto[]> {
  const res = await agent.get(`/api/sites/${siteId}/checks`);
  expect(res.status).toBe(200);
  return res.body.items as CheckDto[];
}
const checkByRule = async (agent: supertest.Agent, siteId: string, rule: string) =>
  (await checksOf(agent, siteId)).find((c) => c.targetRule === rule)!;

/** Puts a 34 × 1.1 mm bi-metal band on a saw through the API; returns the run id. */
async function putBladeOn(sawId: string, minutesBefore = 60): Promise<string> {
  const admin = await as('admin@test.example');
  const spec = (await admin.post('/api/blade-specs').send(specBody(null))).body.id as string;
  const res = await admin
    .post('/api/blade-runs')
    .send({ sawId, bladeSpecId: spec, installedAt: minutesAgo(minutesBefore) });
  expect(res.status).toBe(201);
  return res.body.run.id as string;
}

describe('a site’s list of checks', () => {
  it('starts from the shipped list, for a new site as for the sites the migration found', async () => {
    const admin = await as('admin@test.example');
    const created = await admin.post('/api/sites').send({
      code: 'N',
      name: 'New site',
      city: null,
      timeZone: 'Europe/Lisbon',
      currency: 'EUR',
      unitSystem: 'metric',
      regionId: world.regions.north.id,
    });
    expect(created.status).toBe(201);
    const list = await checksOf(admin, created.body.id);
    const shipped = defaultSiteChecks();
    expect(list.map((c) => [c.name, c.targetRule, c.schedule])).toEqual(
      shipped.map((c) => [c.name, c.targetRule, c.schedule]),
    );
    // The migration's frozen copy of the list is the list the domain ships.
    expect(
      SHIPPED_LIST.map(([name, measures, quantity, targetRule, schedule, intervalDays, graceHours]) => ({
        name,
        measures,
        quantity,
        targetRule,
        schedule,
        intervalDays,
        graceHours,
      })),
    ).toEqual(
      shipped.map(({ name, measures, quantity, targetRule, schedule, intervalDays, graceHours }) => ({
        name,
        measures,
        quantity,
        targetRule,
        schedule,
        intervalDays,
        graceHours,
      })),
    );
  });

  it('lets the site admin add, change, retire and delete checks, each audited in the same transaction', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const siteId = world.sites.A.id;
    const added = await siteAdmin.post(`/api/sites/${siteId}/checks`).send({
      name: 'Feed cylinder pressure',
      measures: 'Gauge on the feed valve',
      targetRule: 'fixed',
      quantity: 'stress',
      fixedTarget: 4,
      fixedMin: 3.5,
      fixedMax: 4.5,
      schedule: 'periodic',
      intervalDays: 7,
    });
    expect(added.status).toBe(201);
    expect(added.body).toMatchObject({ siteId, graceHours: 24, position: 6, updatedByName: 'siteadmin-a' });
    const changed = await siteAdmin.patch(`/api/site-checks/${added.body.id}`).send({ fixedMax: 5, graceHours: 12 });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ fixedMax: 5, graceHours: 12 });
    const audits = await rows<{ action: string; before: Record<string, unknown>; after: Record<string, unknown> }>(
      `SELECT action, before, after FROM audit_entries WHERE entity = 'SiteCheck' AND entity_id = :id ORDER BY at, action`,
      { id: added.body.id },
    );
    expect(audits.map((a) => a.action)).toEqual(['create', 'update']);
    expect(audits[1]!.before).toMatchObject({ fixedMax: 4.5, graceHours: 24 });
    expect(audits[1]!.after).toMatchObject({ fixedMax: 5, graceHours: 12 });

    // A change that leaves the check inconsistent is refused whole, naming the field.
    const bad = await siteAdmin.patch(`/api/site-checks/${added.body.id}`).send({ fixedMin: 6 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toContainEqual({
      path: 'fixedMax',
      message: 'The highest passing value must not be below the lowest',
    });
    const ruleWithNumbers = await siteAdmin.patch(`/api/site-checks/${added.body.id}`).send({ targetRule: 'tracking' });
    expect(ruleWithNumbers.status).toBe(400);
    expect(ruleWithNumbers.body.error.details.map((d: { path: string }) => d.path)).toEqual(
      expect.arrayContaining(['quantity', 'fixedTarget']),
    );
    const duplicate = await siteAdmin.post(`/api/sites/${siteId}/checks`).send({
      name: 'band tracking',
      targetRule: 'tracking',
      schedule: 'blade_change',
    });
    expect(duplicate.status).toBe(409);
    expect(duplicate.body.error.message).toMatch(/already on this site’s list/);

    // Never recorded: it may be deleted. Retire and restore are audited too.
    expect((await siteAdmin.post(`/api/site-checks/${added.body.id}/retire`)).body.retiredAt).not.toBeNull();
    expect((await checksOf(siteAdmin, siteId)).map((c) => c.id)).not.toContain(added.body.id);
    expect((await siteAdmin.post(`/api/site-checks/${added.body.id}/restore`)).body.retiredAt).toBeNull();
    expect((await siteAdmin.delete(`/api/site-checks/${added.body.id}`)).status).toBe(204);
    expect(await count(`audit_entries WHERE entity = 'SiteCheck' AND entity_id = :id`, { id: added.body.id })).toBe(5);
  });

  it('keeps a check with records: deleting it answers 409 and says to retire it', async () => {
    await putBladeOn(world.saws.A![0]!.id);
    const tech = await as('tech-a@test.example');
    const guide = await checkByRule(tech, world.sites.A.id, 'guide_clearance');
    expect(
      (
        await tech
          .post('/api/check-records')
          .send({ sawId: world.saws.A![0]!.id, siteCheckId: guide.id, reading: 1.13 })
      ).status,
    ).toBe(201);
    const siteAdmin = await as('siteadmin-a@test.example');
    const res = await siteAdmin.delete(`/api/site-checks/${guide.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(
      '“Guide bearing clearance” has 1 recorded check; retire it instead, so its history stays',
    );
    expect(await count('site_checks WHERE id = :id', { id: guide.id })).toBe(1);
  });

  it('is read by whoever reads the site and changed only by admins and that site’s admin', async () => {
    const siteA = world.sites.A.id;
    const checkA = await checkByRule(await as('admin@test.example'), siteA, 'tracking');
    expect((await (await as('tech-c@test.example')).get(`/api/sites/${siteA}/checks`)).status).toBe(404);
    expect((await (await as('tech-c@test.example')).get(`/api/site-checks/${checkA.id}`)).status).toBe(404);
    expect((await (await as('lead-north@test.example')).get(`/api/sites/${siteA}/checks`)).status).toBe(200);
    expect((await (await as('manager-ac@test.example')).get(`/api/sites/${world.sites.B.id}/checks`)).status).toBe(404);
    for (const email of ['tech-a@test.example', 'lead-north@test.example', 'manager-ac@test.example']) {
      const agent = await as(email);
      const res = await agent.patch(`/api/site-checks/${checkA.id}`).send({ graceHours: 2 });
      expect(res.status, email).toBe(403);
      expect(res.body.error.message).toBe('Only an administrator or this site’s admin can change its list of checks');
      expect(
        (
          await agent
            .post(`/api/sites/${siteA}/checks`)
            .send({ name: 'X', targetRule: 'tracking', schedule: 'blade_change' })
        ).status,
      ).toBe(403);
    }
    const checkC = await checkByRule(await as('admin@test.example'), world.sites.C.id, 'tracking');
    expect(
      (await (await as('siteadmin-a@test.example')).patch(`/api/site-checks/${checkC.id}`).send({ graceHours: 2 }))
        .status,
    ).toBe(404);
    expect(await count(`audit_entries WHERE entity = 'SiteCheck'`)).toBe(0);
  });
});

describe('recording a check', () => {
  it('works out the target and pass or fail on the server: a guide opening tighter than the band fails', async () => {
    const saw = world.saws.A![0]!;
    const runId = await putBladeOn(saw.id);
    const tech = await as('tech-a@test.example');
    const guide = await checkByRule(tech, world.sites.A.id, 'guide_clearance');
    // The band is 1.1 mm thick; 1.0 mm is tighter than the band itself.
    const res = await tech
      .post('/api/check-records')
      .send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.0, notes: 'Left guide' });
    expect(res.status).toBe(201);
    const domain = evaluateCheck({ kind: 'guide_clearance', bandThicknessMm: 1.1, measuredMm: 1.0 });
    expect(res.body).toMatchObject({
      siteId: world.sites.A.id,
      sawId: saw.id,
      sawAssetTag: 'A-1',
      siteCheckId: guide.id,
      checkName: 'Guide bearing clearance',
      bladeRunId: runId,
      reading: 1.0,
      target: domain.target,
      min: domain.min,
      max: domain.max,
      passed: false,
      explanation: domain.explanation,
      basis: { kind: 'site_setting', settingKey: 'guide_clearance', changedAt: null },
      checkedByName: 'tech-a',
      notes: 'Left guide',
    });
    expect(res.body.explanation).toContain('tighter than the band itself');
    // Within target and target + 0.001 in: passes.
    const ok = await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.13 });
    expect(ok.body.passed).toBe(true);
    // The browser's word for the verdict is not taken: an extra field is refused.
    const claimed = await tech
      .post('/api/check-records')
      .send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.0, passed: true });
    expect(claimed.status).toBe(400);
    expect(await count(`check_records WHERE saw_id = :saw`, { saw: saw.id })).toBe(2);
    expect(await count(`audit_entries WHERE entity = 'CheckRecord'`)).toBe(2);
  });

  it('uses the site’s own setting for the target, and says whose it is', async () => {
    const saw = world.saws.A![0]!;
    await putBladeOn(saw.id);
    const siteAdmin = await as('siteadmin-a@test.example');
    // Site A allows 0.05 mm more open than the target.
    expect(
      (
        await siteAdmin
          .put(`/api/sites/${world.sites.A.id}/settings/guide_clearance`)
          .send({ value: { extraClearanceMm: 0.0254, toleranceMm: 0.05 } })
      ).status,
    ).toBe(200);
    const guide = await checkByRule(siteAdmin, world.sites.A.id, 'guide_clearance');
    const res = await (
      await as('tech-a@test.example')
    )
      .post('/api/check-records')
      .send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.16 });
    // 1.1 + 0.0254 = 1.1254 mm; up to 1.1754 mm passes, so 1.16 mm passes here and would fail on shipped values.
    expect(res.body).toMatchObject({ passed: true, max: expect.closeTo(1.1754, 9) });
    expect(res.body.basis).toMatchObject({ kind: 'site_setting', changedByName: 'siteadmin-a' });
  });

  it('judges head down-force by the saw’s own limit when it has one, else the site’s, and says which', async () => {
    const [saw, other] = [world.saws.A![0]!, world.saws.A![1]!];
    const siteAdmin = await as('siteadmin-a@test.example');
    // Both heads fed by a spring; the site keeps its shipped 2–8 lbf (8 lbf: common practice, no source).
    for (const s of [saw, other])
      expect((await siteAdmin.patch(`/api/saws/${s.id}`).send({ headFeed: 'gravity_spring' })).status).toBe(200);
    // This saw's own greatest: 6 lbf = 26.689 N (1 lbf = 4.4482216152605 N, NIST SP 811 B.8); least: the site's.
    const set = await siteAdmin.patch(`/api/saws/${saw.id}`).send({ maxHeadForceN: 26.689 });
    expect(set.status).toBe(200);
    expect(set.body).toMatchObject({
      maxHeadForceN: 26.689,
      minHeadForceN: null,
      headForceSet: { byName: 'siteadmin-a', at: expect.any(String) },
    });
    const force = await checkByRule(siteAdmin, world.sites.A.id, 'feed_pressure');
    const tech = await as('tech-a@test.example');
    // 7 lbf = 31.138 N: over this saw's 6 lbf, within the site's 8 lbf on the other saw.
    const own = await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: force.id, reading: 31.138 });
    expect(own.status).toBe(201);
    expect(own.body).toMatchObject({ passed: false, max: 26.689, min: expect.closeTo(8.896, 3) });
    expect(own.body.basis).toMatchObject({
      kind: 'record',
      note: 'this saw’s own largest head force (the least is your site’s setting)',
      setByName: 'siteadmin-a',
      setAt: set.body.headForceSet.at,
    });
    const site = await tech
      .post('/api/check-records')
      .send({ sawId: other.id, siteCheckId: force.id, reading: 31.138 });
    expect(site.body).toMatchObject({ passed: true, max: expect.closeTo(35.586, 3) });
    expect(site.body.basis).toMatchObject({ kind: 'site_setting', settingKey: 'head_force' });
    // The saw's page of checks shows the same target before anything is read.
    const checks = await tech.get(`/api/saws/${saw.id}/checks`);
    const target = checks.body.items.find(
      (i: { check: { targetRule: string } }) => i.check.targetRule === 'feed_pressure',
    );
    expect(target.target).toMatchObject({ applicable: true, max: 26.689, basis: { kind: 'record' } });

    // A least above the greatest, or a negative least, is refused naming the field; nothing changes.
    const crossed = await siteAdmin.patch(`/api/saws/${saw.id}`).send({ minHeadForceN: 30 });
    expect(crossed.status).toBe(400);
    expect(crossed.body.error.details).toEqual([
      { path: 'maxHeadForceN', message: 'Largest head force must not be below the least' },
    ]);
    const negative = await siteAdmin.patch(`/api/saws/${saw.id}`).send({ minHeadForceN: -1 });
    expect(negative.status).toBe(400);
    expect(negative.body.error.details[0]).toMatchObject({
      path: 'minHeadForceN',
      message: 'Least head force must not be negative',
    });
    const stored = await rows<{ min: number | null; max: number }>(
      'SELECT min_head_force_n AS min, max_head_force_n AS max FROM saws WHERE id = :id',
      { id: saw.id },
    );
    expect(stored).toEqual([{ min: null, max: 26.689 }]);
    // Back to the site's setting: null.
    const cleared = await siteAdmin.patch(`/api/saws/${saw.id}`).send({ maxHeadForceN: null });
    expect(cleared.body).toMatchObject({ maxHeadForceN: null, headForceSet: null });
  });

  it('refuses a check that does not apply to the saw, saying why, and bad input naming the field', async () => {
    const saw = world.saws.A![0]!; // hydraulic feed, as saws are recorded by default
    const tech = await as('tech-a@test.example');
    const force = await checkByRule(tech, world.sites.A.id, 'feed_pressure');
    const refused = await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: force.id, reading: 20 });
    expect(refused.status).toBe(400);
    expect(refused.body.error.message).toMatch(/^This check does not apply: This saw feeds its head hydraulically/);
    expect(refused.body.error.details[0].path).toBe('siteCheckId');
    const tension = await checkByRule(tech, world.sites.A.id, 'band_tension');
    const noBlade = await tech
      .post('/api/check-records')
      .send({ sawId: saw.id, siteCheckId: tension.id, reading: 190 });
    expect(noBlade.status).toBe(400);
    expect(noBlade.body.error.message).toMatch(/No blade is recorded on this saw/);

    const guide = await checkByRule(tech, world.sites.A.id, 'guide_clearance');
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [{ reading: 'thin' }, 'reading', /must be a number/],
      [{}, 'reading', /Enter the reading/],
      [{ reading: 40 }, 'reading', /Measured clearance must be at most 10 mm/],
      [{ reading: 1, checkedAt: '2090-01-01T00:00:00Z' }, 'checkedAt', /must not be in the future/],
      [{ reading: 1, siteCheckId: 'nope' }, 'siteCheckId', /must be an id/],
    ];
    for (const [body, path, message] of cases) {
      const res = await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: guide.id, ...body });
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.details[0], JSON.stringify(body)).toMatchObject({
        path,
        message: expect.stringMatching(message),
      });
    }
    const brush = await checkByRule(tech, world.sites.A.id, 'chip_brush');
    const noAnswers = await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: brush.id });
    expect(noAnswers.body.error.details[0]).toMatchObject({ path: 'answers' });
    const answered = await tech
      .post('/api/check-records')
      .send({ sawId: saw.id, siteCheckId: brush.id, answers: { reachesGullets: false, worn: false } });
    expect(answered.body).toMatchObject({
      passed: false,
      reading: null,
      answers: { reachesGullets: false, worn: false },
    });
    // A check of another site's list is not this saw's.
    const otherSite = await checkByRule(await as('admin@test.example'), world.sites.C.id, 'guide_clearance');
    const foreign = await tech
      .post('/api/check-records')
      .send({ sawId: saw.id, siteCheckId: otherSite.id, reading: 1 });
    expect(foreign.status).toBe(400);
    expect(foreign.body.error.details[0]).toMatchObject({ path: 'siteCheckId' });
    expect(await count('check_records')).toBe(1);
  });

  it('lets technicians and site admins record at their own site only; managers and leads read', async () => {
    const guideC = await checkByRule(await as('admin@test.example'), world.sites.C.id, 'guide_clearance');
    const guideA = await checkByRule(await as('admin@test.example'), world.sites.A.id, 'guide_clearance');
    const techA = await as('tech-a@test.example');
    // Another site's saw is not found for them, id or not.
    const elsewhere = await techA
      .post('/api/check-records')
      .send({ sawId: world.saws.C![0]!.id, siteCheckId: guideC.id, reading: 1.13 });
    expect(elsewhere.status).toBe(404);
    for (const email of ['manager-ac@test.example', 'lead-north@test.example']) {
      const res = await (
        await as(email)
      )
        .post('/api/check-records')
        .send({ sawId: world.saws.A![0]!.id, siteCheckId: guideA.id, reading: 1.13 });
      expect(res.status, email).toBe(403);
    }
    const retired = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/check-records')
      .send({ sawId: world.retiredA.id, siteCheckId: guideA.id, reading: 1.13 });
    expect(retired.status).toBe(409);
    const own = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/check-records')
      .send({ sawId: world.saws.A![0]!.id, siteCheckId: guideA.id, reading: 1.13 });
    expect(own.status).toBe(201);
    expect((await (await as('tech-c@test.example')).get(`/api/check-records/${own.body.id}`)).status).toBe(404);
    expect(
      (await (await as('tech-c@test.example')).get(`/api/check-records?siteId=${world.sites.A.id}`)).body.total,
    ).toBe(0);
    expect((await (await as('lead-north@test.example')).get(`/api/check-records/${own.body.id}`)).status).toBe(200);
    expect((await (await as('manager-ac@test.example')).get(`/api/check-records?passed=true`)).body.total).toBe(1);
    expect(
      (await techA.delete(`/api/check-records/${own.body.id}`).send({ reason: 'Entered by mistake' })).status,
    ).toBe(403);
    expect(
      (
        await (
          await as('siteadmin-a@test.example')
        )
          .delete(`/api/check-records/${own.body.id}`)
          .send({ reason: 'Entered by mistake' })
      ).status,
    ).toBe(204);
  });
});

describe('photos of a recorded check', () => {
  async function png(): Promise<Buffer> {
    return sharp({ create: { width: 64, height: 48, channels: 3, background: '#777' } })
      .png()
      .toBuffer();
  }

  it('belong to the record, follow the same rules and are served only to readers of the saw', async () => {
    const saw = world.saws.A![0]!;
    await putBladeOn(saw.id);
    const tech = await as('tech-a@test.example');
    const guide = await checkByRule(tech, world.sites.A.id, 'guide_clearance');
    const record = (await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.0 }))
      .body;
    const photo = await tech
      .post(`/api/check-records/${record.id}/photos`)
      .field('caption', 'Guide worn on one side')
      .attach('photo', await png(), 'guide.png');
    expect(photo.status).toBe(201);
    expect(photo.body).toMatchObject({ checkRecordId: record.id, bladeRunId: null, contentType: 'image/png' });
    expect((await tech.get(`/api/check-records/${record.id}`)).body.photoCount).toBe(1);
    expect((await tech.get(`/api/check-records/${record.id}/photos`)).body).toHaveLength(1);
    const text = await tech.post(`/api/check-records/${record.id}/photos`).attach('photo', Buffer.from('no'), 'x.jpg');
    expect(text.status).toBe(400);
    const techC = await as('tech-c@test.example');
    for (const url of [photo.body.imageUrl, photo.body.thumbnailUrl, `/api/check-records/${record.id}/photos`])
      expect((await techC.get(url)).status, url).toBe(404);
    expect(
      (await techC.post(`/api/check-records/${record.id}/photos`).attach('photo', await png(), 'p.png')).status,
    ).toBe(404);
    expect((await (await as('lead-north@test.example')).get(photo.body.imageUrl)).status).toBe(200);
    expect(
      (
        await (
          await as('manager-ac@test.example')
        )
          .post(`/api/check-records/${record.id}/photos`)
          .attach('photo', await png(), 'p.png')
      ).status,
    ).toBe(403);
    // Removing the record takes its photo and the photo's bytes with it to the kept records, audited.
    expect(
      (
        await (
          await as('siteadmin-a@test.example')
        )
          .delete(`/api/check-records/${record.id}`)
          .send({ reason: 'Entered by mistake' })
      ).status,
    ).toBe(204);
    expect(await count('photos')).toBe(0);
    expect(await count('photo_blobs')).toBe(0);
    expect(await count('removed_photo_blobs')).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'Photo' AND action = 'delete'`)).toBe(1);
  });
});

describe('due and overdue checks, in SQL', () => {
  // A hand-built fixture at site A, read as of 1 March 2026, 12:00 UTC. Saws and the shipped checks count from
  // 1 January 2026 (their creation, moved back here).
  const asOf = new Date('2026-03-01T12:00:00Z');
  const T0 = '2026-01-01T00:00:00Z';

  async function fixture() {
    const [saw1, saw2] = world.saws.A!;
    const siteId = world.sites.A.id;
    await ctx.sequelize.query(`UPDATE saws SET created_at = :T0 WHERE site_id = :siteId`, {
      replacements: { T0, siteId },
    });
    await ctx.sequelize.query(`UPDATE site_checks SET created_at = :T0 WHERE site_id = :siteId`, {
      replacements: { T0, siteId },
    });
    // A-2 has a spring-fed head, so the head down-force check applies to it.
    await ctx.sequelize.query(`UPDATE saws SET head_feed = 'gravity_spring' WHERE id = :id`, {
      replacements: { id: saw2!.id },
    });
    const id = async (rule: string) =>
      (
        await rows<{ id: string }>(
          `SELECT id FROM site_checks WHERE site_id = :siteId AND target_rule = :rule AND retired_at IS NULL`,
          {
            siteId,
            rule,
          },
        )
      )[0]!.id;
    // The chip brush gets 12 h of grace instead of 8.
    await ctx.sequelize.query(`UPDATE site_checks SET grace_hours = 12 WHERE id = :id`, {
      replacements: { id: await id('chip_brush') },
    });
    // A fixed check added to the list on 28 February at 12:00, weekly, a day's grace, never recorded.
    const siteAdmin = await as('siteadmin-a@test.example');
    const fixed = (
      await siteAdmin.post(`/api/sites/${siteId}/checks`).send({
        name: 'Feed cylinder pressure',
        targetRule: 'fixed',
        quantity: 'stress',
        fixedTarget: 4,
        fixedMax: 4.5,
        schedule: 'periodic',
        intervalDays: 7,
      })
    ).body.id as string;
    await ctx.sequelize.query(`UPDATE site_checks SET created_at = '2026-02-28T12:00:00Z' WHERE id = :fixed`, {
      replacements: { fixed },
    });
    // A retired check never counts.
    await ctx.sequelize.query(
      `INSERT INTO site_checks (site_id, name, quantity, target_rule, schedule, grace_hours, retired_at, created_at)
       VALUES (:siteId, 'Retired one', 'length', 'tracking', 'blade_change', 1, now(), :T0)`,
      { replacements: { siteId, T0 } },
    );
    // A-1 carries a blade put on at 02:00 on 1 March; A-2 has none.
    const spec = (await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(null))).body.id;
    const run = (
      await rows<{ id: string }>(
        `INSERT INTO blade_runs (site_id, saw_id, blade_spec_id, installed_at, cost_minor, currency)
         VALUES (:siteId, :saw, :spec, '2026-03-01T02:00:00Z', 0, 'EUR') RETURNING id`,
        { siteId, saw: saw1!.id, spec },
      )
    )[0]!.id;
    const record = (sawId: string, rule: string, at: string, passed = true) =>
      id(rule).then((checkId) =>
        ctx.sequelize.query(
          `INSERT INTO check_records (site_id, saw_id, site_check_id, checked_at, target_rule, quantity, reading, passed,
                                      explanation)
           VALUES (:siteId, :sawId, :checkId, :at, :rule, 'length', 1, :passed, 'fixture')`,
          { replacements: { siteId, sawId, checkId, at, rule, passed } },
        ),
      );
    await record(saw1!.id, 'tracking', '2026-03-01T03:00:00Z'); // since the blade went on
    await record(saw1!.id, 'band_tension', '2026-02-27T10:00:00Z'); // before it: does not count
    await record(saw1!.id, 'bearing_wear', '2026-01-30T12:00:00Z', false);
    await record(saw2!.id, 'bearing_wear', '2026-02-20T08:00:00Z');
    return { saw1: saw1!, saw2: saw2!, run, fixed };
  }

  it('gives each saw’s checks their state, worked out by hand', async () => {
    const { saw1, saw2, fixed } = await fixture();
    const { statusRows } = await import('./check-status.js');
    const got = (await statusRows({ siteIds: [world.sites.A.id], asOf })).map((r) => [
      r.asset_tag,
      r.site_check_id === fixed ? 'fixed' : r.target_rule,
      r.state,
      r.falls_due_at?.toISOString() ?? null,
      r.overdue_at?.toISOString() ?? null,
    ]);
    expect(got).toEqual([
      // A-1, blade on at 02:00. Guide: not recorded since; falls due 02:00, + 8 h = 10:00 < 12:00: overdue.
      ['A-1', 'guide_clearance', 'overdue', '2026-03-01T02:00:00.000Z', '2026-03-01T10:00:00.000Z'],
      // Tracking: recorded at 03:00, after the blade went on: nothing pending.
      ['A-1', 'tracking', 'ok', null, null],
      // Tension: last recorded 27 Feb, before this blade: falls due 02:00, overdue from 10:00.
      ['A-1', 'band_tension', 'overdue', '2026-03-01T02:00:00.000Z', '2026-03-01T10:00:00.000Z'],
      // Chip brush: 12 h grace, 02:00 + 12 h = 14:00 > 12:00: due, not yet overdue.
      ['A-1', 'chip_brush', 'due', '2026-03-01T02:00:00.000Z', '2026-03-01T14:00:00.000Z'],
      // Head down-force does not apply to A-1's hydraulic feed: no row. Bearing wear: 30 Jan 12:00 + 30 d =
      // 1 Mar 12:00 = now: due (from that moment), overdue after 2 Mar 12:00.
      ['A-1', 'bearing_wear', 'due', '2026-03-01T12:00:00.000Z', '2026-03-02T12:00:00.000Z'],
      // The fixed check applies from its creation, 28 Feb 12:00; + 24 h = 1 Mar 12:00, not strictly after: due.
      ['A-1', 'fixed', 'due', '2026-02-28T12:00:00.000Z', '2026-03-01T12:00:00.000Z'],
      // A-2 has no blade: the blade-change checks are not pending and band tension does not apply.
      ['A-2', 'guide_clearance', 'ok', null, null],
      ['A-2', 'tracking', 'ok', null, null],
      ['A-2', 'chip_brush', 'ok', null, null],
      // Head down-force on A-2's spring-fed head, never recorded: due from 1 Jan, overdue after 2 Jan.
      ['A-2', 'feed_pressure', 'overdue', '2026-01-01T00:00:00.000Z', '2026-01-02T00:00:00.000Z'],
      // Bearing wear: 20 Feb 08:00 + 30 d = 22 Mar 08:00: not yet.
      ['A-2', 'bearing_wear', 'ok', '2026-03-22T08:00:00.000Z', '2026-03-23T08:00:00.000Z'],
      ['A-2', 'fixed', 'due', '2026-02-28T12:00:00.000Z', '2026-03-01T12:00:00.000Z'],
    ]);
    expect([saw1.assetTag, saw2.assetTag]).toEqual(['A-1', 'A-2']);
  });

  it('agrees with the domain’s due rule for every saw and check of the fixture', async () => {
    await fixture();
    const { statusRows } = await import('./check-status.js');
    const { checkDueState } = await import('@kerfline/domain/checks/check-due');
    const sql = await statusRows({ siteIds: [world.sites.A.id], asOf });
    const facts = await rows<{
      saw_id: string;
      check_id: string;
      schedule: 'blade_change' | 'periodic';
      interval_days: number | null;
      grace_hours: number;
      blade_on: Date | null;
      last: Date | null;
      applies: Date;
    }>(
      `SELECT s.id AS saw_id, c.id AS check_id, c.schedule, c.interval_days, c.grace_hours,
              (SELECT installed_at FROM blade_runs r WHERE r.saw_id = s.id AND r.removed_at IS NULL) AS blade_on,
              (SELECT max(checked_at) FROM check_records cr WHERE cr.saw_id = s.id AND cr.site_check_id = c.id) AS last,
              greatest(s.created_at, c.created_at) AS applies
         FROM saws s JOIN site_checks c ON c.site_id = s.site_id AND c.retired_at IS NULL
        WHERE s.site_id = :siteId AND s.status <> 'retired'`,
      { siteId: world.sites.A.id },
    );
    let compared = 0;
    for (const row of sql) {
      const f = facts.find((x) => x.saw_id === row.saw_id && x.check_id === row.site_check_id)!;
      const domain = checkDueState({
        schedule: f.schedule,
        intervalDays: f.interval_days,
        graceHours: f.grace_hours,
        bladeOnSince: f.blade_on,
        lastCheckedAt: f.last,
        appliesSince: f.applies,
        asOf,
      });
      expect([row.state, row.falls_due_at?.getTime() ?? null, row.overdue_at?.getTime() ?? null]).toEqual([
        domain.state,
        domain.fallsDueAt?.getTime() ?? null,
        domain.overdueAt?.getTime() ?? null,
      ]);
      compared += 1;
    }
    expect(compared).toBe(12);
  });

  it('pages a site’s overdue list on the server, and counts each site’s due and overdue checks', async () => {
    await fixture();
    // As of now (months after 1 March 2026) all that was pending on A is overdue: the 3 overdue and 4 due on
    // 1 March, and A-2's bearing wear (due 22 March): 8.
    const lead = await as('lead-north@test.example');
    const first = await lead.get(`/api/sites/${world.sites.A.id}/checks/overdue?limit=2`);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ total: 8, limit: 2, offset: 0 });
    // Longest overdue first: A-2's head down-force (2 Jan).
    expect(first.body.items[0]).toMatchObject({ sawAssetTag: 'A-2', checkName: 'Head down-force', state: 'overdue' });
    const last = await lead.get(`/api/sites/${world.sites.A.id}/checks/overdue?limit=2&offset=7`);
    expect(last.body.items).toHaveLength(1);
    expect((await lead.get(`/api/sites/${world.sites.A.id}/checks/overdue?offset=50`)).body).toMatchObject({
      total: 8,
      items: [],
    });
    const bySaw = await lead.get(
      `/api/sites/${world.sites.A.id}/checks/overdue?sawId=${world.saws.A![1]!.id}&schedule=periodic`,
    );
    // Longest overdue first: 2 Jan, 1 Mar 12:00, 23 Mar 08:00.
    expect(bySaw.body.items.map((i: { checkName: string }) => i.checkName)).toEqual([
      'Head down-force',
      'Feed cylinder pressure',
      'Guide and pressure bearing wear',
    ]);
    expect((await lead.get(`/api/sites/${world.sites.A.id}/checks/overdue?state=soon`)).status).toBe(400);
    expect((await lead.get(`/api/sites/${world.sites.C.id}/checks/overdue`)).status).toBe(404);
    // Site B's saws were added just now: their bearing checks fall due at once, overdue after a day.
    const counts = await lead.get('/api/check-counts');
    expect(counts.body.items).toEqual([
      { siteId: world.sites.A.id, due: 0, overdue: 8 },
      { siteId: world.sites.B.id, due: 2, overdue: 0 },
    ]);
    expect((await lead.get(`/api/sites/${world.sites.A.id}/checks/counts`)).body).toEqual({
      siteId: world.sites.A.id,
      due: 0,
      overdue: 8,
    });
    expect((await (await as('tech-c@test.example')).get(`/api/sites/${world.sites.A.id}/checks/counts`)).status).toBe(
      404,
    );
  });

  it('gives a saw its checks with their targets for the blade on it, and why one does not apply', async () => {
    const saw = world.saws.A![0]!;
    await putBladeOn(saw.id, 30);
    const res = await (await as('tech-a@test.example')).get(`/api/saws/${saw.id}/checks`);
    expect(res.status).toBe(200);
    expect(res.body.bladeSpecName).toMatch(/^Spec /);
    const byRule = Object.fromEntries(
      res.body.items.map((i: { check: { targetRule: string } }) => [i.check.targetRule, i]),
    );
    expect(byRule.guide_clearance).toMatchObject({
      state: 'due',
      target: { applicable: true, target: expect.closeTo(1.1254, 9) },
    });
    expect(byRule.feed_pressure).toMatchObject({ state: 'ok', target: { applicable: false } });
    expect(byRule.feed_pressure.target.explanation).toMatch(/hydraulically/);
    expect((await (await as('tech-c@test.example')).get(`/api/saws/${saw.id}/checks`)).status).toBe(404);
  });
});

describe('the diagnosis reads the saw’s checks', () => {
  it('a failed guide check raises the guide causes of crooked cutting', async () => {
    const saw = world.saws.A![0]!;
    const runId = await putBladeOn(saw.id, 120);
    const tech = await as('tech-a@test.example');
    const guide = await checkByRule(tech, world.sites.A.id, 'guide_clearance');
    await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.0 });
    const res = await tech.get(`/api/blade-runs/${runId}/likely-causes?reason=crooked_cutting`);
    expect(res.status).toBe(200);
    expect(res.body.evidenceUsed.checks).toBeGreaterThanOrEqual(1);
    const lines = res.body.causes.flatMap((c: { evidence: { text: string }[] }) => c.evidence.map((e) => e.text));
    expect(lines).toContain('Last guide bearing clearance check failed.');
  });
});

describe('the saw’s timeline', () => {
  it('shows recorded checks among its runs and stops, to readers of the saw only', async () => {
    const saw = world.saws.A![0]!;
    await putBladeOn(saw.id, 90);
    const tech = await as('tech-a@test.example');
    const guide = await checkByRule(tech, world.sites.A.id, 'guide_clearance');
    const record = (await tech.post('/api/check-records').send({ sawId: saw.id, siteCheckId: guide.id, reading: 1.0 }))
      .body;
    const timeline = await tech.get(`/api/saws/${saw.id}/timeline`);
    expect(timeline.status).toBe(200);
    expect(timeline.body.items[0]).toMatchObject({
      kind: 'check',
      id: record.id,
      checkName: 'Guide bearing clearance',
      reading: 1.0,
      passed: false,
      endedAt: null,
      byName: 'tech-a',
    });
    expect(timeline.body.items.map((e: { kind: string }) => e.kind)).toEqual(['check', 'blade_run']);
    expect((await (await as('tech-c@test.example')).get(`/api/saws/${saw.id}/timeline`)).status).toBe(404);
  });
});
