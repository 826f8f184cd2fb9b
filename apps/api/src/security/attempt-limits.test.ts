import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../test-support/fixtures.js';
import { hashPassword } from './passwords.js';
import { newLinkToken } from './link-tokens.js';
import { PasswordReset } from '../modules/auth/password-reset.model.js';
import { User } from '../modules/users/user.model.js';
import type { AttemptLimitSettings } from './attempt-limits.js';

// The limits here are small so the tests reach them quickly; the defaults are in attempt-limits.ts.
const LIMITS: Partial<AttemptLimitSettings> = {
  signInPerAddress: 100,
  lockoutAfter: 3,
  lockoutBaseSeconds: 1,
  lockoutMaxSeconds: 4,
  passwordChangePerPerson: 2,
  resetRequestsPerAddress: 5,
  resetRequestsPerEmail: 2,
  linkFailuresPerAddress: 3,
};

let ctx: TestContext;
let world: World;

beforeAll(() => {
  ctx = startTestApp({ attemptLimits: LIMITS });
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

const signIn = (email: string, password: string, app = ctx.app) =>
  supertest(app).post('/api/auth/sign-in').send({ email, password });

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('sign-in from one address', () => {
  // At most 5 failed sign-ins per address here.
  const FIVE = { ...LIMITS, signInPerAddress: 5 };
  let narrow: TestContext;
  beforeAll(() => {
    narrow = startTestApp({ attemptLimits: FIVE });
  });
  afterAll(async () => narrow.close());

  it('lets 20 people sign in one after another (successes never count), far past the failure limit of 5', async () => {
    const passwordHash = await hashPassword(PASSWORD);
    const emails = Object.values(world.users).map((u) => u.email);
    for (let i = emails.length; i < 20; i += 1) {
      const email = `shift-${i}@test.example`;
      await User.create({ email, name: `Shift ${i}`, role: 'technician', passwordHash, siteId: world.sites.A.id });
      emails.push(email);
    }
    for (const email of emails) expect((await signIn(email, PASSWORD, narrow.app)).status, email).toBe(200);
    // A few typos in between still leave room for everyone.
    expect((await signIn(emails[0]!, 'a-typo-in-it', narrow.app)).status).toBe(401);
    for (const email of emails) expect((await signIn(email, PASSWORD, narrow.app)).status, email).toBe(200);
  });

  it('does not count malformed requests', async () => {
    for (let i = 0; i < 10; i += 1) {
      expect((await supertest(narrow.app).post('/api/auth/sign-in').send({ email: '' })).status).toBe(400);
    }
    expect((await signIn('admin@test.example', PASSWORD, narrow.app)).status).toBe(200);
  });

  it('slows guesses spread across many accounts: after 5 failures the address waits, in every process', async () => {
    for (let i = 0; i < 5; i += 1) {
      const res = await signIn(`guess-${i}@test.example`, 'a-guessed-password', narrow.app);
      expect(res.status).toBe(401);
    }
    const blocked = await signIn('admin@test.example', PASSWORD, narrow.app);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('RATE_LIMITED');
    expect(blocked.body.error.message).toMatch(/from this network.*wait 15 minutes/);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(14 * 60);
    const other = startTestApp({ attemptLimits: FIVE });
    try {
      expect((await signIn('admin@test.example', PASSWORD, other.app)).status).toBe(429);
    } finally {
      await other.close();
    }
  });
});

describe('an account after failed sign-ins', () => {
  it('waits after the third failure in a row, says how long, and opens again after its wait', async () => {
    expect((await signIn('tech-a@test.example', 'wrong-guess-1')).body.error.message).toBe(
      'That e-mail and password do not match an account',
    );
    expect((await signIn('tech-a@test.example', 'wrong-guess-2')).status).toBe(401);
    const third = await signIn('tech-a@test.example', 'wrong-guess-3');
    expect(third.status).toBe(401);
    expect(third.body.error.message).toMatch(/the next try waits 1 minute/);

    // Locked: even the right password is not tried, and the answer says how long to wait.
    const locked = await signIn('tech-a@test.example', PASSWORD);
    expect(locked.status).toBe(429);
    expect(locked.body.error.message).toMatch(/for this account in a row.*wait 1 minute/);
    expect(locked.headers['retry-after']).toBe('1');
    // Other accounts from the same address are not held up.
    expect((await signIn('admin@test.example', PASSWORD)).status).toBe(200);

    await sleep(1100);
    expect((await signIn('tech-a@test.example', PASSWORD)).status).toBe(200);
  });

  it('ends the wait when the person chooses a new password with a reset link', async () => {
    for (let i = 1; i <= 3; i += 1) await signIn('tech-a@test.example', `wrong-guess-${i}`);
    const locked = await signIn('tech-a@test.example', PASSWORD);
    expect(locked.status).toBe(429);
    expect(locked.body.error.message).toMatch(/or choose a new password with a link/);
    const { token, tokenHash } = newLinkToken();
    await PasswordReset.create({ userId: world.users.techA.id, tokenHash, expiresAt: new Date(Date.now() + 600_000) });
    await supertest(ctx.app)
      .post('/api/auth/password-reset')
      .send({ token, newPassword: 'copper-lantern-orbit-7' })
      .expect(204);
    expect((await signIn('tech-a@test.example', 'copper-lantern-orbit-7')).status).toBe(200);
  });

  it('doubles the wait with each further failure', async () => {
    for (let i = 1; i <= 3; i += 1) await signIn('tech-a@test.example', `wrong-guess-${i}`);
    await sleep(1100);
    expect((await signIn('tech-a@test.example', 'wrong-guess-4')).status).toBe(401);
    expect((await signIn('tech-a@test.example', PASSWORD)).headers['retry-after']).toBe('2');
    await sleep(2100);
    expect((await signIn('tech-a@test.example', 'wrong-guess-5')).status).toBe(401);
    expect((await signIn('tech-a@test.example', PASSWORD)).headers['retry-after']).toBe('4');
  });

  it('treats an address without an account exactly alike, so the answers never say which exist', async () => {
    const known: supertest.Response[] = [];
    const unknown: supertest.Response[] = [];
    for (let i = 1; i <= 4; i += 1) {
      known.push(await signIn('tech-a@test.example', `wrong-guess-${i}`));
      unknown.push(await signIn('nobody-here@test.example', `wrong-guess-${i}`));
    }
    expect(unknown.map((r) => r.status)).toEqual(known.map((r) => r.status));
    expect(unknown.map((r) => r.body.error.message)).toEqual(known.map((r) => r.body.error.message));
    expect(known.map((r) => r.status)).toEqual([401, 401, 401, 429]);
  });

  it('forgets the failures at a successful sign-in', async () => {
    for (let i = 1; i <= 2; i += 1) await signIn('tech-a@test.example', `wrong-guess-${i}`);
    expect((await signIn('tech-a@test.example', PASSWORD)).status).toBe(200);
    for (let i = 3; i <= 4; i += 1) {
      const res = await signIn('tech-a@test.example', `wrong-guess-${i}`);
      expect(res.status).toBe(401);
      expect(res.body.error.message).not.toMatch(/waits/);
    }
    expect((await signIn('tech-a@test.example', PASSWORD)).status).toBe(200);
  });

  it('meets the lock even with guesses sent all at once: only three passwords are ever tried', async () => {
    const answers = await Promise.all(
      Array.from({ length: 8 }, (_, i) => signIn('tech-a@test.example', `parallel-guess-${i}`)),
    );
    const statuses = answers.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 401)).toHaveLength(3);
    expect(statuses.filter((s) => s === 429)).toHaveLength(5);
  });
});

