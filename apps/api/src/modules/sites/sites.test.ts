import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';

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
