import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { reliabilityMetrics } from '@kerfline/domain/metrics/reliability';
import { downtimeHours } from '@kerfline/domain/metrics/downtime';
import { bladeLife, costPerAreaCut } from '@kerfline/domain/metrics/blade-economics';
import { DOWNTIME_CATEGORIES } from '@kerfline/domain/metrics/schema';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import { startTestApp, type TestContext } from '../../test-support/test-db.js';
import { FLEET_AS_OF, buildFleetFixture, type FleetFixture } from '../../test-support/fleet-fixture.js';
import { abilityFor } from '../../test-support/abilities.js';
import { ExchangeRate } from '../exchange-rates/exchange-rate.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { Stop } from '../stops/stop.model.js';
import { Saw } from '../saws/saw.model.js';
import { moneyRows, rawFigures, type Bucket, type Level } from './fleet-figures.js';
import { assembleFigures, indexRaw, withStopsOf } from './assemble.js';
import { rateLookup } from '../exchange-rates/rates.js';

let ctx: TestContext;
let fx: FleetFixture;
const abilities: Record<string, AppAbility> = {};

const MARCH: Bucket = { key: '2026-03', from: '2026-03', to: '2026-03' };
const APRIL: Bucket = { key: '2026-04', from: '2026-04', to: '2026-04' };
/** Berlin's March and April in UTC (worked out by hand: CET is UTC+1, CEST from 29 March is UTC+2). */
const BOUNDS = {
  '2026-03': [new Date('2026-02-28T23:00:00Z'), new Date('2026-03-31T22:00:00Z')],
  '2026-04': [new Date('2026-03-31T22:00:00Z'), new Date('2026-04-30T22:00:00Z')],
} as const;

beforeAll(async () => {
  ctx = startTestApp();
  fx = await buildFleetFixture(ctx.sequelize);
  for (const [name, user] of Object.entries(fx.world.users)) abilities[name] = await abilityFor(user.id);
});
afterAll(async () => ctx.close());

const allSites = () => Object.values(fx.world.sites).map((s) => s.id);

async function figures(who: string, level: Level, buckets: Bucket[], reporting = 'EUR') {
  const scope = { ability: abilities[who]!, siteIds: allSites(), asOf: FLEET_AS_OF };
  const [rows, money] = await Promise.all([
    rawFigures(ctx.sequelize, level, scope, buckets),
    moneyRows(ctx.sequelize, level, scope, '2026-01', '2026-06'),
  ]);
  const rates = await rateLookup(abilities[who]!, reporting, '2026-01', '2026-06');
  const raw = indexRaw(rows);
  return {
    rows,
    of: (groupId: string, bucket: Bucket) =>
      assembleFigures(raw(groupId, bucket.key), money, level === 'fleet' ? null : groupId, [bucket.from], {
        reporting,
        rateOf: rates,
      }),
  };
}

