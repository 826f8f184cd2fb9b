import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { stockStatus } from '@kerfline/domain/stock/reorder';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildRecords, buildWorld, PASSWORD, type Records, type World } from '../../test-support/fixtures.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';

let ctx: TestContext;
let world: World;
let records: Records;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  records = await buildRecords(world);
});

type Summary = {
  siteId: string;
  sawsInUse: number;
  sawsDown: number;
  downSince: string | null;
  bladesOn: number;
  stock: { specs: number; toReorder: number; fewestDaysLeft: number | null; fewestDaysSpecName: string | null } | null;
};
const bySite = (items: Summary[]) => new Map(items.map((s) => [s.siteId, s]));

describe('site summaries for the sites page', () => {
  it('counts saws down now, blades on saws and the spec that runs out first, as the stock page works it out', async () => {
    const admin = await as('admin@test.example');
    const res = await admin.get('/api/site-summaries');
    expect(res.status).toBe(200);
    const a = bySite(res.body.items).get(world.sites.A.id)!;
    // Site A: two saws in use (the retired one left out), one down since yesterday, one carrying a blade.
    expect(a).toMatchObject({ sawsInUse: 2, sawsDown: 1, bladesOn: 1 });
    expect(Date.parse(a.downSince!)).toBeLessThan(Date.now() - 23 * 3_600_000);
    // Fleet spec at A: 5 received, 1 drawn (the removed run's), 2 put on in the last 90 days, lead 10, safety 1.
    const expected = stockStatus({ onHand: 4, usedInWindow: 2, windowDays: 90, leadTimeDays: 10, safetyStock: 1 });
    expect(a.stock).toEqual({
      specs: 1,
      toReorder: expected.reorderNow ? 1 : 0,
      fewestDaysLeft: expected.daysOfStockLeft,
      fewestDaysSpecId: records.fleetSpec.id,
      fewestDaysSpecName: 'Fleet 34x1.1 3/4',
      windowDays: 90,
    });
    const stockPage = (await admin.get(`/api/sites/${world.sites.A.id}/stock`)).body;
    expect(stockPage.items[0].daysOfStockLeft).toBe(a.stock!.fewestDaysLeft);

    const b = bySite(res.body.items).get(world.sites.B.id)!;
    expect(b).toEqual({
      siteId: world.sites.B.id,
      sawsInUse: 2,
      sawsDown: 0,
      downSince: null,
      bladesOn: 0,
      stock: {
        specs: 0,
        toReorder: 0,
        fewestDaysLeft: null,
        fewestDaysSpecId: null,
        fewestDaysSpecName: null,
        windowDays: 90,
      },
    });
  });

  it('says a spec needs reordering once its stock falls to the reorder point', async () => {
    // Four more blades of the fleet spec drawn at A leave none on hand.
    const saw = world.saws.A![1]!;
    const day = 86_400_000;
    for (let i = 0; i < 4; i += 1)
      await BladeRun.create({
        siteId: saw.siteId,
        sawId: saw.id,
        bladeSpecId: records.fleetSpec.id,
        stockReceiptId: records.A.receipt.id,
        installedAt: new Date(Date.now() - (60 - i * 10) * day),
        installedById: null,
        tensionMpa: null,
        materialGroup: null,
        breakInFollowed: null,
        installNotes: null,
        costMinor: 6100,
        currency: 'EUR',
        removedAt: new Date(Date.now() - (55 - i * 10) * day),
        removalReason: 'worn_out',
      });
    const a = bySite((await (await as('siteadmin-a@test.example')).get('/api/site-summaries')).body.items).get(
      world.sites.A.id,
    )!;
    expect(a.stock).toMatchObject({ specs: 1, toReorder: 1, fewestDaysLeft: 0 });
  });

  it('lists only the caller’s sites, and leaves the stock out where they may not read it', async () => {
    const tech = (await (await as('tech-c@test.example')).get('/api/site-summaries')).body.items as Summary[];
    expect(tech.map((s) => s.siteId)).toEqual([world.sites.C.id]);
    expect(tech[0]!.stock?.specs).toBe(1);
    const lead = (await (await as('lead-north@test.example')).get('/api/site-summaries')).body.items as Summary[];
    expect(lead.map((s) => s.siteId).sort()).toEqual([world.sites.A.id, world.sites.B.id].sort());
    const manager = (await (await as('manager-ac@test.example')).get('/api/site-summaries')).body.items as Summary[];
    expect(manager.map((s) => s.siteId).sort()).toEqual([world.sites.A.id, world.sites.C.id].sort());
    const south = (await (await as('admin@test.example')).get(`/api/site-summaries?regionId=${world.regions.south.id}`))
      .body.items as Summary[];
    expect(south.map((s) => s.siteId)).toEqual([world.sites.C.id]);
  });

  it('answers a bad filter with a 400', async () => {
    const res = await (await as('admin@test.example')).get('/api/site-summaries?includeRetired=maybe');
    expect(res.status).toBe(400);
  });
});
