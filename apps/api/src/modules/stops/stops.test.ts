import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const count = async (table: string) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${table}`, { plain: true }))!.n as number;

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

describe('logging and ending a stop', () => {
  it('makes the saw down with the category and since when, derived from the open stop, until it ends', async () => {
    const tech = await as('tech-a@test.example');
    const saw = world.saws.A![0]!;
    const startedAt = minutesAgo(90);
    const created = await tech
      .post('/api/stops')
      .send({ sawId: saw.id, startedAt, category: 'hydraulic', notes: 'Leak' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      sawId: saw.id,
      siteId: world.sites.A.id,
      sawAssetTag: 'A-1',
      endedAt: null,
      category: 'hydraulic',
      planned: false,
      notes: 'Leak',
      createdByName: 'tech-a',
    });
    expect(created.body.durationMin).toBeGreaterThanOrEqual(89);

    const down = (await tech.get(`/api/saws/${saw.id}`)).body;
    expect(down.status).toBe('down');
    expect(down.down).toEqual({
      stopId: created.body.id,
      category: 'hydraulic',
      planned: false,
      since: new Date(startedAt).toISOString(),
    });
    const listed = (await tech.get('/api/saws?status=down')).body;
    expect(listed.items.map((s: { assetTag: string }) => s.assetTag)).toEqual(['A-1']);
    expect(
      (await tech.get('/api/saws?status=in_service')).body.items.map((s: { assetTag: string }) => s.assetTag),
    ).toEqual(['A-2']);

    const ended = await tech.post(`/api/stops/${created.body.id}/end`).send({});
    expect(ended.status).toBe(200);
    expect(Date.parse(ended.body.endedAt)).toBeGreaterThan(Date.parse(startedAt));
    const after = (await tech.get(`/api/saws/${saw.id}`)).body;
    expect(after).toMatchObject({ status: 'in_service', down: null });

    const again = await tech.post(`/api/stops/${created.body.id}/end`).send({});
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/already ended/);
  });

  it('writes an audit entry with each create and change, in the same transaction', async () => {
    const tech = await as('tech-a@test.example');
    const stop = (await tech.post('/api/stops').send({ sawId: world.saws.A![0]!.id, category: 'electrical' })).body;
    await tech.post(`/api/stops/${stop.id}/end`).send({}).expect(200);
    const entries = (await (await as('siteadmin-a@test.example')).get(`/api/audit?entity=Stop&entityId=${stop.id}`))
      .body;
    expect(entries.items.map((e: { action: string }) => e.action)).toEqual(['update', 'create']);
    expect(entries.items[0].before).toEqual({ endedAt: null, endedById: null });
    expect(entries.items[0].after.endedById).toBe(world.users.techA.id);
    expect(entries.items[1].after).toMatchObject({ category: 'electrical', siteId: world.sites.A.id });
  });

  it('refuses an overlapping stop with a 409 that names the stop it collides with, writing nothing', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const first = (
      await tech
        .post('/api/stops')
        .send({ sawId, startedAt: minutesAgo(300), endedAt: minutesAgo(200), category: 'mechanical' })
    ).body;
    const overlap = await tech
      .post('/api/stops')
      .send({ sawId, startedAt: minutesAgo(250), endedAt: minutesAgo(100), category: 'electrical' });
    expect(overlap.status).toBe(409);
    expect(overlap.body.error.message).toContain(first.id);
    expect(overlap.body.error.message).toMatch(/mechanical, from .* to .*Europe\/Berlin/);
    expect(overlap.body.error.message).toMatch(/change the times/);
    // Touching ends are fine: a stop may start the minute the last one ended.
    const touching = await tech
      .post('/api/stops')
      .send({ sawId, startedAt: first.endedAt, endedAt: minutesAgo(150), category: 'other' });
    expect(touching.status).toBe(201);
    expect(await count('stops')).toBe(2);
    expect(await count(`audit_entries WHERE entity = 'Stop'`)).toBe(2);
  });

  it('refuses a second open stop on the saw, naming the open one', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const open = (await tech.post('/api/stops').send({ sawId, startedAt: minutesAgo(60), category: 'blade_failure' }))
      .body;
    const second = await tech.post('/api/stops').send({ sawId, category: 'mechanical' });
    expect(second.status).toBe(409);
    expect(second.body.error.message).toContain(open.id);
    expect(second.body.error.message).toMatch(/open since .*end that stop first/);
  });

  it('lets the database decide when two people log overlapping stops at once: one wins, one gets 409', async () => {
    const [a, b] = await Promise.all([as('tech-a@test.example'), as('siteadmin-a@test.example')]);
    const sawId = world.saws.A![1]!.id;
    const results = await Promise.all([
      a.post('/api/stops').send({ sawId, startedAt: minutesAgo(120), category: 'mechanical' }),
      b.post('/api/stops').send({ sawId, startedAt: minutesAgo(119), category: 'hydraulic' }),
    ]);
    expect(results.map((r) => r.status).sort()).toEqual([201, 409]);
    expect(await count('stops')).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'Stop'`)).toBe(1);
  });

  it('refuses bad times with messages that say what to fix', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const future = await tech
      .post('/api/stops')
      .send({ sawId, startedAt: new Date(Date.now() + 3600_000).toISOString(), category: 'other' });
    expect(future.status).toBe(400);
    expect(future.body.error.details).toEqual([{ path: 'startedAt', message: 'Start must not be in the future' }]);
    const backwards = await tech
      .post('/api/stops')
      .send({ sawId, startedAt: minutesAgo(10), endedAt: minutesAgo(20), category: 'other' });
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.details[0]).toEqual({ path: 'endedAt', message: 'The end must be after the start' });
    const ancient = await tech.post('/api/stops').send({ sawId, startedAt: '0202-01-01T00:00:00Z', category: 'other' });
    expect(ancient.status).toBe(400);
    expect(ancient.body.error.details[0].message).toMatch(/on or after 1 January 1990/);
    const category = await tech.post('/api/stops').send({ sawId, category: 'coffee' });
    expect(category.status).toBe(400);
    expect(category.body.error.details[0].message).toMatch(/^Category must be one of blade_change/);
    const open = (await tech.post('/api/stops').send({ sawId, startedAt: minutesAgo(30), category: 'other' })).body;
    const endEarly = await tech.post(`/api/stops/${open.id}/end`).send({ endedAt: minutesAgo(40) });
    expect(endEarly.status).toBe(400);
    expect(endEarly.body.error.details[0].path).toBe('endedAt');
    expect(await count('stops')).toBe(1);
  });

  it('refuses a stop on a retired saw', async () => {
    const res = await (
      await as('siteadmin-a@test.example')
    )
      .post('/api/stops')
      .send({ sawId: world.retiredA.id, category: 'other' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/A-OLD is retired/);
  });

  it('corrects a stop and reopens it, keeping stops apart', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const a = (
      await tech
        .post('/api/stops')
        .send({ sawId, startedAt: minutesAgo(300), endedAt: minutesAgo(250), category: 'other' })
    ).body;
    const b = (
      await tech
        .post('/api/stops')
        .send({ sawId, startedAt: minutesAgo(200), endedAt: minutesAgo(150), category: 'other' })
    ).body;
    const fixed = await tech.patch(`/api/stops/${a.id}`).send({ category: 'planned_maintenance', planned: true });
    expect(fixed.body).toMatchObject({ category: 'planned_maintenance', planned: true });
    const clash = await tech.patch(`/api/stops/${a.id}`).send({ endedAt: minutesAgo(180) });
    expect(clash.status).toBe(409);
    expect(clash.body.error.message).toContain(b.id);
    const reopen = await tech.patch(`/api/stops/${b.id}`).send({ endedAt: null });
    expect(reopen.status).toBe(200);
    expect((await tech.get(`/api/saws/${sawId}`)).body.status).toBe('down');
  });
});

