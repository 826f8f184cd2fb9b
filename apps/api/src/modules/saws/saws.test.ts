import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, sawBody, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const tags = (body: { items: { assetTag: string }[] }) => body.items.map((s) => s.assetTag).sort();

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('each role sees only the saws in its scope', () => {
  it.each([
    ['admin@test.example', ['A-1', 'A-2', 'B-1', 'B-2', 'C-1', 'C-2']],
    ['manager-all@test.example', ['A-1', 'A-2', 'B-1', 'B-2', 'C-1', 'C-2']],
    ['manager-ac@test.example', ['A-1', 'A-2', 'C-1', 'C-2']],
    ['lead-north@test.example', ['A-1', 'A-2', 'B-1', 'B-2']],
    ['siteadmin-a@test.example', ['A-1', 'A-2']],
    ['tech-a@test.example', ['A-1', 'A-2']],
    ['tech-c@test.example', ['C-1', 'C-2']],
  ])('%s', async (email, expected) => {
    const res = await (await as(email)).get('/api/saws');
    expect(res.status).toBe(200);
    expect(tags(res.body)).toEqual(expected);
    expect(res.body.total).toBe(expected.length);
  });

  it('keeps the scope when a filter names a site outside it', async () => {
    const res = await (await as('tech-a@test.example')).get(`/api/saws?siteId=${world.sites.B.id}`);
    expect(res.status).toBe(200);
    expect(res.body.items).toEqual([]);
    expect(res.body.total).toBe(0);
  });

  it('shows retired saws only when asked, and filters by text', async () => {
    const agent = await as('siteadmin-a@test.example');
    expect(tags((await agent.get('/api/saws?includeRetired=true')).body)).toEqual(['A-1', 'A-2', 'A-OLD']);
    expect(tags((await agent.get('/api/saws?status=retired')).body)).toEqual(['A-OLD']);
    expect(tags((await agent.get('/api/saws?q=a-2')).body)).toEqual(['A-2']);
    expect(tags((await agent.get('/api/saws?q=%25')).body)).toEqual([]);
  });

  it('answers 404 for a saw outside the scope, the same as for one that does not exist', async () => {
    const agent = await as('tech-a@test.example');
    const other = await agent.get(`/api/saws/${world.saws.B![0]!.id}`);
    const missing = await agent.get('/api/saws/00000000-0000-4000-8000-000000000999');
    expect(other.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(other.body.error).toMatchObject({ code: 'NOT_FOUND', message: missing.body.error.message });
    expect((await agent.get(`/api/saws/${world.saws.A![0]!.id}`)).status).toBe(200);
  });

  it('answers 400 for an id that is not an id', async () => {
    const res = await (await as('tech-a@test.example')).get('/api/saws/42');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('id');
  });
});

describe('creating a saw', () => {
  it('lets a site admin add one at their site', async () => {
    const res = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/saws')
      .send(sawBody(world.sites.A.id, { assetTag: 'A-NEW' }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      assetTag: 'A-NEW',
      siteId: world.sites.A.id,
      status: 'in_service',
      // Not said: counted as hydraulic, as most production saws are.
      headFeed: 'hydraulic',
      make: null,
      retiredAt: null,
    });
  });

  it('records how the head is fed, and refuses a feed it does not know', async () => {
    const agent = await as('siteadmin-a@test.example');
    const spring = await agent
      .post('/api/saws')
      .send(sawBody(world.sites.A.id, { assetTag: 'A-GRAV', headFeed: 'gravity_spring' }));
    expect(spring.status).toBe(201);
    expect(spring.body.headFeed).toBe('gravity_spring');
    const changed = await agent.patch(`/api/saws/${spring.body.id}`).send({ headFeed: 'hydraulic' });
    expect(changed.body.headFeed).toBe('hydraulic');
    const bad = await agent.post('/api/saws').send(sawBody(world.sites.A.id, { headFeed: 'pneumatic' }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([{ path: 'headFeed', message: 'choose gravity or spring, or hydraulic' }]);
  });

  it('refuses a technician, at their own site (403) and elsewhere (site unknown to them), writing nothing', async () => {
    const agent = await as('tech-a@test.example');
    const own = await agent.post('/api/saws').send(sawBody(world.sites.A.id));
    expect(own.status).toBe(403);
    expect(own.body.error.code).toBe('FORBIDDEN');
    const elsewhere = await agent.post('/api/saws').send(sawBody(world.sites.B.id));
    expect(elsewhere.status).toBe(400);
    expect(elsewhere.body.error.details).toEqual([{ path: 'siteId', message: 'choose one of your sites' }]);
    const nowhere = await agent.post('/api/saws').send(sawBody('00000000-0000-4000-8000-000000000999'));
    expect(nowhere.body).toMatchObject({
      error: { code: elsewhere.body.error.code, message: elsewhere.body.error.message },
    });
    expect((await ctx.sequelize.query('SELECT count(*)::int AS n FROM saws', { plain: true }))!.n).toBe(7);
  });

  it('refuses a site admin at another site and a manager anywhere', async () => {
    expect(
      (await (await as('siteadmin-a@test.example')).post('/api/saws').send(sawBody(world.sites.B.id))).status,
    ).toBe(400);
    expect(
      (await (await as('manager-all@test.example')).post('/api/saws').send(sawBody(world.sites.A.id))).status,
    ).toBe(403);
  });

  it('says which fields need fixing', async () => {
    const res = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/saws')
      .send(sawBody(world.sites.A.id, { bandWidthMm: -1, kind: 'diagonal', bandSpeedMinMPerMin: 120, name: '' }));
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    expect(paths).toEqual(expect.arrayContaining(['bandWidthMm', 'kind', 'name']));
    const speed = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/saws')
      .send(sawBody(world.sites.A.id, { bandSpeedMinMPerMin: 120 }));
    expect(speed.body.error.details).toEqual([
      { path: 'bandSpeedMaxMPerMin', message: 'Highest band speed must not be below the lowest' },
    ]);
  });

  it('answers 409 for an asset tag already used at the site', async () => {
    const res = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/saws')
      .send(sawBody(world.sites.A.id, { assetTag: 'A-1' }));
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/asset tag/);
  });
});

describe('changing and retiring a saw', () => {
  it('lets a site admin edit their saw, checking the merged record', async () => {
    const agent = await as('siteadmin-a@test.example');
    const id = world.saws.A![0]!.id;
    const ok = await agent.patch(`/api/saws/${id}`).send({ name: 'Bay 1', bandSpeedMaxMPerMin: 95 });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ name: 'Bay 1', bandSpeedMaxMPerMin: 95 });
    const bad = await agent.patch(`/api/saws/${id}`).send({ bandSpeedMaxMPerMin: 10 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0].path).toBe('bandSpeedMaxMPerMin');
    const unknown = await agent.patch(`/api/saws/${id}`).send({ colour: 'red' });
    expect(unknown.status).toBe(400);
  });

  it('changes only the fields an update names', async () => {
    const agent = await as('siteadmin-a@test.example');
    const id = world.saws.A![0]!.id;
    await agent.patch(`/api/saws/${id}`).send({ make: 'Othermake', capacityRoundMm: 300 }).expect(200);
    const before = (await agent.get(`/api/saws/${id}`)).body;
    const after = (await agent.patch(`/api/saws/${id}`).send({ name: 'Renamed' })).body;
    expect(after).toEqual({ ...before, name: 'Renamed', updatedAt: after.updatedAt });
    expect(after).toMatchObject({ status: 'in_service', make: 'Othermake', model: 'Testmodel', capacityRoundMm: 300 });
  });

  it('does not let a site admin move a saw to a site they do not manage', async () => {
    const agent = await as('siteadmin-a@test.example');
    const res = await agent.patch(`/api/saws/${world.saws.A![0]!.id}`).send({ siteId: world.sites.B.id });
    expect(res.status).toBe(400);
    const admin = await as('admin@test.example');
    expect((await admin.patch(`/api/saws/${world.saws.A![0]!.id}`).send({ siteId: world.sites.B.id })).status).toBe(
      200,
    );
  });

  it('refuses writes by read-only roles and hides other sites’ saws', async () => {
    const id = world.saws.A![0]!.id;
    expect((await (await as('manager-all@test.example')).patch(`/api/saws/${id}`).send({ name: 'x' })).status).toBe(
      403,
    );
    expect((await (await as('lead-north@test.example')).post(`/api/saws/${id}/retire`)).status).toBe(403);
    expect((await (await as('tech-c@test.example')).patch(`/api/saws/${id}`).send({ name: 'x' })).status).toBe(404);
    expect((await (await as('tech-c@test.example')).post(`/api/saws/${id}/retire`)).status).toBe(404);
    const after = await (await as('admin@test.example')).get(`/api/saws/${id}`);
    expect(after.body.name).toBe('Test bar saw');
  });

  it('retires a saw once, then keeps it unchanged', async () => {
    const agent = await as('siteadmin-a@test.example');
    const id = world.saws.A![1]!.id;
    const retired = await agent.post(`/api/saws/${id}/retire`);
    expect(retired.status).toBe(200);
    expect(retired.body.status).toBe('retired');
    expect(Date.parse(retired.body.retiredAt)).not.toBeNaN();
    expect((await agent.post(`/api/saws/${id}/retire`)).status).toBe(409);
    expect((await agent.patch(`/api/saws/${id}`).send({ name: 'again' })).status).toBe(409);
    expect(tags((await agent.get('/api/saws')).body)).toEqual(['A-1']);
  });

  it('keeps a saw with an open stop or a blade on from being retired, and a saw with records at its site', async () => {
    const admin = await as('admin@test.example');
    const id = world.saws.A![0]!.id;
    const stop = (await admin.post('/api/stops').send({ sawId: id, category: 'mechanical' })).body;
    const down = await admin.post(`/api/saws/${id}/retire`);
    expect(down.status).toBe(409);
    expect(down.body.error.message).toBe('This saw has an open stop; end the stop before retiring the saw');
    await admin.post(`/api/stops/${stop.id}/end`).send({}).expect(200);
    const spec = (await admin.post('/api/blade-specs').send(specBody(null))).body.id;
    await admin.post('/api/blade-runs').send({ sawId: id, bladeSpecId: spec }).expect(201);
    expect((await admin.post(`/api/saws/${id}/retire`)).body.error.message).toMatch(/take the blade off/);
    const move = await admin.patch(`/api/saws/${id}`).send({ siteId: world.sites.B.id });
    expect(move.status).toBe(409);
    expect(move.body.error.message).toMatch(/stay with that site; retire it here and add it at the new site/);
    expect((await admin.get(`/api/saws/${id}`)).body.siteId).toBe(world.sites.A.id);
  });
});

