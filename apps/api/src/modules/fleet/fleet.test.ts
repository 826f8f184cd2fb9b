import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type supertest from 'supertest';
import { signedInAgent, startTestApp, type TestContext } from '../../test-support/test-db.js';
import { PASSWORD } from '../../test-support/fixtures.js';
import { buildFleetFixture, type FleetFixture } from '../../test-support/fleet-fixture.js';
import { ExchangeRate, ReportingCurrency } from '../exchange-rates/exchange-rate.model.js';
import { Saw } from '../saws/saw.model.js';
import { csvCell } from '../../http/csv.js';

let ctx: TestContext;
let fx: FleetFixture;
const agents: Record<string, supertest.Agent> = {};
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
  for (const [name, user] of Object.entries(fx.world.users))
    agents[name] = await signedInAgent(ctx.app, user.email, PASSWORD);
});
afterAll(async () => ctx.close());

/** Parses a CSV answer back into cells with papaparse (an RFC 4180 reader), dropping the byte-order mark. */
function cells(text: string): string[][] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

describe('GET /api/fleet/overview', () => {
  it('gives each site in scope its period and the one before, the fleet, the months and the rate warnings', async () => {
    const res = await agents.managerAll!.get(`/api/fleet/overview?${Q}`).expect(200);
    expect(res.body.period).toEqual({ from: '2026-03', to: '2026-04' });
    expect(res.body.previous).toEqual({ from: '2026-01', to: '2026-02' });
    expect(res.body.reportingCurrency).toBe('EUR');
    expect(res.body.sites.map((s: { site: { code: string } }) => s.site.code)).toEqual(['A', 'B', 'C']);
    const a = res.body.sites[0];
    // March and April at site A: 18 000 (March, with the USD rate) + 7 000 (April) = 25 000 cents.
    expect(a.current.spend).toEqual({ amountMinor: 25_000, currency: 'EUR', complete: true, missing: [] });
    // April's finished blade was bought in USD and April has no rate: cost per area is withheld and a warning says so.
    expect(a.current.costPerAreaComplete).toBe(false);
    expect(res.body.warnings).toEqual(['USD → EUR: no rate for 2026-04']);
    // Months per site: 3 sites × 2 months.
    expect(res.body.months).toHaveLength(6);
    // A site keeps its mark whatever the filter.
    const only = await agents.managerAll!.get(`/api/fleet/overview?${Q}&sites=${fx.world.sites.C.id}`).expect(200);
    expect(only.body.sites.map((s: { site: { colourIndex: number } }) => s.site.colourIndex)).toEqual([2]);
  });

  it('shows a site with the same mark to everyone who reads it', async () => {
    // The sites were added A, B, C: their marks are 0, 1 and 2 for the manager, who reads them all…
    const mark = (body: { sites: { site: { code: string; colourIndex: number } }[] }) =>
      Object.fromEntries(body.sites.map((s) => [s.site.code, s.site.colourIndex]));
    const manager = await agents.managerAll!.get(`/api/fleet/overview?${Q}`).expect(200);
    expect(mark(manager.body)).toEqual({ A: 0, B: 1, C: 2 });
    // …and C stays 2 for its technician, who reads C alone (it was the first of their list, 0, before).
    const tech = await agents.techC!.get(`/api/fleet/overview?${Q}`).expect(200);
    expect(mark(tech.body)).toEqual({ C: 2 });
    const lead = await agents.leadNorth!.get(`/api/fleet/overview?${Q}`).expect(200);
    expect(mark(lead.body)).toEqual({ A: 0, B: 1 });
    const site = await agents.techC!.get(`/api/fleet/sites/${fx.world.sites.C.id}?${Q}`).expect(200);
    expect(site.body.site.colourIndex).toBe(2);
  });

  it('keeps every figure inside the caller’s scope', async () => {
    const lead = await agents.leadNorth!.get(`/api/fleet/overview?${Q}`).expect(200);
    expect(lead.body.sites.map((s: { site: { code: string } }) => s.site.code)).toEqual(['A', 'B']);
    // The lead's fleet is A + B: C's 9 999 cents and its 948 h are not in it.
    expect(lead.body.fleet.current.spend.amountMinor).toBe(25_000);
    const asked = await agents.leadNorth!.get(`/api/fleet/overview?${Q}&sites=${fx.world.sites.C.id}`).expect(200);
    expect(asked.body.sites).toEqual([]);
    expect(asked.body.fleet.current.bladesUsed).toBe(0);
    const siteAdmin = await agents.siteAdminA!.get(`/api/fleet/overview?${Q}`).expect(200);
    expect(siteAdmin.body.sites.map((s: { site: { code: string } }) => s.site.code)).toEqual(['A']);
  });

  it('counts the fleet’s hours as its sites’, only inside the scope and among the sites asked for', async () => {
    type Side = { scheduledHours: number; downtimeHours: number; failures: number; failureDowntimeHours: number };
    type Body = { sites: { current: Side; previous: Side }[]; fleet: { current: Side; previous: Side } };
    const hours = async (agent: supertest.Agent, query: string) => {
      const body = (await agent.get(`/api/fleet/overview?${query}`).expect(200)).body as Body;
      for (const side of ['current', 'previous'] as const)
        for (const key of ['scheduledHours', 'downtimeHours', 'failures', 'failureDowntimeHours'] as const)
          expect(body.fleet[side][key], `${side} ${key}`).toBeCloseTo(
            body.sites.reduce((t, s) => t + s[side][key], 0),
            9,
          );
      const f = body.fleet.current;
      return [f.scheduledHours, f.downtimeHours, f.failures, f.failureDowntimeHours].map(
        (x) => Math.round(x * 1e6) / 1e6,
      );
    };
    // March and April in Berlin (743 h + 720 h a saw). A: 2 saws all along = 2 926 h; stops 16 h + 26 h; failures
    // 2 + 1; failure downtime 7 h + 26 h. C: C-1 from 12 Mar 08:00Z, C-2 from 12 Mar 00:00Z = 948 h + 1 440 h =
    // 2 388 h; SC 10 h, one failure. B's saws came in only now: no hours.
    expect(await hours(agents.managerAll!, Q)).toEqual([5314, 52, 4, 43]);
    expect(await hours(agents.leadNorth!, Q)).toEqual([2926, 42, 3, 33]);
    expect(await hours(agents.managerAll!, `${Q}&sites=${fx.world.sites.C.id}`)).toEqual([2388, 10, 1, 10]);
    expect(await hours(agents.leadNorth!, `${Q}&sites=${fx.world.sites.C.id}`)).toEqual([0, 0, 0, 0]);
  });

  it('answers a bad period with a 400 that says what to fix', async () => {
    const res = await agents.managerAll!.get('/api/fleet/overview?from=2026-05&to=2026-01').expect(400);
    expect(res.body.error.details).toEqual([{ path: 'to', message: 'The last month must not be before the first' }]);
  });
});

