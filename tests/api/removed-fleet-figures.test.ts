import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { signedInAgent, startTestApp, type TestContext } from '../../apps/api/src/test-support/test-db.js';
import { PASSWORD } from '../../apps/api/src/test-support/fixtures.js';
import { buildFleetFixture, type FleetFixture } from '../../apps/api/src/test-support/fleet-fixture.js';
import { ExchangeRate, ReportingCurrency } from '../../apps/api/src/modules/exchange-rates/exchange-rate.model.js';

/**
 * Removing a run and a stop takes them out of every fleet figure (the figures read the live records only; the
 * removed ones sit in `removed_records`), and putting them back brings the figures back exactly.
 * On the fleet fixture: R2 on saw A-1 (5 → 20 March, 3 000 000 mm², 1 200 cuts, €65.00, worn out) and S2 on A-1
 * (blade failure, 10 March 08:00–10:00Z, 2 h, one failure).
 */
let ctx: TestContext;
let fx: FleetFixture;
let siteAdmin: supertest.Agent;
let manager: supertest.Agent;
const Q = 'from=2026-03&to=2026-04';

beforeAll(async () => {
  ctx = startTestApp();
  fx = await buildFleetFixture(ctx.sequelize);
  await ReportingCurrency.create({ id: true, currency: 'EUR', setById: null });
  await ExchangeRate.create({
    month: '2026-03-01',
    currency: 'USD',
    reportingCurrency: 'EUR',
    rate: 0.9,
    setById: null,
  });
  siteAdmin = await signedInAgent(ctx.app, 'siteadmin-a@test.example', PASSWORD);
  manager = await signedInAgent(ctx.app, 'manager-all@test.example', PASSWORD);
});
afterAll(async () => ctx.close());

type Side = {
  spend: { amountMinor: number };
  bladesUsed: number;
  areaCutMm2: number;
  downtimeHours: number;
  failures: number;
  failureDowntimeHours: number;
};

/** Site A's figures for March–April, the fleet's, saw A-1's, and A-1's runs in the period. */
async function figures() {
  const overview = (await manager.get(`/api/fleet/overview?${Q}`).expect(200)).body as {
    sites: { site: { code: string }; current: Side }[];
    fleet: { current: Side };
  };
  const a = overview.sites.find((s) => s.site.code === 'A')!.current;
  const saw = (await manager.get(`/api/fleet/saws/${fx.saws.a1.id}?${Q}`).expect(200)).body;
  const runs = (await manager.get(`/api/fleet/saws/${fx.saws.a1.id}/runs?${Q}&limit=50`).expect(200)).body;
  const pick = (side: Side) => ({
    spend: side.spend.amountMinor,
    blades: side.bladesUsed,
    area: side.areaCutMm2,
    downtime: side.downtimeHours,
    failures: side.failures,
    failureDowntime: side.failureDowntimeHours,
  });
  return {
    siteA: pick(a),
    fleet: pick(overview.fleet.current),
    // Everything but the moment it was worked out.
    saw: JSON.stringify({ ...saw, asOf: null }),
    runIds: (runs.items as { id: string }[]).map((r) => r.id).sort(),
  };
}

describe('the fleet figures leave removed records out, and take them back when they are put back', () => {
  it('drops a removed run and stop from spend, blades, area, downtime and failures, then restores them exactly', async () => {
    const before = await figures();
    expect(before.runIds).toContain(fx.runs.R2.id);

    await siteAdmin.delete(`/api/blade-runs/${fx.runs.R2.id}`).send({ reason: 'Entered on the wrong saw' }).expect(204);
    await siteAdmin.delete(`/api/stops/${fx.stops.S2.id}`).send({ reason: 'Logged twice' }).expect(204);

    const removed = await figures();
    for (const side of ['siteA', 'fleet'] as const) {
      expect(removed[side].spend, side).toBe(before[side].spend - 6500);
      expect(removed[side].blades, side).toBe(before[side].blades - 1);
      expect(removed[side].area, side).toBeCloseTo(before[side].area - 3_000_000, 6);
      expect(removed[side].downtime, side).toBeCloseTo(before[side].downtime - 2, 9);
      expect(removed[side].failures, side).toBe(before[side].failures - 1);
      expect(removed[side].failureDowntime, side).toBeCloseTo(before[side].failureDowntime - 2, 9);
    }
    expect(removed.saw).not.toBe(before.saw);
    expect(removed.runIds).not.toContain(fx.runs.R2.id);
    await manager.get(`/api/fleet/runs/${fx.runs.R2.id}`).expect(404);

    const kept = (await siteAdmin.get('/api/removed-records').expect(200)).body.items as { id: string }[];
    expect(kept).toHaveLength(2);
    for (const record of kept) await siteAdmin.post(`/api/removed-records/${record.id}/restore`).send({}).expect(200);

    const back = await figures();
    expect(back).toEqual(before);
    await manager.get(`/api/fleet/runs/${fx.runs.R2.id}`).expect(200);
  });
});
