import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, TEST_PUBLIC_URL, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD } from '../../test-support/fixtures.js';
import { clearJobs, linkTokenIn, startTestMail, type TestMail } from '../../test-support/mail.js';
import { RESET_REQUEST_MIN_MS } from './auth.router.js';

let mail: TestMail;
let ctx: TestContext;
const NEW_PASSWORD = 'a-brand-new-password-2026';

beforeAll(async () => {
  mail = await startTestMail();
  ctx = startTestApp({ mail: { smtpPort: mail.port, workers: true } });
  await ctx.ready;
});
afterAll(async () => {
  await ctx.close();
  await mail.close();
});
beforeEach(async () => {
  await buildWorld(ctx.sequelize);
  await clearJobs(ctx.sequelize);
  await mail.clear();
});

async function request(email: string) {
  const started = performance.now();
  const res = await supertest(ctx.app).post('/api/auth/password-reset/request').send({ email });
  return { res, ms: performance.now() - started };
}

async function resetLinkFor(email: string) {
  expect((await request(email)).res.status).toBe(202);
  return linkTokenIn(await mail.waitFor(email), 'reset-password');
}

describe('asking for a password reset', () => {
  it('answers an unknown or deactivated address exactly as a known one, after the same minimum wait, and mails only the known one', async () => {
    await ctx.sequelize.query("UPDATE users SET active = false WHERE email = 'tech-c@test.example'");
    const known = await request('Tech-A@test.example');
    const unknown = await request('nobody-here@test.example');
    const inactive = await request('tech-c@test.example');
    expect(known.res.status).toBe(202);
    expect(unknown.res.status).toBe(202);
    expect(unknown.res.body).toEqual(known.res.body);
    expect(known.res.body.message).toMatch(/If an account uses that address/);
    // A lower bound the router enforces (not a performance target): neither answer can come back sooner.
    expect(known.ms).toBeGreaterThanOrEqual(RESET_REQUEST_MIN_MS - 5);
    expect(unknown.ms).toBeGreaterThanOrEqual(RESET_REQUEST_MIN_MS - 5);
    expect(inactive.res.body).toEqual(known.res.body);

    const caught = await mail.waitFor('tech-a@test.example');
    expect(caught.subject).toBe('Choose a new Kerfline password');
    expect(caught.text).toContain(`${TEST_PUBLIC_URL}/reset-password#token=`);
    const logged = await ctx.sequelize.query<{ to_address: string }>('SELECT to_address FROM mail_log', {
      type: QueryTypes.SELECT,
    });
    // A deactivated account gets no link either.
    expect(logged.map((r) => r.to_address)).toEqual(['tech-a@test.example']);
    expect(await mail.to('nobody-here@test.example')).toEqual([]);
  });
});

describe('choosing a new password from the link', () => {
  it('sets the password and ends every session that person had', async () => {
    const phone = supertest.agent(ctx.app);
    const office = supertest.agent(ctx.app);
    const someoneElse = supertest.agent(ctx.app);
    await phone.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    await office.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    await someoneElse.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);

    const token = await resetLinkFor('tech-a@test.example');
    await supertest(ctx.app).post('/api/auth/password-reset').send({ token, newPassword: NEW_PASSWORD }).expect(204);

    expect((await phone.get('/api/me')).status).toBe(401);
    expect((await office.get('/api/me')).status).toBe(401);
    await someoneElse.get('/api/me').expect(200);
    const old = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: PASSWORD });
    expect(old.status).toBe(401);
    await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: NEW_PASSWORD })
      .expect(200);

    const again = await supertest(ctx.app)
      .post('/api/auth/password-reset')
      .send({ token, newPassword: 'yet-another-password' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already used.*Ask for a new link on the sign-in page/);
  });

  it('refuses an expired link, a replaced link and a short password, each saying what to do', async () => {
    const first = await resetLinkFor('tech-a@test.example');
    await mail.clear();
    const second = await resetLinkFor('tech-a@test.example');
    const replaced = await supertest(ctx.app)
      .post('/api/auth/password-reset')
      .send({ token: first, newPassword: NEW_PASSWORD });
    expect(replaced.status).toBe(409);
    expect(replaced.body.error.message).toMatch(/newer one was sent/);

    const short = await supertest(ctx.app)
      .post('/api/auth/password-reset')
      .send({ token: second, newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.details[0]).toEqual({ path: 'newPassword', message: 'must be at least 12 characters' });

    await ctx.sequelize.query("UPDATE password_resets SET expires_at = now() - interval '1 minute'");
    const expired = await supertest(ctx.app)
      .post('/api/auth/password-reset')
      .send({ token: second, newPassword: NEW_PASSWORD });
    expect(expired.status).toBe(409);
    expect(expired.body.error.message).toMatch(/expired.*Ask for a new one/);
    await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'tech-a@test.example', password: PASSWORD })
      .expect(200);
  });
});