describe('drill-down: site → saw → blade run', () => {
  it('gives a site’s months and saws, a saw’s months and runs, and a run', async () => {
    const site = await agents.managerAll!.get(`/api/fleet/sites/${fx.world.sites.A.id}?${Q}`).expect(200);
    // A-OLD was retired only now, after the period: it is listed with the saws in service then.
    expect(site.body.saws.map((s: { saw: { assetTag: string } }) => s.saw.assetTag)).toEqual(['A-1', 'A-2', 'A-OLD']);
    expect(site.body.saws[0].saw.mainMaterial).toBe('carbon_steel');
    const saw = await agents.managerAll!.get(`/api/fleet/saws/${fx.saws.a1.id}?${Q}`).expect(200);
    // A-1's blades taken off in March and April: R1, R2 worn out; R3 tooth strippage.
    expect(saw.body.removalReasons).toMatchObject({ worn_out: 2, tooth_strippage: 1 });
    const runs = await agents.managerAll!.get(`/api/fleet/saws/${fx.saws.a1.id}/runs?${Q}&limit=2`).expect(200);
    // On the saw at some time in March–April: R1 (taken off 5 Mar), R2, R3, R4 (still on) → 4, newest first.
    expect(runs.body.total).toBe(4);
    expect(runs.body.items.map((r: { id: string }) => r.id)).toEqual([fx.runs.R4.id, fx.runs.R3.id]);
    const run = await agents.managerAll!.get(`/api/fleet/runs/${fx.runs.R3.id}`).expect(200);
    expect(run.body).toMatchObject({ removalReason: 'tooth_strippage', areaCutMm2: 200_000, costMinor: 7000 });
  });

  it('answers 404 for a site, saw or run outside the scope', async () => {
    await agents.leadNorth!.get(`/api/fleet/sites/${fx.world.sites.C.id}?${Q}`).expect(404);
    await agents.leadNorth!.get(`/api/fleet/saws/${fx.saws.c1.id}?${Q}`).expect(404);
    await agents.leadNorth!.get(`/api/fleet/saws/${fx.saws.c1.id}/runs?${Q}`).expect(404);
    await agents.leadNorth!.get(`/api/fleet/runs/${fx.runs.RC.id}`).expect(404);
    await agents.siteAdminA!.get(`/api/fleet/sites/${fx.world.sites.B.id}?${Q}`).expect(404);
    await agents.techC!.get(`/api/fleet/runs/${fx.runs.R1.id}`).expect(404);
  });
});

