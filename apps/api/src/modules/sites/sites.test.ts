import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, sawBody, PASSWORD, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
const as = (email: string) => signedInAgent(ctx.app, email, PASSWORD);
const codes = (body: { items: { code: string }[] }) => body.items.map((s) => s.code).sort();

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('sites and regions by role', () => {
  it.each([
    ['admin@test.example', ['A', 'B', 'C'], ['North', 'South']],
    ['manager-ac@test.example', ['A', 'C'], ['North', 'South']],
    ['lead-north@test.example', ['A', 'B'], ['North']],
    ['siteadmin-a@test.example', ['A'], ['North']],
    ['tech-c@test.example', ['C'], ['South']],
  ])('%s', async (email, sites, regions) => {
    const agent = await as(email);
    const res = await agent.get('/api/sites');
    expect(codes(res.body)).toEqual(sites);
    expect(res.body.total).toBe(sites.length);
    expect((await agent.get('/api/regions')).body.items.map((r: { name: string }) => r.name)).toEqual(regions);
  });

  it('counts the active saws of each site, leaving retired ones out', async () => {
    const res = await (await as('admin@test.example')).get('/api/sites');
    const a = res.body.items.find((s: { code: string }) => s.code === 'A');
    expect(a.activeSawCount).toBe(2);
  });

  it('answers 404 for a site outside the scope', async () => {
    const agent = await as('lead-north@test.example');
    expect((await agent.get(`/api/sites/${world.sites.C.id}`)).status).toBe(404);
    expect((await agent.get(`/api/sites/${world.sites.B.id}`)).status).toBe(200);
  });
});