describe('bringing a retired saw back', () => {
  it('puts a saw retired by mistake back in service, audited, for its site admin or an administrator only', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const saw = world.saws.A![0]!;
    await siteAdmin.post(`/api/saws/${saw.id}/retire`).expect(200);
    for (const email of ['tech-a@test.example', 'manager-all@test.example'])
      expect((await (await as(email)).post(`/api/saws/${saw.id}/restore`)).status, email).toBe(403);
    expect((await (await as('tech-c@test.example')).post(`/api/saws/${saw.id}/restore`)).status).toBe(404);

    const back = await siteAdmin.post(`/api/saws/${saw.id}/restore`);
    expect(back.status).toBe(200);
    expect(back.body).toMatchObject({ status: 'in_service', retiredAt: null });
    expect(tags((await siteAdmin.get('/api/saws')).body)).toContain(saw.assetTag);
    const audit = await (await as('admin@test.example')).get(`/api/audit?entity=Saw&entityId=${saw.id}`);
    expect(audit.body.items.map((e: { action: string }) => e.action)).toEqual(['restore', 'retire']);
    expect((await siteAdmin.post(`/api/saws/${saw.id}/restore`)).status).toBe(409);
    // The long-retired one from the fixtures comes back for an administrator too.
    expect((await (await as('admin@test.example')).post(`/api/saws/${world.retiredA.id}/restore`)).status).toBe(200);
  });

  it('waits for its site to be brought back first', async () => {
    const admin = await as('admin@test.example');
    const saw = world.saws.B![0]!;
    await admin.post(`/api/saws/${saw.id}/retire`).expect(200);
    await admin.post(`/api/sites/${world.sites.B.id}/retire`).expect(200);
    const refused = await admin.post(`/api/saws/${saw.id}/restore`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/site is retired/);
    await admin.post(`/api/sites/${world.sites.B.id}/restore`).expect(200);
    await admin.post(`/api/saws/${saw.id}/restore`).expect(200);
  });
});
