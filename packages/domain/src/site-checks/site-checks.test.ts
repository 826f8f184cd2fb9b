import { describe, expect, it } from 'vitest';
import { inToMm, lbfToN, psiToPa } from '../units/units.js';
import { CHECK_KINDS } from '../checks/schema.js';
import {
  checkRecordCreateSchema,
  defaultSiteChecks,
  siteCheckCreateSchema,
  siteCheckValuesSchema,
  type SiteCheckValues,
} from './schema.js';
import { judgeCheckReading, sawHeadForceBasis, siteCheckResult, type CheckBlade, type CheckSaw } from './evaluate.js';

const saw: CheckSaw = { bandThicknessMm: 0.9, bandWidthMm: 27, headFeed: 'hydraulic' };
const blade: CheckBlade = { thicknessMm: inToMm(0.035), widthMm: inToMm(1), material: 'bimetal' };
const byRule = (rule: string): SiteCheckValues => defaultSiteChecks().find((c) => c.targetRule === rule)!;

const messages = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  r.error?.issues.map((i) => `${i.path.join('.')}: ${i.message}`) ?? [];

describe('the shipped list of checks', () => {
  it('has one check per kind, in the order and with the schedules the kinds ship with', () => {
    const list = defaultSiteChecks();
    expect(list.map((c) => c.targetRule)).toEqual(CHECK_KINDS.map((k) => k.kind));
    expect(list.map((c) => [c.schedule, c.intervalDays, c.graceHours])).toEqual([
      ['blade_change', null, 8],
      ['blade_change', null, 8],
      ['blade_change', null, 8],
      ['blade_change', null, 8],
      ['periodic', 30, 24],
      ['periodic', 30, 24],
    ]);
    for (const c of list) expect(siteCheckValuesSchema.safeParse(c).success, c.name).toBe(true);
  });
});

describe('a check on a site’s list', () => {
  it('a rule takes its quantity from the rule and its limits from the settings: no fixed numbers', () => {
    const parsed = siteCheckCreateSchema.parse({
      name: 'Left guide',
      targetRule: 'guide_clearance',
      schedule: 'blade_change',
    });
    expect(parsed).toMatchObject({ quantity: 'length', graceHours: 8, fixedTarget: null, intervalDays: null });
    const withNumbers = siteCheckCreateSchema.safeParse({
      name: 'Left guide',
      targetRule: 'guide_clearance',
      schedule: 'blade_change',
      fixedMax: 1,
    });
    expect(messages(withNumbers)).toEqual([
      'fixedMax: This rule takes its limits from your site’s settings: leave the fixed values empty',
    ]);
    expect(
      messages(
        siteCheckCreateSchema.safeParse({
          name: 'X',
          targetRule: 'band_tension',
          quantity: 'force',
          schedule: 'blade_change',
        }),
      ),
    ).toEqual(['quantity: This rule reads a stress, not a force']);
  });

  it('a fixed value needs its quantity, a target and a limit, in order', () => {
    expect(
      messages(
        siteCheckCreateSchema.safeParse({
          name: 'Feed pressure',
          targetRule: 'fixed',
          schedule: 'periodic',
          intervalDays: 7,
        }),
      ),
    ).toEqual(['quantity: Say what the fixed value reads: length, force or stress']);
    const bad = siteCheckCreateSchema.safeParse({
      name: 'Feed pressure',
      targetRule: 'fixed',
      quantity: 'stress',
      fixedTarget: 5,
      fixedMin: 4,
      fixedMax: 3,
      schedule: 'periodic',
      intervalDays: 7,
    });
    expect(messages(bad)).toEqual([
      'fixedMax: The highest passing value must not be below the lowest',
      'fixedTarget: The target must not be above the highest passing value',
    ]);
    const good = siteCheckCreateSchema.parse({
      name: 'Feed pressure',
      targetRule: 'fixed',
      quantity: 'stress',
      fixedTarget: 4,
      fixedMin: 3.5,
      fixedMax: 4.5,
      schedule: 'periodic',
      intervalDays: 7,
    });
    expect(good.graceHours).toBe(24);
  });

  it('a periodic check needs an interval; a blade-change check has none', () => {
    expect(
      messages(siteCheckCreateSchema.safeParse({ name: 'X', targetRule: 'bearing_wear', schedule: 'periodic' })),
    ).toEqual(['intervalDays: Say every how many days']);
    expect(
      messages(
        siteCheckCreateSchema.safeParse({
          name: 'X',
          targetRule: 'tracking',
          schedule: 'blade_change',
          intervalDays: 3,
        }),
      ),
    ).toEqual(['intervalDays: A check due at each blade change has no interval: leave it empty']);
    expect(
      messages(siteCheckCreateSchema.safeParse({ name: ' ', targetRule: 'tracking', schedule: 'blade_change' })),
    ).toEqual(['name: must not be empty']);
  });

  it('a record names a bad reading’s field', () => {
    const r = checkRecordCreateSchema.safeParse({
      sawId: '00000000-0000-4000-8000-000000000001',
      siteCheckId: '00000000-0000-4000-8000-000000000002',
      reading: 'thin',
    });
    expect(messages(r)).toEqual(['reading: Reading must be a number in the check’s unit (mm, N or MPa)']);
  });
});

