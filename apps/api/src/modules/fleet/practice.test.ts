import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { checkDueState } from '@kerfline/domain/checks/check-due';
import { startTestApp, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, type World } from '../../test-support/fixtures.js';
import { abilityFor } from '../../test-support/abilities.js';
import { BladeSpec } from '../blade-specs/blade-spec.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { getPractice } from './fleet.service.js';

/*
 * Site A (Europe/Berlin), March 2026 = 2026-02-28T23:00Z to 2026-03-31T22:00Z. Saw A-1 is in service from
 * 1 January with two checks: a weekly one (7 days, 24 h grace) recorded 25 Feb 10:00, 4 Mar 09:00, 12 Mar 12:00
 * and 27 Mar 10:00 (UTC); and one at each blade change (8 h grace) recorded 5 Mar 12:00 and 21 Mar 12:00, for
 * blades put on 5 Mar 08:00 and 20 Mar 09:00 (and one from 1 Feb, taken off 5 Mar 07:00).
 */
let ctx: TestContext;
let world: World;
const AS_OF = new Date('2026-06-15T00:00:00Z');
const at = (iso: string) => new Date(iso);
const weekly = ['2026-02-25T10:00:00Z', '2026-03-04T09:00:00Z', '2026-03-12T12:00:00Z', '2026-03-27T10:00:00Z'];
const atChange = ['2026-03-05T12:00:00Z', '2026-03-21T12:00:00Z'];
const runs = [
  { on: '2026-02-01T08:00:00Z', off: '2026-03-05T07:00:00Z', area: 1_000_000 },
  { on: '2026-03-05T08:00:00Z', off: '2026-03-20T08:00:00Z', area: 3_000_000 },
  { on: '2026-03-20T09:00:00Z', off: '2026-04-10T08:00:00Z', area: 2_500_000 },
];

beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  const saw = world.saws.A![0]!;
  const q = (sql: string, replacements: Record<string, unknown> = {}) =>
    ctx.sequelize.query(sql, { replacements, type: QueryTypes.RAW });
  await q(`UPDATE saws SET created_at = '2026-01-01T00:00:00Z' WHERE id = :id`, { id: saw.id });
  await q(`DELETE FROM site_checks WHERE site_id = :site`, { site: saw.siteId });
  const check = async (name: string, rule: string, schedule: string, interval: number | null, grace: number) =>
    (
      (await ctx.sequelize.query(
        `INSERT INTO site_checks (site_id, name, quantity, target_rule, schedule, interval_days, grace_hours, created_at)
         VALUES (:site, :name, 'length', :rule, :schedule, :interval, :grace, '2026-01-01T00:00:00Z') RETURNING id`,
        { replacements: { site: saw.siteId, name, rule, schedule, interval, grace }, type: QueryTypes.SELECT },
      )) as { id: string }[]
    )[0]!.id;
  const weeklyId = await check('Tracking', 'tracking', 'periodic', 7, 24);
  const changeId = await check('Guide opening', 'guide_clearance', 'blade_change', null, 8);
  for (const [id, times] of [
    [weeklyId, weekly],
    [changeId, atChange],
  ] as const)
    for (const t of times)
      await q(
        `INSERT INTO check_records (site_id, saw_id, site_check_id, checked_at, target_rule, quantity, reading, passed, explanation)
         VALUES (:site, :saw, :check, :t, 'tracking', 'length', 1, true, 'fixture')`,
        { site: saw.siteId, saw: saw.id, check: id, t },
      );
  const spec = await BladeSpec.create({
    siteId: null,
    name: 'Practice spec',
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    coarseTpi: 3,
    fineTpi: 4,
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6000,
    currency: 'EUR',
    supplier: null,
  });
  for (const r of runs)
    await BladeRun.create({
      siteId: saw.siteId,
      sawId: saw.id,
      bladeSpecId: spec.id,
      stockReceiptId: null,
      installedAt: at(r.on),
      installedById: null,
      tensionMpa: null,
      materialGroup: 'carbon_steel',
      breakInFollowed: true,
      installNotes: null,
      costMinor: 6000,
      currency: 'EUR',
      removedAt: at(r.off),
      removalReason: 'worn_out',
      areaCutMm2: r.area,
      cuts: 100,
    });
});
afterAll(async () => ctx.close());

