import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { startTestApp, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';
import { SESSION_COOKIE } from '../../app.js';
import { User } from '../users/user.model.js';

let ctx: TestContext;
let world: World;

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('sign-in', () => {
  it('signs in with the right password and answers who the user is and what they may do', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'Tech-A@Test.example ', password: PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ email: 'tech-a@test.example', role: 'technician', siteId: world.sites.A.id });
    expect(res.body.user.passwordHash).toBeUndefined();
    expect(res.body.siteIds).toEqual([world.sites.A.id]);
    expect(res.body.rules.length).toBeGreaterThan(0);
    const cookie = res.headers['set-cookie']?.[0] ?? '';
    expect(cookie).toContain(`${SESSION_COOKIE}=`);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('gives a wrong password and an unknown user the same answer', async () => {
    const wrong = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: 'not-the-password' });
    const unknown = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'nobody@test.example', password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.code).toBe('UNAUTHENTICATED');
    expect(unknown.body.error.message).toBe(wrong.body.error.message);
    expect(wrong.headers['set-cookie']).toBeUndefined();
  });

  it('refuses a deactivated account with the same answer and ends its open sessions', async () => {
    const agent = supertest.agent(ctx.app);
    await agent.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    await User.update({ active: false }, { where: { id: world.users.techA.id } });
    expect((await agent.get('/api/me')).status).toBe(401);
    const again = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: PASSWORD });
    expect(again.status).toBe(401);
  });

  it('says which fields are missing', async () => {
    const res = await supertest(ctx.app).post('/api/auth/sign-in').send({ email: '' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['email', 'password']);
  });

  it('answers malformed JSON with 400, not 500', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/must be a JSON object/);
  });

  it('issues a new session id at sign-in, so a planted session cookie is worthless', async () => {
    const agent = supertest.agent(ctx.app);
    await agent.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    const first = (await ctx.sequelize.query('SELECT sid FROM sessions', { plain: false }))[0] as { sid: string }[];
    await agent.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);
    const second = (await ctx.sequelize.query('SELECT sid FROM sessions', { plain: false }))[0] as { sid: string }[];
    expect(second.map((r) => r.sid)).not.toContain(first[0]!.sid);
  });
});

describe('a session', () => {
  it('is needed for everything but health and sign-in', async () => {
    for (const path of ['/api/me', '/api/sites', '/api/saws', '/api/regions', '/api/users']) {
      const res = await supertest(ctx.app).get(path);
      expect(res.status, path).toBe(401);
      expect(res.body.error.code).toBe('UNAUTHENTICATED');
    }
  });

  it('ends at sign-out', async () => {
    const agent = supertest.agent(ctx.app);
    await agent.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);
    await agent.get('/api/me').expect(200);
    await agent.post('/api/auth/sign-out').expect(204);
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('survives an app restart, because it lives in PostgreSQL', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'admin@test.example', password: PASSWORD })
      .expect(200);
    const cookie = res.headers['set-cookie']![0]!.split(';')[0]!;
    const restarted = startTestApp();
    try {
      const me = await supertest(restarted.app).get('/api/me').set('Cookie', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe('admin@test.example');
    } finally {
      await restarted.close();
    }
  });
});

describe('health', () => {
  it('answers 200 with the database reachable', async () => {
    const res = await supertest(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('ok');
  });

  it('answers 503 when the database is not reachable', async () => {
    const down = startTestApp();
    await down.close();
    const res = await supertest(down.app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('UNAVAILABLE');
  });
});

describe('security headers', () => {
  it('sets a content security policy, and leaves https upgrades to deployments behind TLS', async () => {
    const res = await supertest(ctx.app).get('/api/health');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['content-security-policy']).not.toMatch(/upgrade-insecure-requests/);
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});

describe('changing one’s own password', () => {
  it('needs the current password, then signs in with the new one and ends the other sessions', async () => {
    const here = supertest.agent(ctx.app);
    const elsewhere = supertest.agent(ctx.app);
    await here.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    await elsewhere.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    const otherUser = supertest.agent(ctx.app);
    await otherUser.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);

    const wrong = await here
      .post('/api/me/password')
      .send({ currentPassword: 'not-it', newPassword: 'a-brand-new-password' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details).toEqual([{ path: 'currentPassword', message: 'not right' }]);

    const same = await here.post('/api/me/password').send({ currentPassword: PASSWORD, newPassword: PASSWORD });
    expect(same.status).toBe(400);
    expect(same.body.error.details[0].path).toBe('newPassword');

    await here
      .post('/api/me/password')
      .send({ currentPassword: PASSWORD, newPassword: 'a-brand-new-password' })
      .expect(204);
    await here.get('/api/me').expect(200);
    expect((await elsewhere.get('/api/me')).status).toBe(401);
    await otherUser.get('/api/me').expect(200);
    const old = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: PASSWORD });
    expect(old.status).toBe(401);
    await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: 'a-brand-new-password' })
      .expect(200);
  });

  it('is only for someone signed in', async () => {
    const res = await supertest(ctx.app)
      .post('/api/me/password')
      .send({ currentPassword: 'x', newPassword: 'a-brand-new-password' });
    expect(res.status).toBe(401);
  });
});
