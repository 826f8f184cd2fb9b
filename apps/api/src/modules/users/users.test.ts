import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
const as = (email: string) => signedInAgent(ctx.app, email, PASSWORD);
const emails = (body: { items: { email: string }[] }) => body.items.map((u) => u.email).sort();

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('listing people', () => {
  it('shows an admin everyone, never a password hash', async () => {
    const res = await (await as('admin@test.example')).get('/api/users');
    expect(res.body.total).toBe(7);
    expect(JSON.stringify(res.body)).not.toMatch(/argon2|passwordHash/);
    const manager = res.body.items.find((u: { email: string }) => u.email === 'manager-ac@test.example');
    expect(manager.managedSiteIds.sort()).toEqual([world.sites.A.id, world.sites.C.id].sort());
  });

  it('shows a site admin the people of their site, and others only themselves', async () => {
    expect(emails((await (await as('siteadmin-a@test.example')).get('/api/users')).body)).toEqual([
      'siteadmin-a@test.example',
      'tech-a@test.example',
    ]);
    expect(emails((await (await as('tech-a@test.example')).get('/api/users')).body)).toEqual(['tech-a@test.example']);
    expect(emails((await (await as('manager-all@test.example')).get('/api/users')).body)).toEqual([
      'manager-all@test.example',
    ]);
  });
});

describe('adding people', () => {
  const technician = (siteId: string) => ({
    email: 'New.Tech@Test.example',
    name: 'New Tech',
    role: 'technician',
    password: 'a-long-password-1',
    siteId,
  });

  it('lets an admin add a technician who can then sign in', async () => {
    const res = await (await as('admin@test.example')).post('/api/users').send(technician(world.sites.B.id));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'new.tech@test.example', role: 'technician', siteId: world.sites.B.id });
    const signIn = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'new.tech@test.example', password: 'a-long-password-1' });
    expect(signIn.status).toBe(200);
    expect(signIn.body.siteIds).toEqual([world.sites.B.id]);
  });

  it('adds a manager and their sites together', async () => {
    const res = await (await as('admin@test.example')).post('/api/users').send({
      email: 'm2@test.example',
      name: 'M2',
      role: 'manager',
      password: 'a-long-password-1',
      managedSiteIds: [world.sites.B.id, world.sites.C.id],
    });
    expect(res.status).toBe(201);
    const signIn = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'm2@test.example', password: 'a-long-password-1' });
    expect(signIn.body.siteIds.sort()).toEqual([world.sites.B.id, world.sites.C.id].sort());
  });

  it('writes nothing when a manager’s site list names a site that does not exist', async () => {
    const res = await (await as('admin@test.example')).post('/api/users').send({
      email: 'm3@test.example',
      name: 'M3',
      role: 'manager',
      password: 'a-long-password-1',
      managedSiteIds: [world.sites.B.id, '00000000-0000-4000-8000-000000000999'],
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('managedSiteIds');
    expect((await (await as('admin@test.example')).get('/api/users')).body.total).toBe(7);
  });

  it('says what each role needs, and refuses a short password and a taken e-mail', async () => {
    const agent = await as('admin@test.example');
    const noSite = await agent
      .post('/api/users')
      .send({ ...technician(world.sites.A.id), siteId: null, password: 'short' });
    expect(noSite.status).toBe(400);
    expect(noSite.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['password', 'siteId']);
    const taken = await agent
      .post('/api/users')
      .send({ ...technician(world.sites.A.id), email: 'tech-a@test.example' });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/e-mail/);
  });

  it('refuses everyone but an admin', async () => {
    for (const email of ['siteadmin-a@test.example', 'manager-all@test.example', 'tech-a@test.example']) {
      expect((await (await as(email)).post('/api/users').send(technician(world.sites.A.id))).status, email).toBe(403);
    }
  });
});