describe('checks done on time, per site and period', () => {
  it('counts each occasion a check fell due in the period and whether it was done within its grace (by hand)', async () => {
    const practice = await getPractice(
      await abilityFor(world.users.admin.id),
      { from: '2026-03', to: '2026-03' },
      AS_OF,
    );
    const a = practice.sites.find((s) => s.site.code === 'A')!;
    // Weekly: due 4 Mar 10:00 (from 25 Feb), done 4 Mar 09:00 → on time; due 11 Mar 09:00, done 12 Mar 12:00,
    // after 12 Mar 09:00 → late; due 19 Mar 12:00, done 27 Mar → late. (27 Mar's next due is in April.)
    // Blade change: blade of 5 Mar 08:00, checked 12:00, within 8 h → on time; blade of 20 Mar 09:00, checked
    // 21 Mar 12:00, after 17:00 → late. The blade of 1 Feb fell due in February. 5 occasions, 2 on time.
    expect([a.checksDue, a.checksOnTime]).toEqual([5, 2]);
    expect(a.checksOnTimeShare).toBeCloseTo(0.4, 12);
    // Blades taken off in March: the one of 5 Mar (1 000 000 mm²) had no guide check while it was on → late; the
    // one of 20 Mar (3 000 000 mm²) was checked 4 h after it went on → on time.
    expect(a.medianLifeChecksOnTimeMm2).toBe(3_000_000);
    expect(a.medianLifeChecksLateMm2).toBe(1_000_000);
    // Sites without occasions say so rather than 0 %.
    expect(practice.sites.find((s) => s.site.code === 'B')!.checksDue).toBeNull();
  });

  it('agrees with the checks’ own due rule (checkDueState) on every occasion', () => {
    const appliesSince = at('2026-01-01T00:00:00Z');
    const t0 = at('2026-02-28T23:00:00Z').getTime();
    const t1 = at('2026-03-31T22:00:00Z').getTime();
    let due = 0;
    let onTime = 0;
    // Weekly occasions: each record's successor is done "as of" its own time against the record before it.
    for (let i = 0; i + 1 < weekly.length; i++) {
      const falls = checkDueState({
        schedule: 'periodic',
        intervalDays: 7,
        graceHours: 24,
        bladeOnSince: null,
        lastCheckedAt: at(weekly[i]!),
        appliesSince,
        asOf: at(weekly[i + 1]!),
      });
      if (falls.fallsDueAt!.getTime() < t0 || falls.fallsDueAt!.getTime() >= t1) continue;
      due += 1;
      if (falls.state !== 'overdue') onTime += 1;
    }
    // Blade-change occasions: the first record while the blade was on, against the last record before it.
    for (const run of runs) {
      if (at(run.on).getTime() < t0 || at(run.on).getTime() >= t1) continue;
      const done = atChange.find((c) => c >= run.on && c < run.off)!;
      const before = atChange.filter((c) => c < run.on).at(-1) ?? null;
      const state = checkDueState({
        schedule: 'blade_change',
        intervalDays: null,
        graceHours: 8,
        bladeOnSince: at(run.on),
        lastCheckedAt: before ? at(before) : null,
        appliesSince,
        asOf: at(done),
      });
      due += 1;
      if (state.state !== 'overdue') onTime += 1;
    }
    expect([due, onTime]).toEqual([5, 2]);
  });
});

/*
 * May 2026 on the same saw (2026-04-30T22:00Z to 2026-05-31T22:00Z): a second check at each blade change, "Band
 * tension" (24 h grace), begins to apply on 15 April. Blades: 28 Apr 06:00 to 4 May 06:00 (both its checks done
 * before the period began), 10 May 08:00 to 20 May 08:00 (its guide check at the very minute it went on), and one
 * put on 25 May 08:00 and still on, whose guide check came after the period ended.
 */
