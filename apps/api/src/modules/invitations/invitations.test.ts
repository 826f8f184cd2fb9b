import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import { QueryTypes } from 'sequelize';
import { startTestApp, signedInAgent, TEST_PUBLIC_URL, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../../test-support/fixtures.js';
import { clearJobs, linkTokenIn, startTestMail, type TestMail } from '../../test-support/mail.js';
import { hashLinkToken } from '../../security/link-tokens.js';

let mail: TestMail;
let ctx: TestContext;
let world: World;
const as = (email: string) => signedInAgent(ctx.app, email, PASSWORD);
const NEW_PASSWORD = 'a-first-password-of-my-own';

beforeAll(async () => {
  mail = await startTestMail();
  ctx = startTestApp({ mail: { smtpPort: mail.port, workers: true, catcherDir: mail.dir } });
  await ctx.ready;
});
afterAll(async () => {
  await ctx.close();
  await mail.close();
});
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  await clearJobs(ctx.sequelize);
  await mail.clear();
});

async function inviteTechnicianAtA(email = 'new.tech@test.example') {
  const res = await (
    await as('siteadmin-a@test.example')
  )
    .post('/api/invitations')
    .send({ email, name: 'Ada Lindqvist', role: 'technician', siteId: world.sites.A.id });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const caught = await mail.waitFor(email);
  return { invitation: res.body as { id: string; state: string }, caught, token: linkTokenIn(caught, 'invitation') };
}

describe('an invitation, from the mail to the first sign-in', () => {
  it('mails a single-use link on the public address; accepting it makes the account, which then signs in', async () => {
    const { invitation, caught, token } = await inviteTechnicianAtA();
    expect(invitation.state).toBe('pending');
    expect(caught.subject).toBe('siteadmin-a invited you to Kerfline');
    expect(caught.text).toContain(`${TEST_PUBLIC_URL}/invitation#token=${token}`);
    expect(caught.text).toContain('Saw technician at Site A');
    expect(caught.html).toContain('Set up your account');

    // Only the hash is stored, and the queued copy of the secret is gone once the mail went.
    const [stored] = await ctx.sequelize.query<{ token_hash: string }>('SELECT token_hash FROM invitations', {
      type: QueryTypes.SELECT,
    });
    expect(stored!.token_hash).toBe(hashLinkToken(token));
    const logged = await ctx.sequelize.query<{ status: string; attempts: number; payload: object }>(
      "SELECT status, attempts, payload FROM mail_log WHERE kind = 'invitation'",
      { type: QueryTypes.SELECT },
    );
    expect(logged).toEqual([{ status: 'sent', attempts: 1, payload: {} }]);

    const preview = await supertest(ctx.app).post('/api/invitations/preview').send({ token });
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ email: 'new.tech@test.example', role: 'technician', siteName: 'Site A' });

    const accepted = await supertest(ctx.app)
      .post('/api/invitations/accept')
      .send({ token, name: 'Ada Lindqvist', password: NEW_PASSWORD });
    expect(accepted.status).toBe(201);
    const signIn = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .send({ email: 'new.tech@test.example', password: NEW_PASSWORD });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user).toMatchObject({ name: 'Ada Lindqvist', role: 'technician', siteId: world.sites.A.id });
    expect(signIn.body.siteIds).toEqual([world.sites.A.id]);

    const list = await (await as('siteadmin-a@test.example')).get('/api/invitations?state=accepted');
    expect(list.body.items.map((i: { email: string }) => i.email)).toEqual(['new.tech@test.example']);
    const audit = await (await as('admin@test.example')).get('/api/audit?entity=User');
    expect(audit.body.items[0]).toMatchObject({
      action: 'create',
      actorName: 'Ada Lindqvist',
      siteId: world.sites.A.id,
    });
  });

  it('refuses a used, an expired, a withdrawn and an unknown link, each with a message that says what to do', async () => {
    const { token } = await inviteTechnicianAtA();
    const accept = (t: string) =>
      supertest(ctx.app).post('/api/invitations/accept').send({ token: t, name: 'Ada', password: NEW_PASSWORD });
    await accept(token).expect(201);
    const again = await accept(token);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already used to set up an account\. Sign in as new\.tech@test\.example/);

    const second = await inviteTechnicianAtA('second@test.example');
    await ctx.sequelize.query("UPDATE invitations SET expires_at = now() - interval '1 day' WHERE id = :id", {
      replacements: { id: second.invitation.id },
    });
    const expired = await supertest(ctx.app).post('/api/invitations/preview').send({ token: second.token });
    expect(expired.status).toBe(409);
    expect(expired.body.error.message).toMatch(/expired on \d{4}-\d{2}-\d{2}\. Ask siteadmin-a to send it again/);

    const third = await inviteTechnicianAtA('third@test.example');
    await (await as('admin@test.example')).post(`/api/invitations/${third.invitation.id}/revoke`).expect(200);
    const withdrawn = await accept(third.token);
    expect(withdrawn.status).toBe(409);
    expect(withdrawn.body.error.message).toMatch(/withdrawn/);

    const unknown = await accept('x'.repeat(43));
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/not valid/);
    const cut = await accept(token.slice(0, 20));
    expect(cut.status).toBe(400);
    expect(cut.body.error.details[0].message).toMatch(/copy the whole link/);
    // Nobody was made by the refused attempts.
    const emails = (await (await as('admin@test.example')).get('/api/users')).body.items.map(
      (u: { email: string }) => u.email,
    );
    expect(emails).not.toContain('second@test.example');
    expect(emails).not.toContain('third@test.example');
  });

  it('sends it again with a new link, and the old link stops working', async () => {
    const first = await inviteTechnicianAtA();
    await mail.clear();
    const resent = await (await as('siteadmin-a@test.example')).post(`/api/invitations/${first.invitation.id}/resend`);
    expect(resent.status).toBe(200);
    expect(resent.body.sentCount).toBe(2);
    const newToken = linkTokenIn(await mail.waitFor('new.tech@test.example'), 'invitation');
    expect(newToken).not.toBe(first.token);
    expect((await supertest(ctx.app).post('/api/invitations/preview').send({ token: first.token })).status).toBe(404);
    expect((await supertest(ctx.app).post('/api/invitations/preview').send({ token: newToken })).status).toBe(200);
  });

  it('lists invitations by state', async () => {
    const a = await inviteTechnicianAtA('a@test.example');
    const b = await inviteTechnicianAtA('b@test.example');
    await inviteTechnicianAtA('c@test.example');
    await supertest(ctx.app)
      .post('/api/invitations/accept')
      .send({ token: a.token, name: 'A', password: NEW_PASSWORD });
    await (await as('admin@test.example')).post(`/api/invitations/${b.invitation.id}/revoke`).expect(200);
    const admin = await as('admin@test.example');
    const byState = async (state: string) =>
      (await admin.get(`/api/invitations?state=${state}`)).body.items.map((i: { email: string }) => i.email);
    expect(await byState('accepted')).toEqual(['a@test.example']);
    expect(await byState('revoked')).toEqual(['b@test.example']);
    expect(await byState('pending')).toEqual(['c@test.example']);
    expect(await byState('expired')).toEqual([]);
    expect((await admin.get('/api/invitations')).body.total).toBe(3);
  });
});

