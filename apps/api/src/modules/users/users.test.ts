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

describe('changing people', () => {
  it('lets a site admin rename and re-role a technician of their site, within their own limits', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const techA = world.users.techA.id;
    const renamed = await siteAdmin.patch(`/api/users/${techA}`).send({ name: 'Tomas Reyes' });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ name: 'Tomas Reyes', role: 'technician', siteId: world.sites.A.id });
    const promoted = await siteAdmin
      .patch(`/api/users/${techA}`)
      .send({ role: 'site_admin', siteId: world.sites.A.id });
    expect(promoted.status).toBe(200);
    expect(promoted.body.role).toBe('site_admin');

    expect((await siteAdmin.patch(`/api/users/${techA}`).send({ role: 'admin' })).status).toBe(403);
    expect((await siteAdmin.patch(`/api/users/${techA}`).send({ siteId: world.sites.B.id })).status).toBe(403);
    expect(
      (await siteAdmin.patch(`/api/users/${techA}`).send({ role: 'regional_lead', regionId: world.regions.north.id }))
        .status,
    ).toBe(403);
    // Someone at another site is not there at all for them.
    expect((await siteAdmin.patch(`/api/users/${world.users.techC.id}`).send({ name: 'x' })).status).toBe(404);
    expect((await siteAdmin.get(`/api/users/${world.users.techC.id}`)).status).toBe(404);
    expect((await siteAdmin.post(`/api/users/${world.users.techC.id}/deactivate`)).status).toBe(404);
    // Nor can they change their own role.
    const self = await siteAdmin
      .patch(`/api/users/${world.users.siteAdminA.id}`)
      .send({ role: 'technician', siteId: world.sites.A.id });
    expect(self.status).toBe(403);
    expect(self.body.error.message).toMatch(/own role/);

    const audit = (await (await as('admin@test.example')).get(`/api/audit?entity=User&entityId=${techA}`)).body.items;
    expect(audit.map((e: { action: string }) => e.action)).toEqual(['update', 'update']);
    expect(audit[1].after).toEqual({ name: 'Tomas Reyes' });
    expect(JSON.stringify(audit)).not.toMatch(/passwordHash|argon2/);
  });

  it('says what a role needs, and lets an admin move a manager to other sites', async () => {
    const admin = await as('admin@test.example');
    const noSite = await admin.patch(`/api/users/${world.users.techA.id}`).send({ role: 'regional_lead' });
    expect(noSite.status).toBe(400);
    expect(noSite.body.error.details).toEqual([{ path: 'regionId', message: 'a regional lead needs a region' }]);
    const moved = await admin
      .patch(`/api/users/${world.users.managerAC.id}`)
      .send({ managedSiteIds: [world.sites.B.id] });
    expect(moved.status).toBe(200);
    expect(moved.body.managedSiteIds).toEqual([world.sites.B.id]);
    const signIn = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'manager-ac@test.example', password: PASSWORD });
    expect(signIn.body.siteIds).toEqual([world.sites.B.id]);
  });

  it('deactivates a person: sign-in refused, sessions ended, their records keep their name; and back again', async () => {
    const techSession = await as('tech-a@test.example');
    await techSession.get('/api/me').expect(200);
    // Something the technician did stays in the audit trail under their name.
    await ctx.sequelize.query(
      `INSERT INTO audit_entries (actor_id, site_id, entity, entity_id, action, after)
       VALUES (:actor, :site, 'Saw', 'x', 'create', '{}')`,
      { replacements: { actor: world.users.techA.id, site: world.sites.A.id } },
    );
    const siteAdmin = await as('siteadmin-a@test.example');
    const off = await siteAdmin.post(`/api/users/${world.users.techA.id}/deactivate`);
    expect(off.status).toBe(200);
    expect(off.body.active).toBe(false);
    expect((await techSession.get('/api/me')).status).toBe(401);
    const sessions = await ctx.sequelize.query(
      `SELECT sid FROM sessions WHERE (sess -> 'passport' ->> 'user') = '${world.users.techA.id}'`,
    );
    expect(sessions[0]).toEqual([]);
    const refused = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: PASSWORD });
    expect(refused.status).toBe(401);
    const history = (await siteAdmin.get('/api/audit?entity=Saw')).body.items;
    expect(history.map((e: { actorName: string }) => e.actorName)).toContain('tech-a');
    expect((await siteAdmin.get('/api/users?state=inactive')).body.items.map((u: { name: string }) => u.name)).toEqual([
      'tech-a',
    ]);
    expect((await siteAdmin.post(`/api/users/${world.users.techA.id}/deactivate`)).status).toBe(409);

    await siteAdmin.post(`/api/users/${world.users.techA.id}/reactivate`).expect(200);
    await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: PASSWORD })
      .expect(200);
  });

  it('never lets anyone deactivate themselves or change their own role; another administrator can', async () => {
    const admin = await as('admin@test.example');
    const self = await admin.post(`/api/users/${world.users.admin.id}/deactivate`);
    expect(self.status).toBe(403);
    expect(self.body.error.message).toBe('You cannot deactivate yourself');
    expect(
      (await admin.patch(`/api/users/${world.users.admin.id}`).send({ role: 'manager', allSites: true })).status,
    ).toBe(403);
    await admin
      .post('/api/users')
      .send({ email: 'admin2@test.example', name: 'Second admin', role: 'admin', password: PASSWORD })
      .expect(201);
    const other = await as('admin2@test.example');
    await other.post(`/api/users/${world.users.admin.id}/deactivate`).expect(200);
    expect((await admin.get('/api/me')).status).toBe(401);
  });
});
