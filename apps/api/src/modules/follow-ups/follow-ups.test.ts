import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { signedInAgent, startTestApp, type TestContext } from '../../test-support/test-db.js';
import { PASSWORD } from '../../test-support/fixtures.js';
import { buildFleetFixture, type FleetFixture } from '../../test-support/fleet-fixture.js';
import { AuditEntry } from '../audit/audit-entry.model.js';

let ctx: TestContext;
let fx: FleetFixture;
const agents: Record<string, supertest.Agent> = {};
const DUE = '2099-12-20';

beforeAll(async () => {
  ctx = startTestApp();
  fx = await buildFleetFixture(ctx.sequelize);
  for (const [name, user] of Object.entries(fx.world.users))
    agents[name] = await signedInAgent(ctx.app, user.email, PASSWORD);
});
afterAll(async () => ctx.close());

describe('a follow-up from open to done', () => {
  let id: string;

  it('a lead opens one from a flag for someone at the site; the flag is kept as it was', async () => {
    const assignees = await agents
      .leadNorth!.get(`/api/follow-ups/assignees?siteId=${fx.world.sites.A.id}`)
      .expect(200);
    expect(assignees.body.map((p: { name: string }) => p.name)).toEqual(['siteadmin-a', 'tech-a']);
    const res = await agents.leadNorth!.post('/api/follow-ups').send({
      sawId: fx.saws.a1.id,
      title: 'Blade life short on A-1: check the pitch for the tube work',
      assigneeId: fx.world.users.techA.id,
      dueOn: DUE,
      notes: 'Tooth strippage on the last blade.',
      fromFlag: { metric: 'blade_life', from: '2026-03', to: '2026-04' },
    });
    expect(res.status).toBe(201);
    id = res.body.id;
    expect(res.body).toMatchObject({
      state: 'open',
      overdue: false,
      sawAssetTag: 'A-1',
      siteName: 'Site A',
      assignee: { name: 'tech-a' },
      createdBy: { name: 'lead-north' },
      dueOn: DUE,
    });
    // A-1 finished R1, R2, R3 in March–April: median life 1 000 000 mm²; too few comparable saws to judge.
    expect(res.body.flag).toMatchObject({
      metric: 'blade_life',
      value: 1_000_000,
      period: { from: '2026-03', to: '2026-04' },
    });
    expect(res.body.flag.method).toMatch(/^Only \d comparable saws?; at least 5 are needed/);
    expect(res.body.entries.map((e: { text: string }) => e.text)).toEqual([
      `Opened for tech-a, due ${DUE}: Tooth strippage on the last blade.`,
    ]);
  });

  it('the site sees it; other sites and regions do not', async () => {
    const site = await agents.siteAdminA!.get(`/api/follow-ups?sawId=${fx.saws.a1.id}&state=active`).expect(200);
    expect(site.body.items.map((f: { id: string }) => f.id)).toEqual([id]);
    const tech = await agents.techA!.get('/api/follow-ups?state=active').expect(200);
    expect(tech.body.total).toBe(1);
    expect((await agents.techC!.get('/api/follow-ups').expect(200)).body.total).toBe(0);
    await agents.techC!.get(`/api/follow-ups/${id}`).expect(404);
    await agents.managerAC!.get(`/api/follow-ups/${id}`).expect(200);
  });

  it('the technician moves it along and adds notes, but cannot hand it on or move the day', async () => {
    const res = await agents
      .techA!.patch(`/api/follow-ups/${id}`)
      .send({ state: 'in_progress', note: 'Finer pitch ordered.' });
    expect(res.status).toBe(200);
    expect(res.body.state).toBe('in_progress');
    expect(res.body.entries.map((e: { kind: string; text: string }) => `${e.kind}: ${e.text}`)).toEqual(
      expect.arrayContaining(['state: Open → In progress', 'note: Finer pitch ordered.']),
    );
    const handOn = await agents
      .techA!.patch(`/api/follow-ups/${id}`)
      .send({ assigneeId: fx.world.users.siteAdminA.id });
    expect(handOn.status).toBe(403);
    expect(handOn.body.error.message).toBe(
      'Only the site admin or the regional lead changes who does a follow-up and by when',
    );
    await agents.techC!.patch(`/api/follow-ups/${id}`).send({ state: 'done' }).expect(404);
    await agents.managerAC!.patch(`/api/follow-ups/${id}`).send({ state: 'done' }).expect(403);
  });

  it('refuses an assignee from another site, a day already past, and an empty change', async () => {
    const elsewhere = await agents
      .leadNorth!.patch(`/api/follow-ups/${id}`)
      .send({ assigneeId: fx.world.users.techC.id });
    expect(elsewhere.status).toBe(400);
    expect(elsewhere.body.error.details).toEqual([
      { path: 'assigneeId', message: 'choose an active site admin or technician of this site' },
    ]);
    const past = await agents.siteAdminA!.patch(`/api/follow-ups/${id}`).send({ dueOn: '2020-01-01' });
    expect(past.status).toBe(400);
    expect(past.body.error.message).toBe('The due date has passed; choose today or a later day');
    const same = await agents.siteAdminA!.patch(`/api/follow-ups/${id}`).send({ state: 'in_progress' });
    expect(same.status).toBe(400);
    await agents.siteAdminA!.patch(`/api/follow-ups/${id}`).send({}).expect(400);
    const notAtSite = await agents.leadNorth!.post('/api/follow-ups').send({
      sawId: fx.saws.c1.id,
      title: 'Not ours',
      assigneeId: fx.world.users.techC.id,
      dueOn: DUE,
    });
    expect(notAtSite.status).toBe(400);
    expect(notAtSite.body.error.details).toEqual([{ path: 'sawId', message: 'choose one of your saws' }]);
  });

  it('done stays in the history: out of the active list, in the done list, every step audited', async () => {
    await agents
      .siteAdminA!.patch(`/api/follow-ups/${id}`)
      .send({ state: 'done', note: 'New pitch in use.' })
      .expect(200);
    expect((await agents.siteAdminA!.get('/api/follow-ups?state=active').expect(200)).body.total).toBe(0);
    const done = await agents.siteAdminA!.get('/api/follow-ups?state=done').expect(200);
    expect(done.body.items[0]).toMatchObject({ id, state: 'done' });
    expect(done.body.items[0].doneAt).not.toBeNull();
    const detail = await agents.leadNorth!.get(`/api/follow-ups/${id}`).expect(200);
    expect(detail.body.entries.map((e: { kind: string }) => e.kind)).toEqual([
      'note',
      'state',
      'note',
      'state',
      'opened',
    ]);
    expect(await AuditEntry.count({ where: { entity: 'FollowUp', entityId: id } })).toBe(3);
    const csv = await agents.leadNorth!.get('/api/follow-ups/export').expect(200);
    expect(csv.headers['x-row-count']).toBe('1');
    expect(csv.text).toContain('"Done"');
    await agents.techA!.get('/api/follow-ups/export').expect(403);
  });
});