describe('the other routes that take a secret have limits of their own', () => {
  it('password change: failures per person, apart from sign-in', async () => {
    const agent = supertest.agent(ctx.app);
    await agent.post('/api/auth/sign-in').send({ email: 'tech-a@test.example', password: PASSWORD }).expect(200);
    const change = (currentPassword: string) =>
      agent.post('/api/me/password').send({ currentPassword, newPassword: 'three unrelated words here' });
    expect((await change('not-it-1')).status).toBe(400);
    expect((await change('not-it-2')).status).toBe(400);
    const limited = await change(PASSWORD);
    expect(limited.status).toBe(429);
    expect(limited.body.error.message).toMatch(/failed password changes/);
    // Sign-in from the same address is untouched, and another person may still change theirs.
    const admin = supertest.agent(ctx.app);
    await admin.post('/api/auth/sign-in').send({ email: 'admin@test.example', password: PASSWORD }).expect(200);
    await admin
      .post('/api/me/password')
      .send({ currentPassword: PASSWORD, newPassword: 'three unrelated words here' })
      .expect(204);
  });

  it('reset requests: every request per e-mail address and per network, the same for unknown addresses', async () => {
    const ask = (email: string) => supertest(ctx.app).post('/api/auth/password-reset/request').send({ email });
    expect((await ask('tech-a@test.example')).status).toBe(202);
    expect((await ask('tech-a@test.example')).status).toBe(202);
    const third = await ask('tech-a@test.example');
    expect(third.status).toBe(429);
    expect(third.body.error.message).toMatch(/use the newest e-mail/);
    expect((await ask('nobody@test.example')).status).toBe(202);
    expect((await ask('nobody@test.example')).status).toBe(202);
    // Five counted for this network (the refused third one too): the sixth request is refused for the network.
    const fifth = await ask('someone-else@test.example');
    expect(fifth.status).toBe(429);
    expect(fifth.body.error.message).toMatch(/from this network/);
    expect((await signIn('admin@test.example', PASSWORD)).status).toBe(200);
  });

  it('invitation links: refused links per address, while good ones do not count', async () => {
    const preview = (token: string) => supertest(ctx.app).post('/api/invitations/preview').send({ token });
    const bad = 'A'.repeat(43);
    for (let i = 0; i < 3; i += 1) expect((await preview(bad)).status).toBe(404);
    const limited = await preview(bad);
    expect(limited.status).toBe(429);
    expect(limited.body.error.message).toMatch(/invitation links/);
    // A malformed token is refused before counting; reset links are counted apart.
    expect((await preview('short')).status).toBe(400);
    const reset = await supertest(ctx.app)
      .post('/api/auth/password-reset')
      .send({ token: bad, newPassword: 'three unrelated words here' });
    expect(reset.status).toBe(404);
  });
});
