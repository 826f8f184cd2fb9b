import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
let specId: string;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const count = async (table: string) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${table}`, { plain: true }))!.n as number;
const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000).toISOString().slice(0, 10);

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  specId = (await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(null, { name: 'Fleet 34' })))
    .body.id;
});

const receive = (agent: supertest.Agent, extra: Record<string, unknown> = {}) =>
  agent.post('/api/stock-receipts').send({
    siteId: world.sites.A.id,
    bladeSpecId: specId,
    quantity: 3,
    unitCostMinor: 5900,
    receivedOn: daysAgo(20),
    reference: 'DN-4471',
    ...extra,
  });

describe('receiving blades into stock', () => {
  it('lets a site admin receive stock at their site, in the site’s currency unless named', async () => {
    const admin = await as('siteadmin-a@test.example');
    const res = await receive(admin);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      siteId: world.sites.A.id,
      bladeSpecId: specId,
      bladeSpecName: 'Fleet 34',
      quantity: 3,
      drawn: 0,
      unitCostMinor: 5900,
      currency: 'EUR',
      reference: 'DN-4471',
      notes: null,
    });
    expect((await receive(admin, { currency: 'usd' })).body.currency).toBe('USD');
    const audit = (await admin.get(`/api/audit?entity=StockReceipt&entityId=${res.body.id}`)).body;
    expect(audit.items[0]).toMatchObject({ action: 'create', siteId: world.sites.A.id });
  });

  it('refuses technicians, managers and other sites, and bad figures, writing nothing', async () => {
    expect((await receive(await as('tech-a@test.example'))).status).toBe(403);
    expect((await receive(await as('manager-all@test.example'))).status).toBe(403);
    const other = await receive(await as('siteadmin-a@test.example'), { siteId: world.sites.B.id });
    expect(other.status).toBe(400);
    expect(other.body.error.details).toEqual([{ path: 'siteId', message: 'choose one of your sites' }]);
    const bad = await receive(await as('siteadmin-a@test.example'), {
      quantity: -2,
      unitCostMinor: 12.5,
      receivedOn: new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10),
    });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([
      { path: 'quantity', message: 'Quantity must be at least 1 blade' },
      { path: 'unitCostMinor', message: 'Unit cost must be a whole number of minor units (e.g. cents)' },
      { path: 'receivedOn', message: 'Received on must not be in the future' },
    ]);
    const absurd = await receive(await as('siteadmin-a@test.example'), { quantity: 250000 });
    expect(absurd.body.error.details[0].message).toBe('Quantity must be at most 10000 blades');
    const specC = (await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(world.sites.C.id)))
      .body.id;
    const wrongSpec = await receive(await as('admin@test.example'), { bladeSpecId: specC });
    expect(wrongSpec.status).toBe(400);
    expect(await count('stock_receipts')).toBe(0);
  });
});

describe('stock on hand, days left and reorder point', () => {
  it('draws installed blades first in, first out, at the receipt’s cost, and works out the stock in SQL', async () => {
    const admin = await as('siteadmin-a@test.example');
    const older = (await receive(admin, { quantity: 1, unitCostMinor: 5000, receivedOn: daysAgo(40) })).body;
    const newer = (await receive(admin, { quantity: 4, unitCostMinor: 6000, receivedOn: daysAgo(10) })).body;
    const tech = await as('tech-a@test.example');
    const first = (
      await tech
        .post('/api/blade-runs')
        .send({ sawId: world.saws.A![0]!.id, bladeSpecId: specId, installedAt: minutesAgo(600) })
    ).body;
    expect(first.run).toMatchObject({ stockReceiptId: older.id, costMinor: 5000 });
    expect(first.warnings).toEqual([]);
    const second = (await tech.post('/api/blade-runs').send({ sawId: world.saws.A![1]!.id, bladeSpecId: specId })).body;
    expect(second.run).toMatchObject({ stockReceiptId: newer.id, costMinor: 6000 });

    const stock = (await tech.get(`/api/sites/${world.sites.A.id}/stock?windowDays=30`)).body;
    expect(stock.windowDays).toBe(30);
    const [line] = stock.items;
    // 5 received − 2 drawn = 3 on hand; 2 used in 30 days → 1/15 blade a day, 45 days left;
    // ROP = d × L + SS = (2/30) × 14 + 0 = 0.933 blades (Heizer, Render & Munson); 3 > 0.93, no reorder.
    expect(line).toMatchObject({
      received: 5,
      drawn: 2,
      onHand: 3,
      usedInWindow: 2,
      leadTimeDays: 14,
      safetyStock: 0,
      levelsSetAt: null,
    });
    expect(line.bladeSpec).toMatchObject({ id: specId, name: 'Fleet 34' });
    expect(line.dailyUsage).toBeCloseTo(2 / 30, 12);
    expect(line.daysOfStockLeft).toBeCloseTo(45, 9);
    expect(line.reorderPoint).toBeCloseTo(28 / 30, 12);
    expect(line.reorderNow).toBe(false);

    const levels = await admin
      .put(`/api/sites/${world.sites.A.id}/stock/${specId}/levels`)
      .send({ leadTimeDays: 30, safetyStock: 2 });
    expect(levels.status).toBe(200);
    // With the site's default 90-day window: d = 2/90; ROP = (2/90) × 30 + 2 = 2.67; 3 on hand → not yet.
    expect(levels.body).toMatchObject({
      leadTimeDays: 30,
      safetyStock: 2,
      levelsSetByName: 'siteadmin-a',
      reorderNow: false,
    });
    expect(levels.body.reorderPoint).toBeCloseTo((2 / 90) * 30 + 2, 12);
    await admin
      .put(`/api/sites/${world.sites.A.id}/stock/${specId}/levels`)
      .send({ leadTimeDays: 60, safetyStock: 2 })
      .expect(200);
    const urgent = (await tech.get(`/api/sites/${world.sites.A.id}/stock`)).body.items[0];
    expect(urgent.reorderNow).toBe(true);
    expect(urgent.reason).toMatch(/^Reorder now/);
    expect(await count(`audit_entries WHERE entity = 'StockLevel'`)).toBe(2);
    expect(
      (
        await tech
          .put(`/api/sites/${world.sites.A.id}/stock/${specId}/levels`)
          .send({ leadTimeDays: 1, safetyStock: 0 })
      ).status,
    ).toBe(403);

    const moves = (await tech.get(`/api/sites/${world.sites.A.id}/stock/movements`)).body;
    expect(moves.total).toBe(4);
    expect(moves.items.map((m: { kind: string; quantity: number }) => `${m.kind}${m.quantity}`)).toEqual([
      'draw-1',
      'draw-1',
      'receipt4',
      'receipt1',
    ]);
    expect(moves.items[0]).toMatchObject({ sawAssetTag: 'A-2', stockReceiptId: newer.id, unitCostMinor: 6000 });
  });

  it('never draws the last blade twice when two blades go on at once', async () => {
    const admin = await as('siteadmin-a@test.example');
    const last = (await receive(admin, { quantity: 1 })).body;
    const [a, b] = await Promise.all([as('tech-a@test.example'), as('siteadmin-a@test.example')]);
    const results = await Promise.all([
      a.post('/api/blade-runs').send({ sawId: world.saws.A![0]!.id, bladeSpecId: specId }),
      b.post('/api/blade-runs').send({ sawId: world.saws.A![1]!.id, bladeSpecId: specId }),
    ]);
    expect(results.map((r) => r.status)).toEqual([201, 201]);
    const fromStock = results.filter((r) => r.body.run.stockReceiptId === last.id);
    expect(fromStock).toHaveLength(1);
    expect(
      results.filter((r) => r.body.warnings.some((w: { code: string }) => w.code === 'not_from_stock')),
    ).toHaveLength(1);
    expect((await admin.get(`/api/sites/${world.sites.A.id}/stock`)).body.items[0].onHand).toBe(0);
  });

  it('keeps a receipt’s blades on saws: its quantity cannot fall below them and it cannot be deleted', async () => {
    const admin = await as('siteadmin-a@test.example');
    const receipt = (await receive(admin, { quantity: 2 })).body;
    await (
      await as('tech-a@test.example')
    )
      .post('/api/blade-runs')
      .send({ sawId: world.saws.A![0]!.id, bladeSpecId: specId })
      .expect(201);
    const less = await admin.patch(`/api/stock-receipts/${receipt.id}`).send({ quantity: 0 });
    expect(less.status).toBe(400);
    const below = await admin.patch(`/api/stock-receipts/${receipt.id}`).send({ quantity: 1, reference: 'DN-1' });
    expect(below.status).toBe(200);
    expect(below.body).toMatchObject({ quantity: 1, drawn: 1, reference: 'DN-1' });
    const other = (await (await as('admin@test.example')).post('/api/blade-specs').send(specBody(null))).body.id;
    const respec = await admin.patch(`/api/stock-receipts/${receipt.id}`).send({ bladeSpecId: other });
    expect(respec.status).toBe(409);
    expect(respec.body.error.message).toMatch(/cannot change/);
    await ctx.sequelize.query(`UPDATE blade_runs SET removed_at = now(), removal_reason = 'other'`);
    const tooFew = await admin.patch(`/api/stock-receipts/${receipt.id}`).send({ quantity: 1 });
    expect(tooFew.status).toBe(200);
    const del = await admin.delete(`/api/stock-receipts/${receipt.id}`);
    expect(del.status).toBe(409);
    expect(del.body.error.message).toMatch(/already on saws; correct its quantity/);
    const unused = (await receive(admin)).body;
    expect((await admin.delete(`/api/stock-receipts/${unused.id}`)).status).toBe(204);
  });

  it('shows a site’s stock to those who may read the site’s records, and to no one else', async () => {
    await receive(await as('siteadmin-a@test.example'));
    expect((await (await as('tech-c@test.example')).get(`/api/sites/${world.sites.A.id}/stock`)).status).toBe(404);
    expect((await (await as('tech-c@test.example')).get(`/api/sites/${world.sites.A.id}/stock/movements`)).status).toBe(
      404,
    );
    expect((await (await as('tech-c@test.example')).get('/api/stock-receipts')).body.total).toBe(0);
    expect(
      (await (await as('lead-north@test.example')).get(`/api/sites/${world.sites.A.id}/stock`)).body.items,
    ).toHaveLength(1);
    expect((await (await as('manager-ac@test.example')).get(`/api/sites/${world.sites.A.id}/stock`)).status).toBe(200);
    expect((await (await as('manager-ac@test.example')).get(`/api/sites/${world.sites.B.id}/stock`)).status).toBe(404);
  });
});