describe('who may log and see stops', () => {
  it('keeps a technician to their own site: other sites’ saws are unknown, their stops invisible', async () => {
    const techC = await as('tech-c@test.example');
    const elsewhere = await techC.post('/api/stops').send({ sawId: world.saws.A![0]!.id, category: 'other' });
    expect(elsewhere.status).toBe(400);
    expect(elsewhere.body.error.details).toEqual([{ path: 'sawId', message: 'choose one of your saws' }]);
    const stop = (
      await (
        await as('tech-a@test.example')
      )
        .post('/api/stops')
        .send({ sawId: world.saws.A![0]!.id, category: 'other' })
    ).body;
    expect((await techC.get(`/api/stops/${stop.id}`)).status).toBe(404);
    expect((await techC.post(`/api/stops/${stop.id}/end`).send({})).status).toBe(404);
    expect((await techC.get('/api/stops')).body).toMatchObject({ items: [], total: 0 });
    expect((await techC.get(`/api/stops?siteId=${world.sites.A.id}`)).body.total).toBe(0);
  });

  it('lets managers and leads read within their scope but never write', async () => {
    const admin = await as('admin@test.example');
    for (const code of ['A', 'B', 'C'] as const)
      await admin
        .post('/api/stops')
        .send({ sawId: world.saws[code]![0]!.id, startedAt: minutesAgo(60), category: 'other' })
        .expect(201);
    const lead = await as('lead-north@test.example');
    const leadSees = (await lead.get('/api/stops')).body.items
      .map((s: { sawAssetTag: string }) => s.sawAssetTag)
      .sort();
    expect(leadSees).toEqual(['A-1', 'B-1']);
    const managerAC = (await (await as('manager-ac@test.example')).get('/api/stops')).body;
    expect(managerAC.items.map((s: { sawAssetTag: string }) => s.sawAssetTag).sort()).toEqual(['A-1', 'C-1']);
    const manager = await as('manager-all@test.example');
    const res = await manager.post('/api/stops').send({ sawId: world.saws.A![1]!.id, category: 'other' });
    expect(res.status).toBe(403);
    expect((await lead.post('/api/stops').send({ sawId: world.saws.A![1]!.id, category: 'other' })).status).toBe(403);
    expect(await count('stops')).toBe(3);
  });

  it('lets only site admins remove a stop (kept, with the reason), and records the removal', async () => {
    const stop = (
      await (
        await as('tech-a@test.example')
      )
        .post('/api/stops')
        .send({ sawId: world.saws.A![0]!.id, category: 'other' })
    ).body;
    expect(
      (await (await as('tech-a@test.example')).delete(`/api/stops/${stop.id}`).send({ reason: 'Entered by mistake' }))
        .status,
    ).toBe(403);
    expect(
      (
        await (
          await as('siteadmin-a@test.example')
        )
          .delete(`/api/stops/${stop.id}`)
          .send({ reason: 'Entered by mistake' })
      ).status,
    ).toBe(204);
    expect(await count('stops')).toBe(0);
    expect(await count(`removed_records WHERE subject = 'Stop' AND reason = 'Entered by mistake'`)).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'Stop' AND action = 'delete'`)).toBe(1);
  });

  it('pages, sorts and filters on the server', async () => {
    const tech = await as('tech-a@test.example');
    const sawId = world.saws.A![0]!.id;
    for (let i = 0; i < 5; i++)
      await tech
        .post('/api/stops')
        .send({
          sawId,
          startedAt: minutesAgo(1000 - i * 100),
          endedAt: minutesAgo(950 - i * 100),
          category: i % 2 ? 'mechanical' : 'electrical',
        })
        .expect(201);
    const page = (await tech.get('/api/stops?limit=2&offset=1&sort=-startedAt')).body;
    expect(page.total).toBe(5);
    expect(page.items).toHaveLength(2);
    expect(Date.parse(page.items[0].startedAt)).toBeGreaterThan(Date.parse(page.items[1].startedAt));
    expect((await tech.get('/api/stops?category=mechanical')).body.total).toBe(2);
    const from = minutesAgo(850);
    expect((await tech.get(`/api/stops?from=${encodeURIComponent(from)}`)).body.total).toBe(3);
    const bad = await tech.get(`/api/stops?from=${encodeURIComponent(from)}&to=${encodeURIComponent(minutesAgo(900))}`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0]).toEqual({ path: 'to', message: 'To must be after From' });
  });
});
