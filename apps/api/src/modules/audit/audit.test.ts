import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, PASSWORD, sawBody, type World } from '../../test-support/fixtures.js';
import { AuditEntry } from './audit-entry.model.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('the audit trail of saws', () => {
  it('records who created, changed and retired a saw, with only the changed fields of an update', async () => {
    const agent = await as('siteadmin-a@test.example');
    const created = await agent.post('/api/saws').send(sawBody(world.sites.A.id, { assetTag: 'A-NEW' }));
    expect(created.status).toBe(201);
    const id = created.body.id as string;
    expect((await agent.patch(`/api/saws/${id}`).send({ name: 'Renamed saw' })).status).toBe(200);
    expect((await agent.post(`/api/saws/${id}/retire`)).status).toBe(200);

    const res = await agent.get(`/api/audit?entity=Saw&entityId=${id}`);
    expect(res.status).toBe(200);
    const entries = res.body.items as {
      action: string;
      actorName: string;
      before: Record<string, unknown> | null;
      after: Record<string, unknown> | null;
    }[];
    expect(entries.map((e) => e.action)).toEqual(['retire', 'update', 'create']);
    expect(entries.every((e) => e.actorName === 'siteadmin-a')).toBe(true);
    expect(entries[1]).toMatchObject({ before: { name: 'Test bar saw' }, after: { name: 'Renamed saw' } });
    expect(Object.keys(entries[1]!.after!)).toEqual(['name']);
    expect(entries[2]).toMatchObject({ before: null, after: { assetTag: 'A-NEW', siteId: world.sites.A.id } });
    expect(entries[0]!.after).toMatchObject({ status: 'retired' });
  });

  it('writes nothing when the change is refused, and nothing for an update that changes nothing', async () => {
    const agent = await as('siteadmin-a@test.example');
    const saw = world.saws.A![0]!;
    const refused = await agent.patch(`/api/saws/${saw.id}`).send({ bandSpeedMinMPerMin: 500 });
    expect(refused.status).toBe(400);
    expect((await agent.patch(`/api/saws/${saw.id}`).send({ name: saw.name })).status).toBe(200);
    expect(await AuditEntry.count()).toBe(0);
  });

  it('shows a site admin only their own site’s history, and managers, leads and technicians none', async () => {
    const admin = await as('admin@test.example');
    await admin.patch(`/api/saws/${world.saws.A![0]!.id}`).send({ name: 'Changed at A' });
    await admin.patch(`/api/saws/${world.saws.B![0]!.id}`).send({ name: 'Changed at B' });

    const sawNames = async (email: string, query = '') => {
      const res = await (await as(email)).get(`/api/audit${query}`);
      expect(res.status).toBe(200);
      return (res.body.items as { after: { name: string } }[]).map((e) => e.after.name).sort();
    };
    expect(await sawNames('admin@test.example')).toEqual(['Changed at A', 'Changed at B']);
    expect(await sawNames('siteadmin-a@test.example')).toEqual(['Changed at A']);
    expect(await sawNames('siteadmin-a@test.example', `?siteId=${world.sites.B.id}`)).toEqual([]);
    for (const email of ['manager-all@test.example', 'lead-north@test.example', 'tech-a@test.example']) {
      expect(await sawNames(email)).toEqual([]);
    }
  });
});