describe('fleet figures on a hand-built fixture (numbers worked out by hand)', () => {
  it('site A in March 2026: blades, money, life, stops and reliability', async () => {
    await ExchangeRate.create({
      month: '2026-03-01',
      currency: 'USD',
      reportingCurrency: 'EUR',
      rate: 0.9,
      setById: null,
    });
    const f = (await figures('admin', 'site', [MARCH])).of(fx.world.sites.A.id, MARCH);
    // Put on in March (Berlin): R2, R3, R5 → 3 blades. R1 is February's, R4 went on at 00:30 on 1 April in Berlin.
    expect(f.bladesUsed).toBe(3);
    // Spend: €65.00 + €70.00 + US$50.00 × 0.9 = 6 500 + 7 000 + 4 500 = 18 000 cents.
    expect(f.spend).toEqual({ amountMinor: 18_000, currency: 'EUR', complete: true, missing: [] });
    // Taken off in March: R1 (5 Mar), R6 (15 Mar), R2 (20 Mar), R3 (31 Mar 23:30 in Berlin) → 4; with area R1, R2, R3.
    expect(f.bladesRemoved).toBe(4);
    expect(f.bladesWithArea).toBe(3);
    // Area 1 000 000 + 3 000 000 + 200 000 = 4 200 000 mm²; mean 1 400 000; median 1 000 000; cuts (400 + 1 200 + 50) / 3 = 550.
    expect(f.areaCutMm2).toBe(4_200_000);
    expect(f.meanLifeMm2).toBe(1_400_000);
    expect(f.medianLifeMm2).toBe(1_000_000);
    expect(f.meanCutsPerBlade).toBe(550);
    // Cost per area: (6 000 + 6 500 + 7 000) cents ÷ 4 200 000 mm² = 0.004642857… cents/mm².
    expect(f.costPerAreaMinorPerMm2).toBeCloseTo(19_500 / 4_200_000, 15);
    // Break-in among the blades put on in March: R2 followed, R3 skipped, R5 not recorded → 1 of 2.
    expect([f.breakInFollowed, f.breakInRecorded]).toEqual([1, 2]);
    // Scheduled: two saws in service all month, 743 h each (744 h less the hour lost on 29 March) = 1 486 h.
    expect(f.scheduledHours).toBeCloseTo(1486, 9);
    // Stops in March: S1 3 h (23:00Z–02:00Z), S2 2 h, S3 4 h, S4 2 h (20:00Z–22:00Z), S5 5 h = 16 h.
    expect(f.stopHours).toEqual({
      blade_change: 0,
      blade_failure: 2,
      mechanical: 3,
      hydraulic: 2,
      electrical: 0,
      no_material_operator: 5,
      planned_maintenance: 4,
      other: 0,
    });
    expect(f.downtimeHours).toBeCloseTo(16, 9);
    expect(f.uptimeHours).toBeCloseTo(1470, 9);
    // Failures begun in March: S2 (blade failure) and S4 (hydraulic); S1 began in February, S3 was planned,
    // S5 (no material) is not a failure. Failure downtime 3 (S1's March part) + 2 + 2 = 7 h.
    expect(f.failures).toBe(2);
    expect(f.failureDowntimeHours).toBeCloseTo(7, 9);
    // MTBF 1 470 / 2 = 735 h; MTTR 7 / 2 = 3.5 h; availability 1 470 / 1 486 = 0.98923…
    expect(f.mtbfHours).toBeCloseTo(735, 9);
    expect(f.mttrHours).toBeCloseTo(3.5, 9);
    expect(f.operationalAvailability).toBeCloseTo(1470 / 1486, 12);
  });

  it('site A in April 2026: an open stop runs to the end of the month; months add up', async () => {
    const f = (await figures('admin', 'site', [APRIL])).of(fx.world.sites.A.id, APRIL);
    // Put on: R4 (00:30 on 1 April in Berlin) → 1 blade, €70.00. Taken off: R5 (2 000 000 mm², cuts not recorded).
    expect(f.bladesUsed).toBe(1);
    expect(f.spend.amountMinor).toBe(7000);
    expect([f.bladesRemoved, f.bladesWithArea, f.areaCutMm2]).toEqual([1, 1, 2_000_000]);
    expect(f.meanCutsPerBlade).toBeNull();
    // April: 30 days = 720 h a saw, 1 440 h. Stops: S4's April part 2 h; S6 open from 29 Apr 22:00Z to the
    // month's end 30 Apr 22:00Z = 24 h. Downtime 26 h, uptime 1 414 h; one failure began in April (S6).
    expect(f.scheduledHours).toBeCloseTo(1440, 9);
    expect(f.downtimeHours).toBeCloseTo(26, 9);
    expect(f.failures).toBe(1);
    expect(f.failureDowntimeHours).toBeCloseTo(26, 9);
    expect(f.mtbfHours).toBeCloseTo(1414, 9);
    expect(f.mttrHours).toBeCloseTo(26, 9);
    // A bucket of both months holds the sums: uptime 1 470 + 1 414, failures 2 + 1, failure downtime 7 + 26.
    const both = (await figures('admin', 'site', [{ key: 'both', from: '2026-03', to: '2026-04' }])).rows.find(
      (r) => r.groupId === fx.world.sites.A.id,
    )!;
    expect(both.scheduledHours - both.downtimeHours).toBeCloseTo(1470 + 1414, 9);
    expect(both.failures).toBe(3);
    expect(both.failureDowntimeHours).toBeCloseTo(33, 9);
  });

  it('a missing rate leaves the foreign money out, says what is missing, and withholds cost per area', async () => {
    await ExchangeRate.destroy({ where: {} });
    const march = (await figures('admin', 'site', [MARCH])).of(fx.world.sites.A.id, MARCH);
    // Without a USD rate for March: 6 500 + 7 000 = 13 500 converted; US$50.00 listed as missing.
    expect(march.spend).toEqual({
      amountMinor: 13_500,
      currency: 'EUR',
      complete: false,
      missing: [{ amountMinor: 5000, currency: 'USD', month: '2026-03' }],
    });
    // March's finished blades were all in EUR: cost per area is complete.
    expect(march.costPerAreaComplete).toBe(true);
    const april = (await figures('admin', 'site', [APRIL])).of(fx.world.sites.A.id, APRIL);
    // April's finished blade (R5) was bought in USD: no rate, so no cost per area rather than a wrong one.
    expect(april.costPerAreaComplete).toBe(false);
    expect(april.costPerAreaMinorPerMm2).toBeNull();
    await ExchangeRate.create({
      month: '2026-04-01',
      currency: 'USD',
      reportingCurrency: 'EUR',
      rate: 0.8,
      setById: null,
    });
    const withRate = (await figures('admin', 'site', [APRIL])).of(fx.world.sites.A.id, APRIL);
    // 5 000 × 0.8 = 4 000 cents over 2 000 000 mm² = 0.002 cents/mm².
    expect(withRate.costPerAreaMinorPerMm2).toBeCloseTo(0.002, 15);
    await ExchangeRate.destroy({ where: {} });
  });
});

