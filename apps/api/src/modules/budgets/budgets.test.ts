import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { bladeSpendAgainstBudget } from '@kerfline/domain/metrics/blade-economics';
import { convertMinor } from '@kerfline/domain/money/currency';
import { signedInAgent, startTestApp, type TestContext } from '../../test-support/test-db.js';
import { PASSWORD } from '../../test-support/fixtures.js';
import { buildFleetFixture, type FleetFixture } from '../../test-support/fleet-fixture.js';
import { abilityFor } from '../../test-support/abilities.js';
import { ExchangeRate, ReportingCurrency } from '../exchange-rates/exchange-rate.model.js';
import { AuditEntry } from '../audit/audit-entry.model.js';
import { getBudgetStatus } from './budgets.service.js';

let ctx: TestContext;
let fx: FleetFixture;
const agents: Record<string, supertest.Agent> = {};

beforeAll(async () => {
  ctx = startTestApp();
  fx = await buildFleetFixture(ctx.sequelize);
  await ReportingCurrency.create({ id: true, currency: 'EUR', setById: null });
  for (const [name, user] of Object.entries(fx.world.users))
    agents[name] = await signedInAgent(ctx.app, user.email, PASSWORD);
});
afterAll(async () => ctx.close());

describe('budgets', () => {
  it('lets administrators and managers set a site’s monthly budget, in the site’s currency, audited', async () => {
    const res = await agents
      .managerAC!.put(`/api/budgets/${fx.world.sites.A.id}/2026-03`)
      .send({ amountMinor: 20_000 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ month: '2026-03', amountMinor: 20_000, currency: 'EUR', setByName: 'manager-ac' });
    const audit = await AuditEntry.findOne({ where: { entity: 'Budget', entityId: res.body.id } });
    expect(audit?.after).toMatchObject({ amountMinor: 20_000 });
    await agents.admin!.put(`/api/budgets/${fx.world.sites.A.id}/2026-04`).send({ amountMinor: 10_000 }).expect(200);
  });

  it('refuses leads and site admins (403), managers outside their sites (404) and bad amounts (400)', async () => {
    const lead = await agents.leadNorth!.put(`/api/budgets/${fx.world.sites.A.id}/2026-03`).send({ amountMinor: 1 });
    expect(lead.status).toBe(403);
    expect(lead.body.error.message).toBe('Only administrators and managers set blade budgets');
    await agents.siteAdminA!.put(`/api/budgets/${fx.world.sites.A.id}/2026-03`).send({ amountMinor: 1 }).expect(403);
    await agents.managerAC!.put(`/api/budgets/${fx.world.sites.B.id}/2026-03`).send({ amountMinor: 1 }).expect(404);
    const bad = await agents.admin!.put(`/api/budgets/${fx.world.sites.A.id}/2026-03`).send({ amountMinor: 12.5 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([
      { path: 'amountMinor', message: 'Budget must be a whole number of minor units (cents)' },
    ]);
    await agents.admin!.put(`/api/budgets/${fx.world.sites.A.id}/2026-13`).send({ amountMinor: 1 }).expect(400);
  });

  it('compares spend with budget month by month and marks a month whose foreign spend has no rate', async () => {
    const res = await agents.leadNorth!.get('/api/budgets?from=2026-03&to=2026-04').expect(200);
    expect(res.body.sites.map((s: { site: { code: string } }) => s.site.code)).toEqual(['A', 'B']);
    const [march, april] = res.body.sites[0].months;
    // March without a USD rate: €65.00 + €70.00 = 13 500 cents counted, US$50.00 left out and the month marked.
    expect(march).toMatchObject({ spentMinor: 13_500, spendComplete: false, varianceMinor: 6500 });
    // The budget set in the first test, with who set it (read in the same statement as the budgets).
    expect(march.budget).toMatchObject({
      month: '2026-03',
      amountMinor: 20_000,
      currency: 'EUR',
      setByName: 'manager-ac',
    });
    expect(res.body.warnings).toEqual(['USD → EUR: no rate for 2026-03']);
    expect(april).toMatchObject({ spentMinor: 7000, spendComplete: true, varianceMinor: 3000, percentUsed: 70 });
    await ExchangeRate.create({
      month: '2026-03-01',
      currency: 'USD',
      reportingCurrency: 'EUR',
      rate: 0.9,
      setById: null,
    });
    const withRate = await agents.leadNorth!.get('/api/budgets?from=2026-03&to=2026-04').expect(200);
    // 13 500 + 5 000 × 0.9 = 18 000; variance 20 000 − 18 000 = 2 000; totals 30 000 budget, 25 000 spent.
    expect(withRate.body.sites[0].months[0]).toMatchObject({
      spentMinor: 18_000,
      spendComplete: true,
      varianceMinor: 2000,
    });
    expect(withRate.body.sites[0]).toMatchObject({ budgetMinor: 30_000, spentMinor: 25_000, varianceMinor: 5000 });
    // Technicians see no budgets at all.
    const tech = await agents.techA!.get('/api/budgets?from=2026-03&to=2026-04').expect(200);
    expect(tech.body.sites).toEqual([]);
  });

  it('projects the month in progress like the domain does from the same blades', async () => {
    // As of 16 March 23:00Z (midnight in Berlin): 16 of March's 743 hours... 384 h gone. Blades put on by then:
    // R2 €65.00 and R5 US$50.00 × 0.9 = €45.00 → 11 000 cents; projected 11 000 × 743 / 384 = 21 283.9 → 21 284.
    const asOf = new Date('2026-03-16T23:00:00Z');
    const status = await getBudgetStatus(
      await abilityFor(fx.world.users.admin.id),
      { from: '2026-03', to: '2026-03' },
      asOf,
    );
    const march = status.sites.find((s) => s.site.code === 'A')!.months[0]!;
    expect(march.spentMinor).toBe(11_000);
    expect(march.projectedMinor).toBe(21_284);
    expect(march.projectedOverBudget).toBe(true);
    // The domain, fed the blades one by one, each in EUR:
    const domain = bladeSpendAgainstBudget({
      currency: 'EUR',
      budgetMinor: 20_000,
      periodStart: '2026-02-28T23:00:00Z',
      periodEnd: '2026-03-31T22:00:00Z',
      asOf,
      spends: [fx.runs.R2, fx.runs.R3, fx.runs.R5].map((r) => ({
        amountMinor: convertMinor({ amountMinor: r.costMinor, from: r.currency, to: 'EUR', rate: 0.9 }),
        currency: 'EUR',
        at: r.installedAt,
      })),
    });
    expect([march.spentMinor, march.projectedMinor, march.percentUsed]).toEqual([
      domain.spentMinor,
      domain.projectedMinor,
      domain.percentUsed,
    ]);
    expect(march.elapsedFraction).toBeCloseTo(384 / 743, 12);
  });
});

describe('exchange rates', () => {
  it('lets administrators enter and correct a month’s rate, audited; others read them', async () => {
    const res = await agents.admin!.put('/api/exchange-rates/USD/2026-04').send({ rate: 0.85 }).expect(200);
    expect(res.body).toMatchObject({ month: '2026-04', currency: 'USD', reportingCurrency: 'EUR', rate: 0.85 });
    await agents.admin!.put('/api/exchange-rates/USD/2026-04').send({ rate: 0.86 }).expect(200);
    const list = await agents.techA!.get('/api/exchange-rates?from=2026-01&to=2026-04').expect(200);
    expect(list.body.reportingCurrency).toBe('EUR');
    expect(list.body.items.map((r: { month: string; rate: number }) => [r.month, r.rate])).toEqual([
      ['2026-04', 0.86],
      ['2026-03', 0.9],
    ]);
    expect(await AuditEntry.count({ where: { entity: 'ExchangeRate' } })).toBe(2);
    const refused = await agents.managerAll!.put('/api/exchange-rates/USD/2026-05').send({ rate: 1 });
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe('Only administrators enter exchange rates');
  });

  it('refuses a rate for the reporting currency itself, a zero rate and a bad month', async () => {
    const self = await agents.admin!.put('/api/exchange-rates/EUR/2026-04').send({ rate: 1 });
    expect(self.status).toBe(400);
    expect(self.body.error.message).toBe('EUR is the reporting currency: it needs no rate');
    const zero = await agents.admin!.put('/api/exchange-rates/USD/2026-04').send({ rate: 0 });
    expect(zero.body.error.details).toEqual([{ path: 'rate', message: 'Rate must be greater than 0' }]);
    await agents.admin!.put('/api/exchange-rates/USD/26-04').send({ rate: 1 }).expect(400);
  });
});