describe('changing sites', () => {
  it('lets an admin add a site and says what is wrong with a bad one', async () => {
    const agent = await as('admin@test.example');
    const ok = await agent.post('/api/sites').send({
      regionId: world.regions.south.id,
      code: 'D-1',
      name: 'Site D',
      timeZone: 'America/Chicago',
      currency: 'usd',
      unitSystem: 'imperial',
    });
    expect(ok.status).toBe(201);
    expect(ok.body).toMatchObject({ code: 'D-1', currency: 'USD', activeSawCount: 0 });
    const bad = await agent.post('/api/sites').send({
      regionId: world.regions.south.id,
      code: 'd 1',
      name: 'x',
      timeZone: 'Mars/Olympus',
      currency: 'dollars',
      unitSystem: 'cubits',
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual([
      'code',
      'currency',
      'timeZone',
      'unitSystem',
    ]);
    const dup = await agent.post('/api/sites').send({
      regionId: world.regions.south.id,
      code: 'A',
      name: 'Again',
      timeZone: 'UTC',
      currency: 'EUR',
      unitSystem: 'metric',
    });
    expect(dup.status).toBe(409);
  });

  it('lets a site admin edit their own site only, and nobody else below admin add one', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    await siteAdmin.patch(`/api/sites/${world.sites.A.id}`).send({ city: 'Bremen' }).expect(200);
    const changed = (await siteAdmin.patch(`/api/sites/${world.sites.A.id}`).send({ unitSystem: 'imperial' })).body;
    expect(changed).toMatchObject({ unitSystem: 'imperial', city: 'Bremen', name: 'Site A' });
    expect((await siteAdmin.patch(`/api/sites/${world.sites.A.id}`).send({ code: 'Z' })).status).toBe(400);
    expect((await siteAdmin.patch(`/api/sites/${world.sites.B.id}`).send({ unitSystem: 'imperial' })).status).toBe(404);
    const manager = await as('manager-all@test.example');
    expect((await manager.patch(`/api/sites/${world.sites.A.id}`).send({ name: 'x' })).status).toBe(403);
    expect(
      (
        await manager.post('/api/sites').send({
          regionId: world.regions.south.id,
          code: 'E',
          name: 'E',
          timeZone: 'UTC',
          currency: 'EUR',
          unitSystem: 'metric',
        })
      ).status,
    ).toBe(403);
  });
});

describe('adding regions', () => {
  it('lets an admin add a region, refuses a duplicate name and everyone below admin', async () => {
    const admin = await as('admin@test.example');
    const ok = await admin.post('/api/regions').send({ name: 'West' });
    expect(ok.status).toBe(201);
    expect(ok.body.name).toBe('West');
    expect((await admin.post('/api/regions').send({ name: 'West' })).status).toBe(409);
    expect((await admin.post('/api/regions').send({ name: '  ' })).status).toBe(400);
    for (const email of [
      'manager-all@test.example',
      'lead-north@test.example',
      'siteadmin-a@test.example',
      'tech-a@test.example',
    ]) {
      expect((await (await as(email)).post('/api/regions').send({ name: `By ${email}` })).status, email).toBe(403);
    }
    // A region is seen only by those whose sites lie in it: the new, empty one by nobody but the admin.
    expect(
      (await (await as('manager-ac@test.example')).get('/api/regions')).body.items.map((r: { name: string }) => r.name),
    ).not.toContain('West');
  });
});

describe('retiring sites and renaming regions', () => {
  it('lets an admin retire a site: it leaves lists but keeps its history, readable by id and on request', async () => {
    const admin = await as('admin@test.example');
    const retired = await admin.post(`/api/sites/${world.sites.B.id}/retire`);
    expect(retired.status).toBe(200);
    expect(retired.body.retiredAt).toMatch(/^\d{4}-/);
    expect(codes((await admin.get('/api/sites')).body)).toEqual(['A', 'C']);
    expect(codes((await admin.get('/api/sites?includeRetired=true')).body)).toEqual(['A', 'B', 'C']);
    expect((await admin.get(`/api/sites/${world.sites.B.id}`)).body.activeSawCount).toBe(2);
    // The lead of its region still reads it and its saws (history), but it is out of the everyday list.
    const lead = await as('lead-north@test.example');
    expect(codes((await lead.get('/api/sites')).body)).toEqual(['A']);
    expect((await lead.get(`/api/saws?siteId=${world.sites.B.id}`)).body.total).toBe(2);
    expect((await admin.patch(`/api/sites/${world.sites.B.id}`).send({ name: 'x' })).status).toBe(409);
    expect((await admin.post(`/api/sites/${world.sites.B.id}/retire`)).status).toBe(409);
    // A retired site takes no saws, new or moved there; the answer says how to bring it back.
    const added = await admin.post('/api/saws').send(sawBody(world.sites.B.id, { assetTag: 'B-NEW' }));
    expect(added.status).toBe(409);
    expect(added.body.error.message).toMatch(/retired, so it takes no saws; an administrator can bring the site back/);
    const movedThere = await admin.patch(`/api/saws/${world.saws.A![0]!.id}`).send({ siteId: world.sites.B.id });
    expect(movedThere.status).toBe(409);
    await admin.post(`/api/sites/${world.sites.B.id}/restore`).expect(200);
    expect((await admin.post('/api/saws').send(sawBody(world.sites.B.id, { assetTag: 'B-NEW' }))).status).toBe(201);
    expect(codes((await admin.get('/api/sites')).body)).toEqual(['A', 'B', 'C']);
    const history = (await admin.get(`/api/audit?entity=Site&entityId=${world.sites.B.id}`)).body.items;
    expect(history.map((e: { action: string }) => e.action)).toEqual(['restore', 'retire']);
  });

  it('keeps retiring and moving a site to another region with administrators', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const retire = await siteAdmin.post(`/api/sites/${world.sites.A.id}/retire`);
    expect(retire.status).toBe(403);
    const move = await siteAdmin.patch(`/api/sites/${world.sites.A.id}`).send({ regionId: world.regions.south.id });
    expect(move.status).toBe(403);
    expect(move.body.error.message).toMatch(/administrator can move a site/);
    expect((await (await as('manager-all@test.example')).post(`/api/sites/${world.sites.A.id}/retire`)).status).toBe(
      403,
    );
    const admin = await as('admin@test.example');
    const moved = await admin.patch(`/api/sites/${world.sites.A.id}`).send({ regionId: world.regions.south.id });
    expect(moved.status).toBe(200);
    expect(moved.body.regionId).toBe(world.regions.south.id);
    const audit = (await admin.get(`/api/audit?entity=Site&entityId=${world.sites.A.id}`)).body.items[0];
    expect(audit.before).toEqual({ regionId: world.regions.north.id });
  });

  it('lets an admin rename a region, and nobody else', async () => {
    const admin = await as('admin@test.example');
    const renamed = await admin.patch(`/api/regions/${world.regions.north.id}`).send({ name: 'North & Lakes' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.name).toBe('North & Lakes');
    expect((await admin.patch(`/api/regions/${world.regions.north.id}`).send({ name: 'South' })).status).toBe(409);
    const lead = await as('lead-north@test.example');
    expect((await lead.patch(`/api/regions/${world.regions.north.id}`).send({ name: 'Mine' })).status).toBe(403);
    expect((await lead.patch(`/api/regions/${world.regions.south.id}`).send({ name: 'Mine' })).status).toBe(404);
  });
});
