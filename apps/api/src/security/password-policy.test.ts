import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { signedInAgent, startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../test-support/fixtures.js';
import { passwordWeakness } from './password-policy.js';
import { newLinkToken } from './link-tokens.js';
import { PasswordReset } from '../modules/auth/password-reset.model.js';
import { Invitation } from '../modules/invitations/invitation.model.js';
import { User } from '../modules/users/user.model.js';

describe('the password strength check (zxcvbn-ts with its common and English word lists)', () => {
  it('refuses common passwords and keyboard runs of legal length, saying why and what to do', () => {
    for (const weak of ['password1234', 'iloveyou12345', 'qwertyuiop123', 'abc123abc123']) {
      const message = passwordWeakness(weak, []);
      expect(message, weak).toMatch(/^is too easy to guess/);
      expect(message, weak).toMatch(/use three or four unrelated words/);
    }
    expect(passwordWeakness('password1234', [])).toMatch(/commonly used password/);
  });

  it('refuses a password built from the person’s own name or address', () => {
    expect(passwordWeakness('dalepruitt2026', ['dale.pruitt@corvane.example', 'Dale Pruitt'])).not.toBeNull();
    expect(passwordWeakness('dalepruitt2026', [])).toBeNull();
  });

  it('accepts a few unrelated words', () => {
    for (const strong of ['three unrelated words here', 'copper-lantern-orbit-7', 'correct-horse-battery-staple'])
      expect(passwordWeakness(strong, ['someone@example.com']), strong).toBeNull();
  });
});

describe('every place a password is set applies it', () => {
  let ctx: TestContext;
  let world: World;
  const WEAK = 'password1234';
  beforeAll(() => {
    ctx = startTestApp();
  });
  afterAll(async () => ctx.close());
  beforeEach(async () => {
    world = await buildWorld(ctx.sequelize);
  });

  const refusedOn = (res: supertest.Response, path: string) => {
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    expect(res.body.error.details).toEqual([{ path, message: expect.stringMatching(/^is too easy to guess/) }]);
  };

  it('changing one’s own password', async () => {
    const agent = await signedInAgent(ctx.app, 'tech-a@test.example', PASSWORD);
    refusedOn(
      await agent.post('/api/me/password').send({ currentPassword: PASSWORD, newPassword: WEAK }),
      'newPassword',
    );
    await agent
      .post('/api/me/password')
      .send({ currentPassword: PASSWORD, newPassword: 'copper-lantern-orbit-7' })
      .expect(204);
  });

  it('a reset link', async () => {
    const { token, tokenHash } = newLinkToken();
    await PasswordReset.create({ userId: world.users.techA.id, tokenHash, expiresAt: new Date(Date.now() + 600_000) });
    const reset = (newPassword: string) =>
      supertest(ctx.app).post('/api/auth/password-reset').send({ token, newPassword });
    refusedOn(await reset(WEAK), 'newPassword');
    // Refused, the link still works.
    await reset('copper-lantern-orbit-7').expect(204);
  });

  it('accepting an invitation', async () => {
    const { token, tokenHash } = newLinkToken();
    await Invitation.create({
      email: 'new.tech@test.example',
      name: null,
      role: 'technician',
      siteId: world.sites.A.id,
      regionId: null,
      tokenHash,
      expiresAt: new Date(Date.now() + 600_000),
      invitedBy: world.users.admin.id,
    });
    const accept = (password: string) =>
      supertest(ctx.app).post('/api/invitations/accept').send({ token, name: 'New Tech', password });
    refusedOn(await accept(WEAK), 'password');
    refusedOn(await accept('NewTech123456'), 'password');
    expect(await User.findOne({ where: { email: 'new.tech@test.example' } })).toBeNull();
    expect((await accept('copper-lantern-orbit-7')).status).toBe(201);
  });

  it('an administrator typing a first password', async () => {
    const agent = await signedInAgent(ctx.app, 'admin@test.example', PASSWORD);
    const body = { email: 'typed@test.example', name: 'Typed Person', role: 'technician', siteId: world.sites.A.id };
    refusedOn(await agent.post('/api/users').send({ ...body, password: WEAK }), 'password');
    expect((await agent.post('/api/users').send({ ...body, password: 'copper-lantern-orbit-7' })).status).toBe(201);
  });
});