describe('a check’s target for a saw and the blade on it', () => {
  it('guide opening: the blade’s thickness + 0.001 in; tighter than the target fails, a reading inside passes', () => {
    // 0.035 in + 0.001 in = 0.036 in = 0.9144 mm; passes up to 0.037 in = 0.9398 mm (shipped setting).
    const target = siteCheckResult(byRule('guide_clearance'), saw, blade);
    expect(target.target).toBeCloseTo(0.9144, 9);
    expect(target.max).toBeCloseTo(0.9398, 9);
    expect(target.basis).toMatchObject({ kind: 'site_setting', settingKey: 'guide_clearance' });
    const tight = judgeCheckReading(byRule('guide_clearance'), saw, blade, { reading: 0.85 });
    expect(tight).toMatchObject({ ok: true, result: { passed: false } });
    if (tight.ok) expect(tight.result.explanation).toContain('tighter than the band itself');
    expect(judgeCheckReading(byRule('guide_clearance'), saw, blade, { reading: 0.92 })).toMatchObject({
      ok: true,
      result: { passed: true },
    });
    // With no blade on the saw, the saw's usual band thickness: 0.9 + 0.0254 = 0.9254 mm.
    expect(siteCheckResult(byRule('guide_clearance'), saw, null).target).toBeCloseTo(0.9254, 9);
  });

  it('head down-force does not apply on a hydraulic feed, and cannot be recorded there', () => {
    const check = byRule('feed_pressure');
    expect(siteCheckResult(check, saw, null).applicable).toBe(false);
    const refused = judgeCheckReading(check, saw, null, { reading: 20 });
    expect(refused).toMatchObject({ ok: false, path: 'siteCheckId' });
    if (!refused.ok)
      expect(refused.message).toMatch(/^This check does not apply: This saw feeds its head hydraulically/);
    // On a spring-fed head: 2–8 lbf shipped; 10 lbf fails.
    const spring = { ...saw, headFeed: 'gravity_spring' as const };
    expect(judgeCheckReading(check, spring, null, { reading: lbfToN(10) })).toMatchObject({
      ok: true,
      result: { passed: false },
    });
  });

  it('head down-force uses the saw’s own limits when set, and says whose they are', () => {
    // 8 lbf greatest over the last inch of travel: common practice, no source (the site's shipped setting).
    const check = byRule('feed_pressure');
    const spring: CheckSaw = { ...saw, headFeed: 'gravity_spring' };
    const siteOnly = siteCheckResult(check, { ...spring, minHeadForceN: null, maxHeadForceN: null }, null);
    expect(siteOnly.max).toBeCloseTo(lbfToN(8), 9);
    expect(siteOnly.basis).toMatchObject({ kind: 'site_setting', settingKey: 'head_force' });
    // This saw's own 6 lbf greatest: 7 lbf passes on the site's setting but fails on the saw's.
    const own: CheckSaw = {
      ...spring,
      maxHeadForceN: lbfToN(6),
      headForceBasis: sawHeadForceBasis(
        { maxHeadForceN: lbfToN(6) },
        { byName: 'Ana Ruiz', at: '2026-11-03T09:00:00.000Z' },
      ),
    };
    expect(judgeCheckReading(check, spring, null, { reading: lbfToN(7) })).toMatchObject({
      ok: true,
      result: { passed: true },
    });
    const judged = judgeCheckReading(check, own, null, { reading: lbfToN(7) });
    expect(judged).toMatchObject({ ok: true, result: { passed: false, min: lbfToN(2) } });
    if (judged.ok) {
      expect(judged.result.max).toBeCloseTo(26.689, 3); // 6 lbf = 6 × 4.4482216152605 N (NIST SP 811, B.8)
      expect(judged.result.basis).toEqual({
        kind: 'record',
        note: 'this saw’s own largest head force (the least is your site’s setting)',
        setByName: 'Ana Ruiz',
        setAt: '2026-11-03T09:00:00.000Z',
      });
    }
    // Its own least: 3 lbf read under a 4 lbf least is too light (the head is not feeding).
    const light = judgeCheckReading(check, { ...spring, minHeadForceN: lbfToN(4) }, null, { reading: lbfToN(3) });
    expect(light).toMatchObject({ ok: true, result: { passed: false, basis: { kind: 'record' } } });
    if (light.ok) expect(light.result.explanation).toContain('the head is not feeding');
    // A saw's greatest below the site's least takes the least down with it: the range never turns over.
    const low = siteCheckResult(check, { ...spring, maxHeadForceN: lbfToN(1) }, null);
    expect(low.min).toBeCloseTo(lbfToN(1), 9);
    // A hydraulic head ignores any limits it carries: the check does not apply.
    expect(siteCheckResult(check, { ...saw, maxHeadForceN: lbfToN(6) }, null)).toMatchObject({
      applicable: false,
      basis: null,
    });
  });

  it('band tension needs a blade on the saw, and reads its material’s range', () => {
    expect(siteCheckResult(byRule('band_tension'), saw, null).applicable).toBe(false);
    // Bi-metal 25,000–30,000 psi = 172.4–206.8 MPa (printed range): 190 MPa passes.
    const r = judgeCheckReading(byRule('band_tension'), saw, blade, { reading: 190 });
    expect(r).toMatchObject({ ok: true, result: { passed: true, min: psiToPa(25000) / 1e6 } });
  });

  it('the chip brush takes both answers, and a number check a reading', () => {
    expect(judgeCheckReading(byRule('chip_brush'), saw, blade, {})).toMatchObject({ ok: false, path: 'answers' });
    expect(
      judgeCheckReading(byRule('chip_brush'), saw, blade, { answers: { reachesGullets: true, worn: true } }),
    ).toMatchObject({ ok: true, result: { passed: false } });
    expect(judgeCheckReading(byRule('tracking'), saw, blade, {})).toMatchObject({
      ok: false,
      path: 'reading',
      message: 'Enter the reading',
    });
    // A reading the rule cannot take: a gap over 50 mm under a straightedge.
    expect(judgeCheckReading(byRule('bearing_wear'), saw, blade, { reading: 80 })).toMatchObject({
      ok: false,
      path: 'reading',
      message: 'Measured gap must be at most 50 mm',
    });
  });

  it('a fixed check passes within its own limits and says whose figures they are', () => {
    const check = {
      targetRule: 'fixed' as const,
      quantity: 'stress' as const,
      fixedTarget: 4,
      fixedMin: 3.5,
      fixedMax: 4.5,
    };
    const basis = {
      kind: 'site_setting' as const,
      settingKey: 'site_check',
      changedByName: 'Ines Carvalho',
      changedAt: '2026-10-01T08:00:00.000Z',
      note: 'your site’s list of checks',
    };
    const inside = judgeCheckReading(check, saw, null, { reading: 4.5 }, { fixedBasis: basis });
    expect(inside).toMatchObject({ ok: true, result: { passed: true, target: 4, min: 3.5, max: 4.5, basis } });
    const low = judgeCheckReading(check, saw, null, { reading: 3.2 }, { system: 'imperial' });
    expect(low).toMatchObject({ ok: true, result: { passed: false } });
    if (low.ok) expect(low.result.explanation).toMatch(/^Aim for 580 psi \(4 MPa\); 508–653 psi .*below the lowest/);
  });
});
