import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, PASSWORD } from '../test-support/fixtures.js';
import { touchIntervalMs } from './session-store.js';

// An absolute lifetime of 2 s against an idle timeout of an hour: only the absolute one can end the session.
const MAX_MS = 2000;
let ctx: TestContext;

beforeAll(() => {
  ctx = startTestApp({ sessionIdleMs: 60 * 60 * 1000, sessionMaxMs: MAX_MS });
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  await buildWorld(ctx.sequelize);
});

describe('a session', () => {
  it('ends at its absolute lifetime however active it is, in every process and in the store', async () => {
    // The second process is made before the sign-in: on a loaded machine making it takes a good part of the 2 s.
    const other = startTestApp({ sessionIdleMs: 60 * 60 * 1000, sessionMaxMs: MAX_MS });
    try {
      const res = await supertest(ctx.app)
        .post('/api/auth/sign-in')
        .send({ email: 'admin@test.example', password: PASSWORD })
        .expect(200);
      // The server took its sign-in time somewhere between the two clocks read here; on a loaded machine that is
      // more than a second apart, so the store's expiry is bounded by the later one (plus PostgreSQL's whole second).
      const answered = Date.now();
      const cookie = res.headers['set-cookie']![0]!.split(';')[0]!;
      // Active all along: each request would push an idle timeout further out.
      await supertest(ctx.app).get('/api/me').set('Cookie', cookie).expect(200);
      await supertest(other.app).get('/api/me').set('Cookie', cookie).expect(200);
      // The store's own expiry is capped at the absolute end, so no process is handed the session after it.
      const [row] = await ctx.sequelize.query<{ expire: Date }>('SELECT expire FROM sessions', {
        type: QueryTypes.SELECT,
      });
      expect(new Date(row!.expire).getTime()).toBeLessThanOrEqual(answered + MAX_MS + 1000);

      await new Promise((resolve) => setTimeout(resolve, MAX_MS + 200));
      const ended = await supertest(other.app).get('/api/me').set('Cookie', cookie);
      expect(ended.status).toBe(401);
      expect((await supertest(ctx.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
    } finally {
      await other.close();
    }
  });

  it('starts a new lifetime at the next sign-in', async () => {
    const agent = supertest.agent(ctx.app);
    await agent.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);
    await new Promise((resolve) => setTimeout(resolve, MAX_MS + 200));
    expect((await agent.get('/api/me')).status).toBe(401);
    await agent.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);
    await agent.get('/api/me').expect(200);
  });
});

describe('the idle timeout', () => {
  const expiryOf = async (context: TestContext) => {
    const rows = await context.sequelize.query<{ expire: Date; sess: { cookie: Record<string, unknown> } }>(
      'SELECT expire, sess FROM sessions',
      { type: QueryTypes.SELECT },
    );
    expect(rows).toHaveLength(1);
    return rows[0]!;
  };

  it('is written at most once an interval, a hundredth of the timeout and never more than a minute', async () => {
    expect(touchIntervalMs(60 * 60 * 1000)).toBe(36_000);
    expect(touchIntervalMs(12 * 60 * 60 * 1000)).toBe(60_000);
    // Its own process with the usual absolute lifetime: the shared one ends sessions after 2 s, which a loaded
    // machine can reach between the sign-in and the last request here.
    const hourly = startTestApp({ sessionIdleMs: 60 * 60 * 1000 });
    try {
      const agent = supertest.agent(hourly.app);
      await agent.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);
      await agent.get('/api/me').expect(200);
      const before = await expiryOf(hourly);
      // A second and more later (PostgreSQL keeps whole seconds), still well within the interval (36 s): the
      // stored expiry stays as it is, so these requests neither write nor wait for a write.
      await new Promise((resolve) => setTimeout(resolve, 1100));
      for (let i = 0; i < 3; i += 1) await agent.get('/api/me').expect(200);
      const after = await expiryOf(hourly);
      expect(after.expire.getTime()).toBe(before.expire.getTime());
      // What the store read for the request is never written back into the session.
      expect(Object.keys(after.sess.cookie)).not.toContain('expiresInStore');
    } finally {
      await hourly.close();
    }
  });

  it('keeps an active session and ends an idle one, in every process', async () => {
    // Requests 1 s apart for 5 s against a timeout of 4 s: a loaded machine may take up to 3 s over a request
    // before the session would end between two of them.
    const IDLE_MS = 4000;
    const idle = startTestApp({ sessionIdleMs: IDLE_MS });
    const other = startTestApp({ sessionIdleMs: IDLE_MS });
    try {
      const res = await supertest(idle.app)
        .post('/api/auth/sign-in')
        .send({ email: 'admin@test.example', password: PASSWORD })
        .expect(200);
      const cookie = res.headers['set-cookie']![0]!.split(';')[0]!;
      // Active for longer than the timeout, on either process: each request moves the stored expiry on.
      for (let i = 0; i < 5; i += 1) {
        await new Promise((resolve) => setTimeout(resolve, 1000));
        await supertest(i % 2 ? other.app : idle.app)
          .get('/api/me')
          .set('Cookie', cookie)
          .expect(200);
      }
      const touched = Date.now();
      const { expire } = await expiryOf(idle);
      // PostgreSQL keeps whole seconds, rounded up.
      expect(expire.getTime()).toBeGreaterThanOrEqual(touched - 1000 + IDLE_MS - touchIntervalMs(IDLE_MS));
      // Unused for longer than the timeout: over on both.
      await new Promise((resolve) => setTimeout(resolve, IDLE_MS + 1200));
      expect((await supertest(other.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
      expect((await supertest(idle.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
    } finally {
      await Promise.all([idle.close(), other.close()]);
    }
  });
});