describe('CSV exports', () => {
  it('exports the overview’s tables scoped like the screen, in the asked units', async () => {
    const res = await agents.leadNorth!.get(`/api/fleet/overview/export?${Q}&table=months&units=imperial`).expect(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toBe('attachment; filename="fleet-months-2026-03-2026-04.csv"');
    expect(res.headers['x-row-count']).toBe('4');
    const rows = cells(res.text);
    expect(rows[0]).toContain('Area cut (ft²)');
    expect(rows[0]).toContain('Cost per area (EUR/in²)');
    expect(rows.slice(1).map((r) => r[0])).toEqual(['A', 'A', 'B', 'B']);
    // Site A, March: 4 200 000 mm² = 45.208… ft² (1 ft² = 92 903.04 mm²); spend €180.00.
    const march = rows.find((r) => r[0] === 'A' && r[2] === '2026-03')!;
    const header = rows[0]!;
    expect(Number(march[header.indexOf('Area cut (ft²)')])).toBeCloseTo(4_200_000 / 92_903.04, 9);
    expect(Number(march[header.indexOf('Blade spend (EUR)')])).toBe(180);
  });

  it('streams a saw’s runs with the row count up front, and refuses technicians', async () => {
    const res = await agents.siteAdminA!.get(`/api/fleet/saws/${fx.saws.a1.id}/export?${Q}&table=runs`).expect(200);
    expect(res.headers['x-row-count']).toBe('4');
    expect(cells(res.text)).toHaveLength(5);
    const refused = await agents.techA!.get(`/api/fleet/saws/${fx.saws.a1.id}/export?${Q}&table=runs`).expect(403);
    expect(refused.body.error.message).toMatch(/does not export/);
    await agents.leadNorth!.get(`/api/fleet/saws/${fx.saws.c1.id}/export?${Q}&table=runs`).expect(404);
  });

  it('neutralises formulas (OWASP) and quotes per RFC 4180, so a spreadsheet reads text as text', async () => {
    const names = [
      '=HYPERLINK("http://x","y")',
      '+1+2',
      '-3',
      '@SUM(A1)',
      '\tTabbed',
      '\rCarriage',
      'Comma, "quoted"\nline',
    ];
    expect(names.map(csvCell)).toEqual([
      `"'=HYPERLINK(""http://x"",""y"")"`,
      `"'+1+2"`,
      `"'-3"`,
      `"'@SUM(A1)"`,
      `"'\tTabbed"`,
      `"'\rCarriage"`,
      `"Comma, ""quoted""\nline"`,
    ]);
    // Numbers the product computed stay numbers, negative ones included; empty for nothing.
    expect([csvCell(-12.5), csvCell(0), csvCell(null), csvCell(true)]).toEqual(['-12.5', '0', '', 'yes']);
    // Through a real export: a saw named like a formula comes back as text with its apostrophe.
    await Saw.update({ name: names[0]! }, { where: { id: fx.saws.a2.id } });
    const res = await agents.managerAll!.get(`/api/fleet/sites/${fx.world.sites.A.id}/export?${Q}&table=saws`);
    const row = cells(res.text).find((r) => r[1] === 'A-2')!;
    expect(row[2]).toBe(`'${names[0]}`);
    await Saw.update({ name: 'Test bar saw' }, { where: { id: fx.saws.a2.id } });
  });
});
