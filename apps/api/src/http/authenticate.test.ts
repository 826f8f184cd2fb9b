import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import supertest from 'supertest';
import pg from 'pg';
import { startTestApp, signedInAgent, type TestContext } from '../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../test-support/fixtures.js';
import { loadSignedIn } from '../modules/auth/auth.service.js';
import { User, UserSite } from '../modules/users/user.model.js';
import { Site } from '../modules/sites/site.model.js';

let ctx: TestContext;
let world: World;

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

const sorted = (ids: readonly string[] | 'all') => (ids === 'all' ? ids : [...ids].sort());

describe('who is signed in', () => {
  it('resolves each role’s sites and regions from its assignments', async () => {
    const { sites, regions, users } = world;
    const expected: Record<keyof World['users'], { siteIds: string[] | 'all'; regionIds: string[] | 'all' }> = {
      admin: { siteIds: 'all', regionIds: 'all' },
      managerAll: { siteIds: 'all', regionIds: 'all' },
      managerAC: { siteIds: [sites.A.id, sites.C.id], regionIds: [regions.north.id, regions.south.id] },
      leadNorth: { siteIds: [sites.A.id, sites.B.id], regionIds: [regions.north.id] },
      siteAdminA: { siteIds: [sites.A.id], regionIds: [regions.north.id] },
      techA: { siteIds: [sites.A.id], regionIds: [regions.north.id] },
      techC: { siteIds: [sites.C.id], regionIds: [regions.south.id] },
    };
    for (const [key, want] of Object.entries(expected) as [keyof World['users'], (typeof expected)['admin']][]) {
      const signedIn = (await loadSignedIn(users[key].id))!;
      expect({
        who: key,
        siteIds: sorted(signedIn.principal.siteIds),
        regionIds: sorted(signedIn.principal.regionIds),
      }).toEqual({ who: key, siteIds: sorted(want.siteIds), regionIds: sorted(want.regionIds) });
      expect(signedIn.principal).toMatchObject({ id: users[key].id, role: users[key].role });
      expect(signedIn.user).toMatchObject({ id: users[key].id, email: users[key].email, active: true });
      expect(signedIn.user).not.toHaveProperty('passwordHash');
    }
    // A manager's own list of sites is theirs whatever their scope; other roles have none.
    expect(sorted((await loadSignedIn(users.managerAC.id))!.managedSiteIds)).toEqual(sorted([sites.A.id, sites.C.id]));
    expect((await loadSignedIn(users.techA.id))!.managedSiteIds).toEqual([]);
    // A manager with no sites left sees none.
    await UserSite.destroy({ where: { userId: users.managerAC.id } });
    expect((await loadSignedIn(users.managerAC.id))!.principal).toMatchObject({ siteIds: [], regionIds: [] });
    expect(await loadSignedIn('00000000-0000-4000-8000-000000000000')).toBeNull();
  });

  it('applies a change of role, sites, region or a deactivation to the next request of an open session', async () => {
    const { sites, regions, users } = world;
    const manager = await signedInAgent(ctx.app, users.managerAC.email, PASSWORD);
    const siteIdsNow = async () => sorted((await manager.get('/api/me').expect(200)).body.siteIds as string[]);
    expect(await siteIdsNow()).toEqual(sorted([sites.A.id, sites.C.id]));
    await manager.get(`/api/sites/${sites.C.id}`).expect(200);

    await UserSite.destroy({ where: { userId: users.managerAC.id, siteId: sites.C.id } });
    expect(await siteIdsNow()).toEqual([sites.A.id]);
    await manager.get(`/api/sites/${sites.C.id}`).expect(404);

    await User.update({ allSites: true }, { where: { id: users.managerAC.id } });
    expect(await siteIdsNow()).toEqual(sorted([sites.A.id, sites.B.id, sites.C.id]));

    await User.update(
      { role: 'technician', siteId: sites.B.id, allSites: false },
      { where: { id: users.managerAC.id } },
    );
    expect(await siteIdsNow()).toEqual([sites.B.id]);
    await manager.get(`/api/sites/${sites.A.id}`).expect(404);

    // A site moved to another region leaves the lead's scope at once.
    const lead = await signedInAgent(ctx.app, users.leadNorth.email, PASSWORD);
    await lead.get(`/api/sites/${sites.B.id}`).expect(200);
    await Site.update({ regionId: regions.south.id }, { where: { id: sites.B.id } });
    await lead.get(`/api/sites/${sites.B.id}`).expect(404);

    await User.update({ active: false }, { where: { id: users.managerAC.id } });
    await manager.get('/api/me').expect(401);
    await manager.get('/api/saws').expect(401);
    // Someone else's session is untouched.
    await lead.get('/api/me').expect(200);
    expect((await supertest(ctx.app).get('/api/me')).status).toBe(401);
  });
});

describe('what a signed-in request costs', () => {
  it('reads its session, the person and their scope in one statement, and writes nothing within the interval', async () => {
    const agent = await signedInAgent(ctx.app, world.users.managerAC.email, PASSWORD);
    // A process's first read is the session library's own; from the next on, one statement a request.
    await agent.get('/api/me').expect(200);
    await agent.get('/api/me').expect(200);
    const sent: string[] = [];
    const query = pg.Client.prototype.query;
    pg.Client.prototype.query = function (this: pg.Client, ...args: unknown[]) {
      const first = args[0] as string | { text: string };
      sent.push(typeof first === 'string' ? first : first.text);
      return (query as (...a: unknown[]) => unknown).apply(this, args);
    } as typeof query;
    let forMe: string[] = [];
    try {
      const me = await agent.get('/api/me').expect(200);
      expect(me.body.siteIds).toHaveLength(2);
      forMe = sent.splice(0);
      await agent.get(`/api/saws?siteId=${world.sites.A.id}`).expect(200);
    } finally {
      pg.Client.prototype.query = query;
    }
    // /api/me: the one statement, nothing else (no person, sites or regions read apart, no touch written).
    expect(forMe).toHaveLength(1);
    expect(forMe[0]).toMatch(/FROM sessions s/);
    // The saw list: the same statement, then its own (a count and the page), none of them about the person.
    expect(sent[0]).toBe(forMe[0]);
    expect(sent.slice(1).filter((text) => /FROM sessions|"users"|user_sites|UPDATE sessions/i.test(text))).toEqual([]);
    expect(sent).toHaveLength(3);
  });
});