describe('blade-change checks around the period’s edges', () => {
  const may = [
    { on: '2026-04-28T06:00:00Z', off: '2026-05-04T06:00:00Z', area: 4_000_000 },
    { on: '2026-05-10T08:00:00Z', off: '2026-05-20T08:00:00Z', area: 5_000_000 },
    { on: '2026-05-25T08:00:00Z', off: null, area: null },
  ];
  beforeAll(async () => {
    const saw = world.saws.A![0]!;
    const [guide, tension] = await Promise.all(
      ['Guide opening', 'Band tension'].map(async (name) =>
        name === 'Guide opening'
          ? (
              (await ctx.sequelize.query(`SELECT id FROM site_checks WHERE site_id = :site AND name = :name`, {
                replacements: { site: saw.siteId, name },
                type: QueryTypes.SELECT,
              })) as { id: string }[]
            )[0]!.id
          : (
              (await ctx.sequelize.query(
                `INSERT INTO site_checks (site_id, name, quantity, target_rule, schedule, interval_days, grace_hours, created_at)
                 VALUES (:site, :name, 'length', 'band_tension', 'blade_change', NULL, 24, '2026-04-15T00:00:00Z') RETURNING id`,
                { replacements: { site: saw.siteId, name }, type: QueryTypes.SELECT },
              )) as { id: string }[]
            )[0]!.id,
      ),
    );
    const records: [string, string][] = [
      [guide!, '2026-04-28T10:00:00Z'], // first blade, within 8 h of 06:00: on time
      [tension!, '2026-04-29T05:00:00Z'], // first blade, within 24 h: on time
      [guide!, '2026-05-10T08:00:00Z'], // second blade, the minute it went on: on time
      [tension!, '2026-05-11T09:00:00Z'], // second blade, an hour past its 24 h: late
      [guide!, '2026-06-02T08:00:00Z'], // third blade, a week after it went on: late
    ];
    for (const [check, t] of records)
      await ctx.sequelize.query(
        `INSERT INTO check_records (site_id, saw_id, site_check_id, checked_at, target_rule, quantity, reading, passed, explanation)
         VALUES (:site, :saw, :check, :t, 'tracking', 'length', 1, true, 'fixture')`,
        { replacements: { site: saw.siteId, saw: saw.id, check, t }, type: QueryTypes.RAW },
      );
    const spec = await BladeSpec.findOne({ where: { name: 'Practice spec' } });
    for (const r of may)
      await BladeRun.create({
        siteId: saw.siteId,
        sawId: saw.id,
        bladeSpecId: spec!.id,
        stockReceiptId: null,
        installedAt: at(r.on),
        installedById: null,
        tensionMpa: null,
        materialGroup: 'carbon_steel',
        breakInFollowed: true,
        installNotes: null,
        costMinor: 6000,
        currency: 'EUR',
        removedAt: r.off === null ? null : at(r.off),
        removalReason: r.off === null ? null : 'worn_out',
        areaCutMm2: r.area,
        cuts: r.off === null ? null : 100,
      });
  });

  it('finds each blade’s first record even before the period or after it, and counts each check apart (by hand)', async () => {
    const practice = await getPractice(
      await abilityFor(world.users.admin.id),
      { from: '2026-05', to: '2026-05' },
      AS_OF,
    );
    const a = practice.sites.find((s) => s.site.code === 'A')!;
    // The first blade fell due in April. Second blade: guide on time, tension late; third blade: guide done after
    // its grace (on 2 June), tension never done and its grace long over → both late. No weekly check fell due in
    // May (its last record, 27 Mar, fell due again in April). 4 occasions, 1 on time.
    expect([a.checksDue, a.checksOnTime]).toEqual([4, 1]);
    // Taken off in May: the first blade, both checks done on time before May (4 000 000 mm²), and the second, its
    // tension check late (5 000 000 mm²). The third is still on.
    expect(a.medianLifeChecksOnTimeMm2).toBe(4_000_000);
    expect(a.medianLifeChecksLateMm2).toBe(5_000_000);
  });

  it('still counts March as before: the tension check began to apply after March’s blades came off', async () => {
    const practice = await getPractice(
      await abilityFor(world.users.admin.id),
      { from: '2026-03', to: '2026-03' },
      AS_OF,
    );
    const a = practice.sites.find((s) => s.site.code === 'A')!;
    expect([a.checksDue, a.checksOnTime]).toEqual([5, 2]);
    expect(a.medianLifeChecksOnTimeMm2).toBe(3_000_000);
    expect(a.medianLifeChecksLateMm2).toBe(1_000_000);
  });
});

describe('a blade-change check that begins to apply while a blade is on', () => {
  it('falls due when it began, and the first record while that blade is on fulfils it (by hand)', async () => {
    const saw = world.saws.A![0]!;
    // The blade put on 25 May is still on when “Band tracking” joins the list on 1 June (24 h grace), recorded
    // 1 June 10:00: one occasion in June, on time. No other check falls due in June (the weekly check's last
    // occasion was in April; the May blades' changes fell due in May).
    const [tracking] = (await ctx.sequelize.query(
      `INSERT INTO site_checks (site_id, name, quantity, target_rule, schedule, interval_days, grace_hours, created_at)
       VALUES (:site, 'Band tracking', 'length', 'tracking', 'blade_change', NULL, 24, '2026-06-01T00:00:00Z')
       RETURNING id`,
      { replacements: { site: saw.siteId }, type: QueryTypes.SELECT },
    )) as { id: string }[];
    const june = async () =>
      (await getPractice(await abilityFor(world.users.admin.id), { from: '2026-06', to: '2026-06' }, AS_OF)).sites.find(
        (s) => s.site.code === 'A',
      )!;
    // Not recorded yet, its grace long over by the as-of time: due and late.
    expect([(await june()).checksDue, (await june()).checksOnTime]).toEqual([1, 0]);
    await ctx.sequelize.query(
      `INSERT INTO check_records (site_id, saw_id, site_check_id, checked_at, target_rule, quantity, reading, passed,
                                  explanation)
       VALUES (:site, :saw, :check, '2026-06-01T10:00:00Z', 'tracking', 'length', 1, true, 'fixture')`,
      { replacements: { site: saw.siteId, saw: saw.id, check: tracking!.id }, type: QueryTypes.RAW },
    );
    const a = await june();
    expect([a.checksDue, a.checksOnTime]).toEqual([1, 1]);
    // May is as before: the check began after May's blades came off.
    const may = (
      await getPractice(await abilityFor(world.users.admin.id), { from: '2026-05', to: '2026-05' }, AS_OF)
    ).sites.find((s) => s.site.code === 'A')!;
    expect([may.checksDue, may.checksOnTime]).toEqual([4, 1]);
  });
});
