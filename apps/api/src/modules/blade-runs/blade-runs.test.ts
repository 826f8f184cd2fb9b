import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
let specId: string;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const count = async (table: string) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${table}`, { plain: true }))!.n as number;

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  const admin = await as('admin@test.example');
  specId = (await admin.post('/api/blade-specs').send(specBody(null, { name: 'Fleet 34 bi-metal 3/4' }))).body.id;
});

const install = (agent: supertest.Agent, sawId: string, extra: Record<string, unknown> = {}) =>
  agent.post('/api/blade-runs').send({ sawId, bladeSpecId: specId, ...extra });

describe('putting a blade on', () => {
  it('records who and when, gives the break-in plan for the saw, band and material, and warns when not from stock', async () => {
    const tech = await as('tech-a@test.example');
    const saw = world.saws.A![0]!;
    const installedAt = minutesAgo(30);
    const res = await install(tech, saw.id, {
      installedAt,
      tensionMpa: 220,
      materialGroup: 'stainless_steel',
      breakInFollowed: true,
    });
    expect(res.status).toBe(201);
    expect(res.body.run).toMatchObject({
      sawId: saw.id,
      siteId: world.sites.A.id,
      sawAssetTag: 'A-1',
      bladeSpecId: specId,
      bladeSpecName: 'Fleet 34 bi-metal 3/4',
      installedAt: new Date(installedAt).toISOString(),
      installedByName: 'tech-a',
      tensionMpa: 220,
      materialGroup: 'stainless_steel',
      breakInFollowed: true,
      stockReceiptId: null,
      costMinor: 6450,
      currency: 'EUR',
      removedAt: null,
    });
    // The plan is the domain's default break-in (time mode), with no cutting rate yet for this saw.
    expect(res.body.breakIn.plan.steps.map((s: { feedFraction: number }) => s.feedFraction)).toEqual([
      1 / 3,
      0.5,
      0.75,
      1,
    ]);
    expect(res.body.breakIn.plan.totalDurationMin).toBe(20);
    expect(res.body.breakIn.normalCuttingRateMm2PerMin).toBeNull();
    // Stainless: 20–40 m/min recommended (from memory, see band-speed); the fixture saw runs 18–110 m/min.
    expect(res.body.breakIn.bandSpeed.reachableMPerMin).toEqual({ minMPerMin: 20, maxMPerMin: 40 });
    expect(res.body.breakIn.plan.bandSpeed).toMatchObject({ materialGroup: 'stainless_steel', breakInMaxMPerMin: 40 });
    // A carbon steel band runs at half the bi-metal speed (Machinery's Handbook, 31st ed., p. 1245): 10–20 m/min.
    const carbon = (
      await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(null, { material: 'carbon' }))
    ).body.id;
    const slow = await tech.get(
      `/api/saws/${saw.id}/break-in-plan?bladeSpecId=${carbon}&materialGroup=stainless_steel`,
    );
    expect(slow.body.bandSpeed.recommended).toMatchObject({ minMPerMin: 10, maxMPerMin: 20 });
    expect(slow.body.bandSpeed.reachableMPerMin).toEqual({ minMPerMin: 18, maxMPerMin: 20 });
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toEqual(['not_from_stock']);

    const saw1 = (await tech.get(`/api/saws/${saw.id}`)).body;
    expect(saw1.bladeOn).toEqual({
      runId: res.body.run.id,
      bladeSpecId: specId,
      bladeSpecName: 'Fleet 34 bi-metal 3/4',
      since: new Date(installedAt).toISOString(),
    });
    const audit = (
      await (await as('siteadmin-a@test.example')).get(`/api/audit?entity=BladeRun&entityId=${res.body.run.id}`)
    ).body;
    expect(audit.items).toHaveLength(1);
    expect(audit.items[0]).toMatchObject({ action: 'create', actorId: world.users.techA.id });
  });

  it('answers the break-in plan before saving, with the saw’s usual cutting rate from its timed cut logs', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    // 100 mm round bar: π × 100² / 4 = 7 853.98 mm² per cut; in 60 s and 120 s → 7 854 and 3 927 mm²/min.
    for (const cutTimeS of [60, 120, 90])
      await tech
        .post('/api/cut-logs')
        .send({
          sawId,
          stock: { shape: { kind: 'round_bar', diameterMm: 100 } },
          materialGroup: 'carbon_steel',
          cutTimeS,
        })
        .expect(201);
    const res = await tech.get(`/api/saws/${sawId}/break-in-plan?bladeSpecId=${specId}&materialGroup=carbon_steel`);
    expect(res.status).toBe(200);
    // Median of 7 854, 3 927 and 5 236 mm²/min is 5 236 (= 7 853.98 / 1.5).
    expect(res.body.normalCuttingRateMm2PerMin).toBeCloseTo((Math.PI * 100 * 100) / 4 / 1.5, 6);
    expect(res.body.plan.steps[0].areaMm2).toBeCloseTo((((1 / 3) * (Math.PI * 2500)) / 1.5) * 10, 4);
    const admin = await as('admin@test.example');
    const long = (await admin.post('/api/blade-specs').send(specBody(null, { name: 'Long band', lengthMm: 5000 }))).body
      .id;
    const warn = await tech.get(`/api/saws/${sawId}/break-in-plan?bladeSpecId=${long}`);
    expect(warn.body.warnings).toEqual([
      { code: 'length_mismatch', message: 'Long band is 5000 mm long; this saw takes 4115 mm bands.' },
    ]);
  });

  it('allows one blade on a saw at a time: a second install gets a 409 naming the blade on it', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const first = (await install(tech, sawId, { installedAt: minutesAgo(60) })).body.run;
    const second = await install(tech, sawId);
    expect(second.status).toBe(409);
    expect(second.body.error.message).toContain(first.id);
    expect(second.body.error.message).toMatch(/not yet taken off.*take that blade off first/);
    expect(await count('blade_runs')).toBe(1);
  });

  it('lets the database decide two concurrent installs on one saw: one 201, one 409, nothing half-written', async () => {
    const [a, b] = await Promise.all([as('tech-a@test.example'), as('siteadmin-a@test.example')]);
    const sawId = world.saws.A![1]!.id;
    const results = await Promise.all([install(a, sawId), install(b, sawId)]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    expect(await count('blade_runs')).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'BladeRun'`)).toBe(1);
  });

  it('refuses a blade whose time overlaps an earlier run of the saw', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const old = (await install(tech, sawId, { installedAt: minutesAgo(600) })).body.run;
    await tech
      .post(`/api/blade-runs/${old.id}/remove`)
      .send({ removedAt: minutesAgo(300), reason: 'worn_out' })
      .expect(200);
    const overlapping = await install(tech, sawId, { installedAt: minutesAgo(400) });
    expect(overlapping.status).toBe(409);
    expect(overlapping.body.error.message).toContain(old.id);
    expect((await install(tech, sawId, { installedAt: minutesAgo(300) })).status).toBe(201);
  });

  it('refuses a retired saw, a spec of another site, future times and absurd values, saying what to fix', async () => {
    const admin = await as('siteadmin-a@test.example');
    const retired = await install(admin, world.retiredA.id);
    expect(retired.status).toBe(409);
    expect(retired.body.error.message).toMatch(/retired/);
    const otherSpec = (await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(world.sites.C.id)))
      .body.id;
    const wrongSpec = await admin.post('/api/blade-runs').send({ sawId: world.saws.A![0]!.id, bladeSpecId: otherSpec });
    expect(wrongSpec.status).toBe(400);
    expect(wrongSpec.body.error.details).toEqual([
      { path: 'bladeSpecId', message: 'choose a blade spec of this site’s catalogue' },
    ]);
    const sawId = world.saws.A![0]!.id;
    const future = await install(admin, sawId, { installedAt: new Date(Date.now() + 3 * 3600_000).toISOString() });
    expect(future.body.error.details).toEqual([
      { path: 'installedAt', message: 'Installed at must not be in the future' },
    ]);
    // Within the allowed clock skew (5 minutes) "now" on a fast phone is still accepted.
    const skew = await install(admin, sawId, { installedAt: new Date(Date.now() + 60_000).toISOString() });
    expect(skew.status).toBe(201);
    await admin
      .post(`/api/blade-runs/${skew.body.run.id}/remove`)
      .send({ reason: 'other', removedAt: new Date(Date.now() + 90_000).toISOString() })
      .expect(200);
    const absurd = await install(admin, sawId, { tensionMpa: -5, materialGroup: 'wood' });
    expect(absurd.status).toBe(400);
    expect(absurd.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'materialGroup',
      'tensionMpa',
    ]);
    expect(await count('blade_runs')).toBe(1);
  });
});