describe('the SQL agrees with the domain functions on the same records', () => {
  /** The domain's figures for one saw in one month, from the fixture's rows (loaded here, not by the SQL). */
  async function domainFor(sawId: string, month: keyof typeof BOUNDS) {
    const [t0, t1] = BOUNDS[month];
    const saw = (await Saw.findByPk(sawId))!;
    const runs = await BladeRun.findAll({ where: { sawId } });
    const stops = await Stop.findAll({ where: { sawId } });
    // In service from the earliest of the saw's creation, first run and first stop.
    const from = Math.min(
      saw.createdAt.getTime(),
      ...runs.map((r) => r.installedAt.getTime()),
      ...stops.map((s) => s.startedAt.getTime()),
    );
    const w0 = new Date(Math.max(t0.getTime(), from));
    const w1 = new Date(Math.min(t1.getTime(), saw.retiredAt?.getTime() ?? Infinity, FLEET_AS_OF.getTime()));
    const events = stops.map((s) => ({
      startAt: s.startedAt,
      endAt: s.endedAt,
      category: s.category,
      planned: s.planned,
    }));
    const finished = runs.filter((r) => r.removedAt && r.removedAt >= t0 && r.removedAt < t1 && r.areaCutMm2 !== null);
    return {
      reliability: w1 > w0 ? reliabilityMetrics({ periodStart: w0, periodEnd: w1, asOf: FLEET_AS_OF, events }) : null,
      byCategory: Object.fromEntries(
        DOWNTIME_CATEGORIES.map((c) => [
          c,
          w1 > w0
            ? downtimeHours({
                periodStart: w0,
                periodEnd: w1,
                asOf: FLEET_AS_OF,
                events: events.filter((e) => e.category === c),
              }).hours
            : 0,
        ]),
      ),
      life: bladeLife(
        finished
          .filter((r) => r.cuts !== null)
          .map((r) => ({ areaCutMm2: r.areaCutMm2!, cuts: r.cuts!, removed: true })),
      ),
      finished,
    };
  }

  it('per saw and month: downtime by category, reliability, blade life and cost per area', async () => {
    const { of } = await figures('admin', 'saw', [MARCH, APRIL]);
    let compared = 0;
    for (const saw of [fx.saws.a1, fx.saws.a2, fx.saws.c1, fx.saws.c2, fx.world.retiredA]) {
      for (const bucket of [MARCH, APRIL]) {
        const sql = of(saw.id, bucket);
        const domain = await domainFor(saw.id, bucket.key as keyof typeof BOUNDS);
        const label = `${saw.assetTag} ${bucket.key}`;
        for (const c of DOWNTIME_CATEGORIES)
          expect(sql.stopHours[c], `${label} ${c}`).toBeCloseTo(domain.byCategory[c]!, 9);
        const r = domain.reliability;
        expect(sql.scheduledHours, label).toBeCloseTo(r?.scheduledHours ?? 0, 9);
        expect(sql.downtimeHours, label).toBeCloseTo(r?.downtimeHours ?? 0, 9);
        expect(sql.uptimeHours, label).toBeCloseTo(r?.uptimeHours ?? 0, 9);
        expect(sql.failures, label).toBe(r?.failureCount ?? 0);
        expect(sql.failureDowntimeHours, label).toBeCloseTo(r?.failureDowntimeHours ?? 0, 9);
        if (r?.mtbfHours == null) expect(sql.mtbfHours, label).toBeNull();
        else expect(sql.mtbfHours, label).toBeCloseTo(r.mtbfHours, 9);
        if (r?.mttrHours == null) expect(sql.mttrHours, label).toBeNull();
        else expect(sql.mttrHours, label).toBeCloseTo(r.mttrHours, 9);
        if (r?.operationalAvailability == null) expect(sql.operationalAvailability, label).toBeNull();
        else expect(sql.operationalAvailability, label).toBeCloseTo(r.operationalAvailability, 12);
        // Blade life over finished blades with area (and cuts, for the mean cuts).
        const areas = domain.finished.map((x) => ({ areaCutMm2: x.areaCutMm2!, cuts: 0, removed: true }));
        const life = bladeLife(areas);
        expect(sql.meanLifeMm2, label).toBe(life.meanAreaMm2PerBlade);
        expect(sql.medianLifeMm2, label).toBe(life.medianAreaMm2PerBlade);
        expect(sql.meanCutsPerBlade, label).toBe(domain.life.meanCutsPerBlade);
        // Cost per area of the EUR-only months: the domain's cost ÷ area on the same blades.
        if (domain.finished.length > 0 && domain.finished.every((x) => x.currency === 'EUR')) {
          const expected = costPerAreaCut({
            currency: 'EUR',
            costMinor: domain.finished.reduce((t, x) => t + x.costMinor, 0),
            areaCutMm2: domain.finished.reduce((t, x) => t + x.areaCutMm2!, 0),
          });
          expect(sql.costPerAreaMinorPerMm2, label).toBeCloseTo(expected.minorPerMm2!, 15);
        }
        compared += 1;
      }
    }
    expect(compared).toBe(10);
  });

  it('a site is the sum of its saws, and the fleet the sum of its sites (hours, failures, money)', async () => {
    const saws = await figures('admin', 'saw', [MARCH]);
    const sites = await figures('admin', 'site', [MARCH]);
    const fleet = await figures('admin', 'fleet', [MARCH]);
    const a = sites.of(fx.world.sites.A.id, MARCH);
    const [a1, a2] = [saws.of(fx.saws.a1.id, MARCH), saws.of(fx.saws.a2.id, MARCH)];
    expect(a.scheduledHours).toBeCloseTo(a1.scheduledHours + a2.scheduledHours, 9);
    expect(a.failures).toBe(a1.failures + a2.failures);
    const f = fleet.of('fleet', MARCH);
    const c = sites.of(fx.world.sites.C.id, MARCH);
    // Site C: C-1 in service from its first run (12 Mar 08:00Z) = 470 h; C-2 from its first stop (12 Mar 00:00Z)
    // = 478 h; 948 h. SC 10 h mechanical, one failure. Fleet: 1 486 + 948 = 2 434 h; 3 failures.
    expect(c.scheduledHours).toBeCloseTo(948, 9);
    expect(f.scheduledHours).toBeCloseTo(2434, 9);
    expect(f.failures).toBe(3);
    expect(f.failureDowntimeHours).toBeCloseTo(17, 9);
    // Finished blades with area, fleet-wide: 200 000, 500 000, 1 000 000, 3 000 000 → median 750 000.
    expect(f.medianLifeMm2).toBe(750_000);
    expect(f.bladesUsed).toBe(4);
  });
});