describe('who may invite whom', () => {
  it('lets a site admin invite technicians and site admins of their own site only', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const invite = (body: Record<string, unknown>) =>
      siteAdmin.post('/api/invitations').send({ email: `x${Math.random()}@test.example`, ...body });
    expect((await invite({ role: 'site_admin', siteId: world.sites.A.id })).status).toBe(201);
    expect((await invite({ role: 'admin' })).status).toBe(403);
    expect((await invite({ role: 'manager', allSites: true })).status).toBe(403);
    expect((await invite({ role: 'regional_lead', regionId: world.regions.north.id })).status).toBe(403);
    expect((await invite({ role: 'technician', siteId: world.sites.B.id })).status).toBe(403);
    expect((await invite({ role: 'technician', siteId: world.sites.C.id })).status).toBe(403);
    for (const email of ['manager-all@test.example', 'lead-north@test.example', 'tech-a@test.example']) {
      const res = await (
        await as(email)
      )
        .post('/api/invitations')
        .send({ email: 'y@test.example', role: 'technician', siteId: world.sites.A.id });
      expect(res.status, email).toBe(403);
    }
  });

  it('keeps each site admin to their own site’s invitations, in lists and by id', async () => {
    const admin = await as('admin@test.example');
    const atC = await admin
      .post('/api/invitations')
      .send({ email: 'c-tech@test.example', role: 'technician', siteId: world.sites.C.id });
    const lead = await admin
      .post('/api/invitations')
      .send({ email: 'lead@test.example', role: 'regional_lead', regionId: world.regions.south.id });
    expect(lead.status).toBe(201);
    await inviteTechnicianAtA();
    const siteAdmin = await as('siteadmin-a@test.example');
    const seen = (await siteAdmin.get('/api/invitations')).body;
    expect(seen.items.map((i: { email: string }) => i.email)).toEqual(['new.tech@test.example']);
    expect(seen.total).toBe(1);
    expect((await siteAdmin.post(`/api/invitations/${atC.body.id}/revoke`)).status).toBe(404);
    expect((await siteAdmin.post(`/api/invitations/${lead.body.id}/resend`)).status).toBe(404);
    expect((await (await as('tech-a@test.example')).get('/api/invitations')).body.total).toBe(0);
  });

  it('refuses an address that has an account or a waiting invitation, and a retired site', async () => {
    const admin = await as('admin@test.example');
    const taken = await admin
      .post('/api/invitations')
      .send({ email: 'Tech-C@test.example', role: 'technician', siteId: world.sites.C.id });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toMatch(/already has an account/);
    await inviteTechnicianAtA();
    const twice = await admin
      .post('/api/invitations')
      .send({ email: 'new.tech@test.example', role: 'technician', siteId: world.sites.B.id });
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toMatch(/send it again or withdraw it/);
    await admin.post(`/api/sites/${world.sites.B.id}/retire`).expect(200);
    const retired = await admin
      .post('/api/invitations')
      .send({ email: 'b-tech@test.example', role: 'technician', siteId: world.sites.B.id });
    expect(retired.status).toBe(400);
    expect(retired.body.error.details[0].path).toBe('siteId');
  });
});
