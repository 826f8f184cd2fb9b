import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import sharp from 'sharp';
import pg from 'pg';
import { startTestApp, signedInAgent, testDatabaseUrl, type TestContext } from '../../test-support/test-db.js';
import { eventually } from '../../test-support/mail.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
let specId: string;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const count = async (from: string) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${from}`, { plain: true }))!.n as number;
const REASON = { reason: 'Logged on the wrong saw' };

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  specId = (await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(null, { name: 'Fleet 34' })))
    .body.id;
});

const png = () =>
  sharp({ create: { width: 64, height: 48, channels: 3, background: '#777' } })
    .png()
    .toBuffer();

const onHand = async (agent: supertest.Agent) =>
  (await agent.get(`/api/sites/${world.sites.A.id}/stock`)).body.items.find(
    (l: { bladeSpec: { id: string } }) => l.bladeSpec.id === specId,
  )?.onHand as number;

/** A run at site A drawn from stock, taken off, with a photo, a cut log during it and a recorded check. */
async function runWithEverything() {
  const siteAdmin = await as('siteadmin-a@test.example');
  const tech = await as('tech-a@test.example');
  const sawId = world.saws.A![0]!.id;
  await siteAdmin
    .post('/api/stock-receipts')
    .send({ siteId: world.sites.A.id, bladeSpecId: specId, quantity: 2, unitCostMinor: 5900, receivedOn: '2026-01-05' })
    .expect(201);
  const run = (await tech.post('/api/blade-runs').send({ sawId, bladeSpecId: specId, installedAt: minutesAgo(300) }))
    .body.run;
  const cutLog = (
    await tech
      .post('/api/cut-logs')
      .send({
        sawId,
        cutAt: minutesAgo(200),
        stock: { shape: { kind: 'square_bar', sideMm: 50 } },
        materialGroup: 'carbon_steel',
      })
      .expect(201)
  ).body;
  const photo = (
    await tech
      .post(`/api/blade-runs/${run.id}/photos`)
      .field('caption', 'Teeth gone')
      .attach('photo', await png(), 'a.png')
  ).body;
  await tech
    .post(`/api/blade-runs/${run.id}/remove`)
    .send({ removedAt: minutesAgo(100), reason: 'tooth_strippage' })
    .expect(200);
  return { siteAdmin, tech, sawId, run, cutLog, photo };
}

describe('removing a record keeps it, and putting it back restores it whole', () => {
  it('takes a run with its photo out of lists, stock and the timeline, and puts it back with the same ids', async () => {
    const { siteAdmin, tech, sawId, run, cutLog, photo } = await runWithEverything();
    expect(cutLog.bladeRunId).toBe(run.id);
    expect(await onHand(tech)).toBe(1);

    expect((await siteAdmin.delete(`/api/blade-runs/${run.id}`).send(REASON)).status).toBe(204);
    // Gone from the live records: lists, by id, photos, the saw's timeline; its blade is back in stock.
    expect((await tech.get(`/api/blade-runs?sawId=${sawId}`)).body.total).toBe(0);
    expect((await tech.get(`/api/blade-runs/${run.id}`)).status).toBe(404);
    expect((await tech.get(photo.imageUrl)).status).toBe(404);
    expect((await tech.get(`/api/saws/${sawId}/timeline`)).body.items).toEqual([]);
    expect(await onHand(tech)).toBe(2);
    // The cut log stays (the cuts happened), without its run.
    expect((await tech.get(`/api/cut-logs/${cutLog.id}`)).body.bladeRunId).toBeNull();

    const listed = (await siteAdmin.get(`/api/removed-records?siteId=${world.sites.A.id}`)).body;
    expect(listed.total).toBe(1);
    const kept = listed.items[0];
    expect(kept).toMatchObject({
      subject: 'BladeRun',
      recordId: run.id,
      sawId,
      sawAssetTag: 'A-1',
      what: 'Fleet 34 (taken off: tooth strippage)',
      photoCount: 1,
      reason: REASON.reason,
      removedByName: 'siteadmin-a',
    });
    expect(kept.occurredAt).toBe(run.installedAt);
    expect(kept.endedAt).not.toBeNull();
    const removal = (await siteAdmin.get(`/api/audit?entity=RemovedRecord&entityId=${kept.id}`)).body.items;
    expect(removal.map((e: { action: string }) => e.action)).toEqual(['create']);
    expect(removal[0].after).toMatchObject({ subject: 'BladeRun', recordId: run.id, reason: REASON.reason });
    const runEntries = (await siteAdmin.get(`/api/audit?entity=BladeRun&entityId=${run.id}`)).body.items;
    expect(runEntries[0]).toMatchObject({ action: 'delete', before: { id: run.id, removalReason: 'tooth_strippage' } });

    const back = await siteAdmin.post(`/api/removed-records/${kept.id}/restore`).send({});
    expect(back.status).toBe(200);
    expect(back.body).toEqual({
      subject: 'BladeRun',
      recordId: run.id,
      siteId: world.sites.A.id,
      sawId,
      photoCount: 1,
    });
    const again = (await tech.get(`/api/blade-runs/${run.id}`)).body;
    expect(again).toMatchObject({
      id: run.id,
      installedAt: run.installedAt,
      removalReason: 'tooth_strippage',
      stockReceiptId: run.stockReceiptId,
      photoCount: 1,
    });
    expect((await tech.get(photo.imageUrl)).status).toBe(200);
    expect((await tech.get(`/api/blade-runs/${run.id}/photos`)).body.map((p: { id: string }) => p.id)).toEqual([
      photo.id,
    ]);
    expect((await tech.get(`/api/cut-logs/${cutLog.id}`)).body.bladeRunId).toBe(run.id);
    expect((await tech.get(`/api/saws/${sawId}/timeline`)).body.items.map((e: { id: string }) => e.id)).toEqual([
      run.id,
    ]);
    expect(await onHand(tech)).toBe(1);
    expect((await siteAdmin.get('/api/removed-records')).body.total).toBe(0);
    expect(await count('removed_photo_blobs')).toBe(0);
    const restored = (await siteAdmin.get(`/api/audit?entity=BladeRun&entityId=${run.id}`)).body.items[0];
    expect(restored).toMatchObject({ action: 'restore', after: { id: run.id } });
    expect(await count(`audit_entries WHERE entity = 'Photo' AND action = 'restore'`)).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'RemovedRecord' AND action = 'delete'`)).toBe(1);
  });

  it('requires a reason, from the body or the query', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const stop = (await siteAdmin.post('/api/stops').send({ sawId: world.saws.A![0]!.id, category: 'other' })).body;
    const bare = await siteAdmin.delete(`/api/stops/${stop.id}`);
    expect(bare.status).toBe(400);
    expect(bare.body.error.details).toEqual([{ path: 'reason', message: 'Say why this record is being removed' }]);
    expect((await siteAdmin.delete(`/api/stops/${stop.id}`).send({ reason: '   ' })).status).toBe(400);
    expect(await count('stops')).toBe(1);
    expect((await siteAdmin.delete(`/api/stops/${stop.id}?reason=Test%20entry`)).status).toBe(204);
    expect((await siteAdmin.get('/api/removed-records')).body.items[0].reason).toBe('Test entry');
  });

  it('refuses to put a stop back over a stop entered since, naming it, and changes nothing', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const sawId = world.saws.A![0]!.id;
    const stop = (
      await siteAdmin
        .post('/api/stops')
        .send({ sawId, startedAt: minutesAgo(120), endedAt: minutesAgo(60), category: 'hydraulic' })
    ).body;
    await siteAdmin.delete(`/api/stops/${stop.id}`).send(REASON).expect(204);
    const newer = (
      await siteAdmin
        .post('/api/stops')
        .send({ sawId, startedAt: minutesAgo(90), endedAt: minutesAgo(30), category: 'electrical' })
    ).body;
    const kept = (await siteAdmin.get('/api/removed-records?subject=Stop')).body.items[0];
    const audits = await count('audit_entries');

    const refused = await siteAdmin.post(`/api/removed-records/${kept.id}/restore`).send({});
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain(`It would overlap stop ${newer.id} (electrical`);
    expect(refused.body.error.message).toMatch(/change or remove that stop first/);
    expect((await siteAdmin.get(`/api/stops/${stop.id}`)).status).toBe(404);
    expect((await siteAdmin.get('/api/removed-records')).body.total).toBe(1);
    expect(await count('audit_entries')).toBe(audits);

    // With the newer stop removed too, it fits again.
    await siteAdmin.delete(`/api/stops/${newer.id}`).send(REASON).expect(204);
    expect((await siteAdmin.post(`/api/removed-records/${kept.id}/restore`).send({})).status).toBe(200);
    expect((await siteAdmin.get(`/api/stops/${stop.id}`)).body).toMatchObject({ id: stop.id, category: 'hydraulic' });
  });

  it('refuses when the saw is retired, the spec archived or the delivery drawn out, saying what to do', async () => {
    const { siteAdmin, tech, sawId, run } = await runWithEverything();
    await siteAdmin.delete(`/api/blade-runs/${run.id}`).send(REASON).expect(204);
    const kept = (await siteAdmin.get('/api/removed-records')).body.items[0];
    const restore = () => siteAdmin.post(`/api/removed-records/${kept.id}/restore`).send({});

    await siteAdmin.post(`/api/saws/${sawId}/retire`).send({}).expect(200);
    expect((await restore()).body.error.message).toMatch(/Saw A-1 is retired; bring it back into service first/);
    await siteAdmin.post(`/api/saws/${sawId}/restore`).send({}).expect(200);

    const admin = await as('admin@test.example');
    await admin.patch(`/api/blade-specs/${specId}`).send({ archived: true }).expect(200);
    expect((await restore()).body.error.message).toMatch(/Blade spec Fleet 34 is archived; offer it again first/);
    await admin.patch(`/api/blade-specs/${specId}`).send({ archived: false }).expect(200);

    // The delivery's last two blades go on the saws meanwhile.
    for (const saw of [world.saws.A![1]!.id, sawId])
      await tech.post('/api/blade-runs').send({ sawId: saw, bladeSpecId: specId }).expect(201);
    const drawn = await restore();
    expect(drawn.status).toBe(409);
    expect(drawn.body.error.message).toMatch(
      /Every blade of the delivery it was drawn from \(received 2026-01-05, 2 blades\)/,
    );
    expect(await count(`removed_records`)).toBe(1);
  });

  it('puts a photo back only once its run is back, and a recorded check with its photo', async () => {
    const { siteAdmin, tech, sawId, run, photo } = await runWithEverything();
    await siteAdmin.delete(`/api/photos/${photo.id}`).send(REASON).expect(204);
    await siteAdmin.delete(`/api/blade-runs/${run.id}`).send(REASON).expect(204);
    const page = (await siteAdmin.get('/api/removed-records')).body.items;
    const [keptRun, keptPhoto] = page;
    expect(keptRun.subject).toBe('BladeRun');
    expect(keptRun.photoCount).toBe(0);
    expect(keptPhoto).toMatchObject({
      subject: 'Photo',
      recordId: photo.id,
      sawId,
      what: 'Photo of a blade run: Teeth gone',
    });
    const early = await siteAdmin.post(`/api/removed-records/${keptPhoto.id}/restore`).send({});
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/The blade run it belongs to was removed too .*; put that back first/);
    await siteAdmin.post(`/api/removed-records/${keptRun.id}/restore`).send({}).expect(200);
    await siteAdmin.post(`/api/removed-records/${keptPhoto.id}/restore`).send({}).expect(200);
    expect((await tech.get(photo.thumbnailUrl)).status).toBe(200);

    const checks = (await tech.get(`/api/sites/${world.sites.A.id}/checks`)).body.items;
    const chipBrush = checks.find((c: { targetRule: string }) => c.targetRule === 'chip_brush');
    const record = (
      await tech.post('/api/check-records').send({
        sawId,
        siteCheckId: chipBrush.id,
        checkedAt: minutesAgo(10),
        answers: { reachesGullets: true, worn: false },
      })
    ).body;
    expect(record.id).toBeDefined();
    await tech
      .post(`/api/check-records/${record.id}/photos`)
      .attach('photo', await png(), 'b.png')
      .expect(201);
    await siteAdmin.delete(`/api/check-records/${record.id}`).send(REASON).expect(204);
    expect((await tech.get(`/api/check-records/${record.id}`)).status).toBe(404);
    const keptCheck = (await siteAdmin.get('/api/removed-records?subject=CheckRecord')).body.items[0];
    expect(keptCheck).toMatchObject({ recordId: record.id, photoCount: 1 });
    expect(keptCheck.what).toMatch(/: passed$/);
    await siteAdmin.post(`/api/removed-records/${keptCheck.id}/restore`).send({}).expect(200);
    expect((await tech.get(`/api/check-records/${record.id}`)).body).toMatchObject({ id: record.id, photoCount: 1 });
  });

  it('gives one success and one 409 when two people put the same record back at once', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const admin = await as('admin@test.example');
    const stop = (await siteAdmin.post('/api/stops').send({ sawId: world.saws.A![1]!.id, category: 'mechanical' }))
      .body;
    await siteAdmin.delete(`/api/stops/${stop.id}`).send(REASON).expect(204);
    const kept = (await siteAdmin.get('/api/removed-records')).body.items[0];
    // "At once" made sure of: the kept row is held locked until both requests wait for it. Sent merely side by
    // side, the first could finish before the second looked, which then found nothing to put back (404).
    const holder = new pg.Client({ connectionString: testDatabaseUrl() });
    await holder.connect();
    try {
      await holder.query('BEGIN');
      await holder.query('SELECT id FROM removed_records WHERE id = $1 FOR UPDATE', [kept.id]);
      const requests = [siteAdmin, admin].map((agent) =>
        agent
          .post(`/api/removed-records/${kept.id}/restore`)
          .send({})
          .then((res) => res),
      );
      // Read outside the holder's transaction, which would see the same snapshot of the activity throughout.
      await eventually(
        async () =>
          (await count(
            `pg_stat_activity WHERE wait_event_type = 'Lock' AND query ILIKE '%removed_records%FOR UPDATE%'`,
          )) === 2,
        'both requests wait for the kept row',
      );
      await holder.query('ROLLBACK');
      const answers = await Promise.all(requests);
      expect(answers.map((a) => a.status).sort()).toEqual([200, 409]);
    } finally {
      await holder.end();
    }
    expect(await count('stops')).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'Stop' AND action = 'restore'`)).toBe(1);
  });
});

describe('who sees and puts back removed records', () => {
  it('shows them only to admins and the site’s admin; a technician can neither remove nor put back', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const admin = await as('admin@test.example');
    const techA = await as('tech-a@test.example');
    const stopA = (await techA.post('/api/stops').send({ sawId: world.saws.A![0]!.id, category: 'other' })).body;
    expect((await techA.delete(`/api/stops/${stopA.id}`).send(REASON)).status).toBe(403);
    await siteAdmin.delete(`/api/stops/${stopA.id}`).send(REASON).expect(204);
    const techC = await as('tech-c@test.example');
    const stopC = (await techC.post('/api/stops').send({ sawId: world.saws.C![0]!.id, category: 'other' })).body;
    await admin.delete(`/api/stops/${stopC.id}`).send(REASON).expect(204);

    expect((await admin.get('/api/removed-records')).body.total).toBe(2);
    const own = (await siteAdmin.get('/api/removed-records')).body;
    expect(own.items.map((r: { recordId: string }) => r.recordId)).toEqual([stopA.id]);
    const keptC = (await admin.get(`/api/removed-records?siteId=${world.sites.C.id}`)).body.items[0];
    const keptA = own.items[0];
    expect((await siteAdmin.get(`/api/removed-records?siteId=${world.sites.C.id}`)).body.total).toBe(0);
    expect((await siteAdmin.get(`/api/removed-records/${keptC.id}`)).status).toBe(404);
    expect((await siteAdmin.post(`/api/removed-records/${keptC.id}/restore`).send({})).status).toBe(404);

    for (const email of ['tech-a@test.example', 'manager-all@test.example', 'lead-north@test.example']) {
      const agent = await as(email);
      expect((await agent.get('/api/removed-records')).body.total, email).toBe(0);
      expect((await agent.get(`/api/removed-records/${keptA.id}`)).status, email).toBe(404);
      expect((await agent.post(`/api/removed-records/${keptA.id}/restore`).send({})).status, email).toBe(404);
    }
    expect(await count('stops')).toBe(0);
    expect((await siteAdmin.get(`/api/removed-records/${keptA.id}`)).body).toMatchObject({
      subject: 'Stop',
      what: 'Other',
    });
    expect((await admin.get('/api/removed-records?subject=Nothing')).status).toBe(400);
  });

  it('pages on the server, newest removal first', async () => {
    const siteAdmin = await as('siteadmin-a@test.example');
    const sawId = world.saws.A![0]!.id;
    for (const n of [5, 4, 3]) {
      const stop = (
        await siteAdmin
          .post('/api/stops')
          .send({ sawId, startedAt: minutesAgo(n * 60), endedAt: minutesAgo(n * 60 - 10), category: 'other' })
      ).body;
      await siteAdmin
        .delete(`/api/stops/${stop.id}`)
        .send({ reason: `slip ${n}` })
        .expect(204);
    }
    const first = (await siteAdmin.get('/api/removed-records?limit=2')).body;
    expect(first).toMatchObject({ total: 3, limit: 2, offset: 0 });
    expect(first.items.map((r: { reason: string }) => r.reason)).toEqual(['slip 3', 'slip 4']);
    const second = (await siteAdmin.get('/api/removed-records?limit=2&offset=2')).body;
    expect(second.items.map((r: { reason: string }) => r.reason)).toEqual(['slip 5']);
  });
});