describe('scope: every figure counts only what the caller may read', () => {
  it('a regional lead’s fleet totals are their region’s (site C in another region is left out)', async () => {
    const lead = (await figures('leadNorth', 'fleet', [MARCH])).of('fleet', MARCH);
    const admin = (await figures('admin', 'site', [MARCH])).of(fx.world.sites.A.id, MARCH);
    // North is sites A and B; B has no records and its saws were only added now: the totals are A's.
    expect(lead.scheduledHours).toBeCloseTo(1486, 9);
    expect(lead.failures).toBe(2);
    expect(lead.bladesUsed).toBe(3);
    expect(lead.medianLifeMm2).toBe(admin.medianLifeMm2);
    const leadSites = (await figures('leadNorth', 'site', [MARCH])).rows.map((r) => r.groupId);
    expect(leadSites).not.toContain(fx.world.sites.C.id);
  });

  it('the overview’s way to the fleet (runs on their own, hours summed from the sites) gives the whole fleet’s figures', async () => {
    /** Numbers rounded to 1e-9 (SQL's numeric sum against a sum of doubles), everything else as it is. */
    const rounded = (v: unknown): unknown =>
      typeof v === 'number'
        ? Math.round(v * 1e9) / 1e9
        : v && typeof v === 'object'
          ? Object.fromEntries(Object.entries(v).map(([k, x]) => [k, rounded(x)]))
          : v;
    const buckets: Bucket[] = [MARCH, APRIL, { key: 'both', from: '2026-03', to: '2026-04' }];
    let compared = 0;
    for (const who of ['admin', 'leadNorth', 'managerAC', 'siteAdminA', 'techC']) {
      const scope = { ability: abilities[who]!, siteIds: allSites(), asOf: FLEET_AS_OF };
      const [whole, runsOnly, sites] = await Promise.all([
        rawFigures(ctx.sequelize, 'fleet', scope, buckets),
        rawFigures(ctx.sequelize, 'fleet', scope, buckets, { stops: false }),
        rawFigures(ctx.sequelize, 'site', scope, buckets),
      ]);
      const [wholeOf, runsOnlyOf, siteOf] = [indexRaw(whole), indexRaw(runsOnly), indexRaw(sites)];
      for (const bucket of buckets) {
        const label = `${who} ${bucket.key}`;
        const fleet = runsOnlyOf('fleet', bucket.key);
        // Without its stops, the fleet's statement counts none, and its runs are the whole fleet's.
        expect(fleet.downtimeHours, label).toBe(0);
        expect(fleet.failures, label).toBe(0);
        expect(fleet.medianLifeMm2, label).toBe(wholeOf('fleet', bucket.key).medianLifeMm2);
        const summed = withStopsOf(
          fleet,
          allSites().map((id) => siteOf(id, bucket.key)),
        );
        expect(rounded(summed), label).toEqual(rounded(wholeOf('fleet', bucket.key)));
        compared += 1;
      }
    }
    expect(compared).toBe(15);
    // Not an empty comparison: the admin's fleet over March and April stopped 16 + 26 (A) + 10 (C) = 52 h.
    const admin = indexRaw(
      await rawFigures(ctx.sequelize, 'fleet', { ability: abilities.admin!, siteIds: allSites(), asOf: FLEET_AS_OF }, [
        { key: 'both', from: '2026-03', to: '2026-04' },
      ]),
    )('fleet', 'both');
    expect(admin.downtimeHours).toBeCloseTo(52, 9);
  });

  it('without stops, every level gives its runs’ figures as with them and no hours', async () => {
    const buckets: Bucket[] = [MARCH, APRIL];
    let compared = 0;
    for (const level of ['saw', 'site', 'fleet'] as const) {
      const scope = { ability: abilities.admin!, siteIds: allSites(), asOf: FLEET_AS_OF };
      const [whole, runsOnly] = await Promise.all([
        rawFigures(ctx.sequelize, level, scope, buckets),
        rawFigures(ctx.sequelize, level, scope, buckets, { stops: false }),
      ]);
      const wholeOf = indexRaw(whole);
      expect(runsOnly.length, level).toBe(whole.length);
      for (const row of runsOnly) {
        const label = `${level} ${row.groupId} ${row.bucket}`;
        const withStops = wholeOf(row.groupId, row.bucket);
        expect(row.downtimeHours, label).toBe(0);
        expect(row.bladesUsed, label).toBe(withStops.bladesUsed);
        expect(row.medianLifeMm2, label).toBe(withStops.medianLifeMm2);
        compared += 1;
      }
    }
    // Not empty: saws, sites and the fleet, in both months.
    expect(compared).toBeGreaterThan(6);
  });

  it('a site admin sees their site only; a manager of A and C sees A and C', async () => {
    const siteAdmin = (await figures('siteAdminA', 'site', [MARCH])).rows.map((r) => r.groupId);
    expect(new Set(siteAdmin)).toEqual(new Set([fx.world.sites.A.id]));
    const manager = (await figures('managerAC', 'site', [MARCH])).rows.map((r) => r.groupId);
    expect(new Set(manager)).toEqual(new Set([fx.world.sites.A.id, fx.world.sites.C.id]));
    const techC = (await figures('techC', 'saw', [MARCH])).rows.map((r) => r.groupId);
    expect(techC).not.toContain(fx.saws.a1.id);
  });
});