describe('taking a blade off', () => {
  it('records when and why, with the area and cuts summed from its cut logs when none are entered', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const run = (await install(tech, sawId, { installedAt: minutesAgo(500) })).body.run;
    // 80 × 40 flat bar, 3 cuts: 3 × 3 200 = 9 600 mm²; 50 mm square bar, 2 cuts: 2 × 2 500 = 5 000 mm².
    await tech
      .post('/api/cut-logs')
      .send({
        sawId,
        cutAt: minutesAgo(400),
        stock: { shape: { kind: 'flat_bar', widthMm: 80, heightMm: 40 } },
        materialGroup: 'carbon_steel',
        quantity: 3,
      })
      .expect(201);
    await tech
      .post('/api/cut-logs')
      .send({
        sawId,
        cutAt: minutesAgo(300),
        stock: { shape: { kind: 'square_bar', sideMm: 50 } },
        materialGroup: 'carbon_steel',
        quantity: 2,
      })
      .expect(201);
    const removed = await tech
      .post(`/api/blade-runs/${run.id}/remove`)
      .send({ reason: 'tooth_strippage', notes: 'Teeth gone' });
    expect(removed.status).toBe(200);
    expect(removed.body).toMatchObject({
      removalReason: 'tooth_strippage',
      areaCutMm2: 14600,
      cuts: 5,
      areaSource: 'cut_logs',
      removalNotes: 'Teeth gone',
      removedByName: 'tech-a',
    });
    expect((await tech.get(`/api/saws/${sawId}`)).body.bladeOn).toBeNull();

    const entered = (await install(tech, sawId)).body.run;
    const withArea = await tech
      .post(`/api/blade-runs/${entered.id}/remove`)
      .send({ reason: 'worn_out', areaCutMm2: 250000 });
    expect(withArea.body).toMatchObject({ areaCutMm2: 250000, cuts: null, areaSource: 'entered' });
  });

  it('refuses closing twice (409), removal before install (400), and absurd figures, changing nothing', async () => {
    const tech = await as('tech-a@test.example');
    const run = (await install(tech, world.saws.A![0]!.id, { installedAt: minutesAgo(120) })).body.run;
    const early = await tech
      .post(`/api/blade-runs/${run.id}/remove`)
      .send({ reason: 'broken', removedAt: minutesAgo(180) });
    expect(early.status).toBe(400);
    expect(early.body.error.details[0].path).toBe('removedAt');
    expect(early.body.error.details[0].message).toMatch(/must be on or after .* when the blade was put on/);
    const absurd = await tech
      .post(`/api/blade-runs/${run.id}/remove`)
      .send({ reason: 'broken', areaCutMm2: -1, cuts: 2.5 });
    expect(absurd.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['areaCutMm2', 'cuts']);
    const unit = await tech.post(`/api/blade-runs/${run.id}/remove`).send({ reason: 'broken', areaCutMm2: 5e12 });
    expect(unit.body.error.details[0].message).toMatch(/check the units/);
    expect((await tech.post(`/api/blade-runs/${run.id}/remove`).send({ reason: 'broken' })).status).toBe(200);
    const twice = await tech.post(`/api/blade-runs/${run.id}/remove`).send({ reason: 'worn_out' });
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toMatch(/already taken off/);
    expect((await tech.get(`/api/blade-runs/${run.id}`)).body.removalReason).toBe('broken');
  });

  it('closes a run once when two people take the same blade off at the same moment', async () => {
    const [a, b] = await Promise.all([as('tech-a@test.example'), as('siteadmin-a@test.example')]);
    const run = (await install(a, world.saws.A![0]!.id, { installedAt: minutesAgo(60) })).body.run;
    const results = await Promise.all([
      a.post(`/api/blade-runs/${run.id}/remove`).send({ reason: 'worn_out' }),
      b.post(`/api/blade-runs/${run.id}/remove`).send({ reason: 'broken' }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
    expect(await count(`audit_entries WHERE entity = 'BladeRun' AND action = 'update'`)).toBe(1);
  });

  it('ranks the likely causes from the saw’s cut logs and break-in record, and stores the confirmed one', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const run = (await install(tech, sawId, { installedAt: minutesAgo(500), breakInFollowed: false })).body.run;
    // Round tube 60 × 2 mm with 3/4 TPI: the two walls are 4 mm, 3.5 × 4 / 25.4 = 0.55 teeth, far under 3.
    await tech
      .post('/api/cut-logs')
      .send({
        sawId,
        cutAt: minutesAgo(400),
        stock: { shape: { kind: 'round_tube', outsideDiameterMm: 60, wallMm: 2 } },
        materialGroup: 'carbon_steel',
      })
      .expect(201);
    const open = await tech.get(`/api/blade-runs/${run.id}/likely-causes`);
    expect(open.status).toBe(400);
    expect(open.body.error.details[0].path).toBe('reason');
    const asked = await tech.get(`/api/blade-runs/${run.id}/likely-causes?reason=tooth_strippage`);
    expect(asked.status).toBe(200);
    expect(asked.body.causes[0].cause).toBe('teeth_in_work_low');
    expect(asked.body.evidenceUsed).toEqual({ cutLogs: 1, checks: 0, breakInFollowed: false });
    const breakIn = asked.body.causes.find((c: { cause: string }) => c.cause === 'break_in_skipped');
    expect(breakIn.evidence[0].text).toBe('Break-in was not done on this blade.');

    const notYet = await tech.post(`/api/blade-runs/${run.id}/confirmed-cause`).send({ cause: 'teeth_in_work_low' });
    expect(notYet.status).toBe(409);
    await tech.post(`/api/blade-runs/${run.id}/remove`).send({ reason: 'tooth_strippage' }).expect(200);
    const wrong = await tech.post(`/api/blade-runs/${run.id}/confirmed-cause`).send({ cause: 'tracking_off' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details[0].message).toMatch(/^choose one of: Too few teeth in the work/);
    const confirmed = await tech.post(`/api/blade-runs/${run.id}/confirmed-cause`).send({ cause: 'teeth_in_work_low' });
    expect(confirmed.status).toBe(200);
    expect(confirmed.body).toMatchObject({
      confirmedCause: 'teeth_in_work_low',
      confirmedCauseById: world.users.techA.id,
    });
    expect((await tech.get(`/api/blade-runs/${run.id}/likely-causes`)).body.confirmedCause).toBe('teeth_in_work_low');
    const changed = await tech.patch(`/api/blade-runs/${run.id}`).send({ removalReason: 'broken' });
    expect(changed.body).toMatchObject({ removalReason: 'broken', confirmedCause: null, confirmedCauseAt: null });
  });

  it('corrects a run without letting runs overlap or a removal precede its install', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const a = (await install(tech, sawId, { installedAt: minutesAgo(600) })).body.run;
    await tech
      .post(`/api/blade-runs/${a.id}/remove`)
      .send({ reason: 'worn_out', removedAt: minutesAgo(500) })
      .expect(200);
    const b = (await install(tech, sawId, { installedAt: minutesAgo(400) })).body.run;
    expect((await tech.patch(`/api/blade-runs/${b.id}`).send({ cuts: 10 })).status).toBe(409);
    expect((await tech.patch(`/api/blade-runs/${a.id}`).send({ breakInFollowed: true, cuts: 40 })).body).toMatchObject({
      breakInFollowed: true,
      cuts: 40,
    });
    const overlap = await tech.patch(`/api/blade-runs/${a.id}`).send({ removedAt: minutesAgo(350) });
    expect(overlap.status).toBe(409);
    expect(overlap.body.error.message).toContain(b.id);
    const backwards = await tech.patch(`/api/blade-runs/${a.id}`).send({ installedAt: minutesAgo(450) });
    expect(backwards.status).toBe(400);
  });
});

describe('who may see and write blade runs', () => {
  it('scopes lists and ids by site: a technician elsewhere sees nothing and cannot write', async () => {
    const admin = await as('admin@test.example');
    for (const code of ['A', 'B', 'C'] as const) await install(admin, world.saws[code]![0]!.id).expect(201);
    const techC = await as('tech-c@test.example');
    const list = (await techC.get('/api/blade-runs')).body;
    expect(list.items.map((r: { sawAssetTag: string }) => r.sawAssetTag)).toEqual(['C-1']);
    const runA = (await (await as('tech-a@test.example')).get('/api/blade-runs')).body.items[0];
    expect((await techC.get(`/api/blade-runs/${runA.id}`)).status).toBe(404);
    expect((await techC.post(`/api/blade-runs/${runA.id}/remove`).send({ reason: 'worn_out' })).status).toBe(404);
    expect((await techC.get(`/api/blade-runs/${runA.id}/likely-causes?reason=broken`)).status).toBe(404);
    const elsewhere = await install(techC, world.saws.A![1]!.id);
    expect(elsewhere.status).toBe(400);
    const lead = (await (await as('lead-north@test.example')).get('/api/blade-runs')).body;
    expect(lead.items.map((r: { sawAssetTag: string }) => r.sawAssetTag).sort()).toEqual(['A-1', 'B-1']);
    expect((await install(await as('manager-all@test.example'), world.saws.A![1]!.id)).status).toBe(403);
    expect(
      (
        await (
          await as('manager-all@test.example')
        )
          .post(`/api/blade-runs/${runA.id}/remove`)
          .send({ reason: 'worn_out' })
      ).status,
    ).toBe(403);
    expect(
      (await (await as('lead-north@test.example')).patch(`/api/blade-runs/${runA.id}`).send({ cuts: 1 })).status,
    ).toBe(403);
  });

  it('filters, sorts and pages on the server', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    for (let i = 0; i < 4; i++) {
      const run = (await install(tech, sawId, { installedAt: minutesAgo(1000 - i * 200) })).body.run;
      await tech
        .post(`/api/blade-runs/${run.id}/remove`)
        .send({ removedAt: minutesAgo(900 - i * 200), reason: i % 2 ? 'broken' : 'worn_out' })
        .expect(200);
    }
    await install(tech, sawId).expect(201);
    const all = (await tech.get('/api/blade-runs?limit=2&sort=installedAt')).body;
    expect(all.total).toBe(5);
    expect(Date.parse(all.items[0].installedAt)).toBeLessThan(Date.parse(all.items[1].installedAt));
    expect((await tech.get('/api/blade-runs?reason=broken')).body.total).toBe(2);
    expect((await tech.get('/api/blade-runs?open=true')).body.total).toBe(1);
    expect((await tech.get(`/api/blade-runs?sawId=${world.saws.A![1]!.id}`)).body.total).toBe(0);
    expect((await tech.get('/api/blade-runs?sort=length')).status).toBe(400);
  });

  it('removes a run (kept, with a reason) for a site admin only, leaving its cut logs live without it', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const run = (await install(tech, sawId, { installedAt: minutesAgo(100) })).body.run;
    await tech
      .post('/api/cut-logs')
      .send({ sawId, stock: { shape: { kind: 'square_bar', sideMm: 50 } }, materialGroup: 'carbon_steel' })
      .expect(201);
    expect((await tech.delete(`/api/blade-runs/${run.id}`).send({ reason: 'Entered by mistake' })).status).toBe(403);
    expect(
      (
        await (
          await as('siteadmin-a@test.example')
        )
          .delete(`/api/blade-runs/${run.id}`)
          .send({ reason: 'Entered by mistake' })
      ).status,
    ).toBe(204);
    expect(await count('blade_runs')).toBe(0);
    expect(await count('cut_logs WHERE blade_run_id IS NULL')).toBe(1);
    expect(await count(`removed_records WHERE subject = 'BladeRun'`)).toBe(1);
  });
});
