import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ZodError } from 'zod';
import { inToMm, lbfToN, mmToIn, psiToPa } from '../units/units.js';
import {
  bandTensionTarget,
  bearingWearTarget,
  chipBrushCheck,
  evaluateCheck,
  feedPressureTarget,
  guideClearanceTarget,
  trackingTarget,
} from './check-targets.js';
import { CHECK_DEFAULTS, CHECK_KIND_IDS, CHECK_KINDS, DEFAULT_TENSION_RANGE_MPA } from './schema.js';

describe('guide bearing clearance (thickness + 0.001 in: common practice, no source; open-side tolerance ours)', () => {
  it('0.035 in band: target 0.035 + 0.001 = 0.036 in = 0.9144 mm (1 in = 25.4 mm exactly, NIST SP 811 B.8)', () => {
    const r = guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: inToMm(0.035) });
    // Hand arithmetic: 0.036 × 25.4 = 0.9144.
    expect(r.target).toBeCloseTo(0.9144, 12);
    expect(mmToIn(r.target!)).toBeCloseTo(0.036, 12);
    // Tolerance on the open side only: 0.036 in to 0.037 in (0.9398 mm) passes.
    expect(r.min).toBeCloseTo(inToMm(0.036), 12);
    expect(r.max).toBeCloseTo(0.9398, 12);
    expect(r.unit).toBe('mm');
    expect(r.passed).toBeNull();
    expect(r.basis).toMatchObject({
      kind: 'site_setting',
      settingKey: 'guide_clearance',
      changedByName: null,
      changedAt: null,
    });
  });

  it('fails a reading tighter than the band, and one at the band thickness itself (no clearance)', () => {
    const base = { kind: 'guide_clearance' as const, bandThicknessMm: inToMm(0.035) };
    const pinched = guideClearanceTarget({ ...base, measuredMm: inToMm(0.034) });
    expect(pinched.passed).toBe(false);
    expect(pinched.explanation).toContain('tighter than the band itself');
    const snug = guideClearanceTarget({ ...base, measuredMm: inToMm(0.035) });
    expect(snug.passed).toBe(false);
    expect(snug.explanation).toContain('too tight');
    expect(guideClearanceTarget({ ...base, measuredMm: inToMm(0.0355) }).passed).toBe(false);
  });

  it('passes the target and the open limit, fails just beyond', () => {
    const base = { kind: 'guide_clearance' as const, bandThicknessMm: inToMm(0.035) };
    expect(guideClearanceTarget({ ...base, measuredMm: inToMm(0.036) }).passed).toBe(true);
    expect(guideClearanceTarget({ ...base, measuredMm: inToMm(0.037) }).passed).toBe(true);
    const loose = guideClearanceTarget({ ...base, measuredMm: inToMm(0.038) });
    expect(loose.passed).toBe(false);
    expect(loose.explanation).toContain('too loose');
  });

  it('reads in the site units first: imperial "0.036 in (0.914 mm)", metric "0.914 mm (0.036 in)"', () => {
    const input = { kind: 'guide_clearance' as const, bandThicknessMm: inToMm(0.035) };
    expect(guideClearanceTarget(input, { system: 'imperial' }).explanation).toBe(
      'Set the guide opening to the band thickness plus 0.001 in (0.025 mm): 0.036 in (0.914 mm). A reading from 0.036–0.037 in (0.914–0.940 mm) passes; anything tighter pinches the band.',
    );
    expect(guideClearanceTarget(input).explanation).toContain(': 0.914 mm (0.036 in).');
  });

  it("takes the site's setting, and says who changed it and when", () => {
    const r = guideClearanceTarget(
      { kind: 'guide_clearance', bandThicknessMm: 1.1, measuredMm: 1.16 },
      {
        settings: {
          guide_clearance: {
            key: 'guide_clearance',
            values: { extraClearanceMm: 0.05, toleranceMm: 0.02 },
            changedByName: 'Ana Ruiz',
            changedAt: '2025-03-04T10:00:00.000Z',
          },
        },
      },
    );
    expect(r.target).toBeCloseTo(1.15, 12);
    expect(r.passed).toBe(true);
    expect(r.basis).toMatchObject({
      kind: 'site_setting',
      changedByName: 'Ana Ruiz',
      changedAt: '2025-03-04T10:00:00.000Z',
    });
    // A saw's own figures override the site's and are named as such.
    const own = guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: 1.1, extraClearanceMm: 0.03 });
    expect(own.basis).toEqual({ kind: 'record', note: "this saw's own guide clearance" });
  });

  it('property: a reading below the band thickness always fails; the target always passes', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 5, noNaN: true }),
        fc.double({ min: 0.001, max: 0.09, noNaN: true }),
        (t, under) => {
          expect(
            guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: t, measuredMm: t - under }).passed,
          ).toBe(false);
          const r = guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: t });
          expect(r.target! - t).toBeCloseTo(0.0254, 12);
          expect(
            guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: t, measuredMm: r.target }).passed,
          ).toBe(true);
        },
      ),
    );
  });

  it('rejects a missing or absurd thickness with a clear message', () => {
    expect(() => guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: 0 })).toThrow(
      /Band thickness must be greater than 0 mm/,
    );
    expect(() => guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: 9 })).toThrow(/at most 5 mm/);
    expect(() => guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: 0.9, measuredMm: -1 })).toThrow(
      /must not be negative/,
    );
  });
});

describe('tracking (1/8 in overhang on a 1 in band: common practice, no source; scaling is ours)', () => {
  it('1 in band: target 1/8 in = 3.175 mm, ±1/32 in', () => {
    const r = trackingTarget({ kind: 'tracking', bandWidthMm: inToMm(1) });
    expect(r.target).toBeCloseTo(3.175, 12);
    expect(r.min).toBeCloseTo(inToMm(3 / 32), 12);
    expect(r.max).toBeCloseTo(inToMm(5 / 32), 12);
    expect(r.basis).toMatchObject({ kind: 'site_setting', settingKey: 'tracking' });
    expect(trackingTarget({ kind: 'tracking', bandWidthMm: inToMm(1) }, { system: 'imperial' }).explanation).toContain(
      'stand 0.125 in (3.175 mm) off the wheel face',
    );
  });

  it('scales with width between the bounds: 1/16 in at the low end, 1/4 in at the high end', () => {
    expect(trackingTarget({ kind: 'tracking', bandWidthMm: inToMm(0.25) }).target).toBeCloseTo(inToMm(1 / 16), 12);
    expect(trackingTarget({ kind: 'tracking', bandWidthMm: inToMm(1.5) }).target).toBeCloseTo(inToMm(3 / 16), 12);
    expect(trackingTarget({ kind: 'tracking', bandWidthMm: inToMm(3) }).target).toBeCloseTo(inToMm(1 / 4), 12);
  });

  it('passes and fails measured overhangs with the reason', () => {
    const base = { kind: 'tracking' as const, bandWidthMm: 27 };
    expect(trackingTarget({ ...base, measuredOverhangMm: 3.4 }).passed).toBe(true);
    const under = trackingTarget({ ...base, measuredOverhangMm: -1 });
    expect(under.passed).toBe(false);
    expect(under.explanation).toContain('ride on the wheel');
    const over = trackingTarget({ ...base, measuredOverhangMm: 6 });
    expect(over.passed).toBe(false);
    expect(over.explanation).toContain('off the front');
  });

  it('property: the target is monotone in band width and stays within the bounds', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 200, noNaN: true }),
        fc.double({ min: 1, max: 200, noNaN: true }),
        (a, b) => {
          const [lo, hi] = a <= b ? [a, b] : [b, a];
          const tLo = trackingTarget({ kind: 'tracking', bandWidthMm: lo }).target!;
          const tHi = trackingTarget({ kind: 'tracking', bandWidthMm: hi }).target!;
          expect(tLo).toBeLessThanOrEqual(tHi);
          expect(tHi).toBeLessThanOrEqual(CHECK_DEFAULTS.trackingMaxOverhangMm);
          expect(tLo).toBeGreaterThanOrEqual(CHECK_DEFAULTS.trackingMinOverhangMm);
        },
      ),
    );
  });

  it('rejects bounds that cross', () => {
    expect(() => trackingTarget({ kind: 'tracking', bandWidthMm: 27, minOverhangMm: 5, maxOverhangMm: 2 })).toThrow(
      /Largest overhang must not be below the smallest/,
    );
  });
});

describe('head down-force by spring balance (8 lbf greatest: common practice, no source; 2 lbf least: ours)', () => {
  const gravity = { kind: 'feed_pressure' as const, headFeed: 'gravity_spring' as const };

  it('shipped range 2–8 lbf = 8.896–35.586 N (1 lbf = 4.448 221 615 260 5 N, NIST SP 811 B.8)', () => {
    const r = feedPressureTarget(gravity);
    expect(r.max).toBeCloseTo(35.585773, 6);
    expect(r.max).toBe(lbfToN(8));
    expect(r.min).toBe(lbfToN(2));
    expect(r.unit).toBe('N');
    expect(r.applicable).toBe(true);
    expect(r.basis).toMatchObject({ kind: 'site_setting', settingKey: 'head_force', changedAt: null });
  });

  it('says where the balance hooks on, in the site units first', () => {
    const r = feedPressureTarget(gravity, { system: 'imperial' });
    expect(r.explanation).toContain('directly above the band, midway between the guide arms');
    expect(r.explanation).toContain('leverage');
    expect(r.explanation).toContain('2.0–8.0 lbf (8.9–35.6 N) passes');
  });

  it('passes within the range, fails a head too heavy or one not feeding', () => {
    expect(feedPressureTarget({ ...gravity, measuredN: lbfToN(8) }).passed).toBe(true);
    const heavy = feedPressureTarget({ ...gravity, measuredN: 40 });
    expect(heavy.passed).toBe(false);
    expect(heavy.explanation).toContain('too heavy');
    const light = feedPressureTarget({ ...gravity, measuredN: lbfToN(1) });
    expect(light.passed).toBe(false);
    expect(light.explanation).toContain('not feeding');
    const own = feedPressureTarget({ ...gravity, maxHeadForceN: 60, measuredN: 40 });
    expect(own.passed).toBe(true);
    expect(own.basis).toEqual({ kind: 'record', note: "this saw's own head-force limits" });
  });

  it('does not apply to a hydraulic feed', () => {
    const r = feedPressureTarget({ kind: 'feed_pressure', headFeed: 'hydraulic', measuredN: 100 });
    expect(r).toMatchObject({ applicable: false, passed: null, target: null, max: null, basis: null });
    expect(r.explanation).toContain('does not apply');
    expect(() => feedPressureTarget({ kind: 'feed_pressure' } as never)).toThrow(/gravity_spring or hydraulic/);
  });
});

describe('guide and pressure bearing wear (straightedge flush; tolerance is ours)', () => {
  it('target gap 0, passes up to 0.001 in = 0.0254 mm', () => {
    const ok = bearingWearTarget({ kind: 'bearing_wear', measuredGapMm: 0.0254 });
    expect(ok.target).toBe(0);
    expect(ok.max).toBeCloseTo(0.0254, 12);
    expect(ok.passed).toBe(true);
    const worn = bearingWearTarget({ kind: 'bearing_wear', measuredGapMm: 0.05 });
    expect(worn.passed).toBe(false);
    expect(worn.explanation).toContain('replace the bearing');
    expect(bearingWearTarget({ kind: 'bearing_wear', toleranceMm: 0.1, measuredGapMm: 0.05 }).passed).toBe(true);
  });
});

describe('band tension', () => {
  it('bi-metal ships the printed 25,000–30,000 psi = 172.37–206.84 MPa (Fine Woodworking, blade makers’ range)', () => {
    // 1 psi = 6 894.757 Pa, from the exact lbf and inch (NIST SP 811 B.8).
    const r = bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal' });
    expect(r.min).toBeCloseTo(172.369, 3);
    expect(r.max).toBeCloseTo(206.843, 3);
    expect(r.target).toBeCloseTo((r.min! + r.max!) / 2, 12);
    expect(r.basis).toEqual({ kind: 'published', citation: expect.stringContaining('Fine Woodworking') });
    expect(
      bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal' }, { system: 'imperial' }).explanation,
    ).toBe('Tension the band to 25,000–30,000 psi (172–207 MPa) on a tension meter; aim for 27,500 psi (190 MPa).');
  });

  it('carbon ships the printed 15,000–20,000 psi; carbide-tipped has no printed range and is a starting value', () => {
    const carbon = bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'carbon' });
    expect(carbon.min).toBeCloseTo(psiToPa(15000) / 1e6, 12);
    expect(carbon.basis?.kind).toBe('published');
    const carbide = bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'carbide_tipped', measuredMPa: 190 });
    expect(carbide.passed).toBe(true);
    expect(carbide.basis).toMatchObject({
      kind: 'site_setting',
      settingKey: 'band_tension.carbide_tipped',
      changedAt: null,
    });
    expect(DEFAULT_TENSION_RANGE_MPA.carbon.maxMPa).toBeLessThan(DEFAULT_TENSION_RANGE_MPA.bimetal.minMPa + 1e-9);
  });

  it("a site's changed range is its own setting, no longer the printed one", () => {
    const r = bandTensionTarget(
      { kind: 'band_tension', bladeMaterial: 'bimetal', measuredMPa: 230 },
      {
        settings: {
          'band_tension.bimetal': {
            key: 'band_tension.bimetal',
            values: { minMPa: 200, maxMPa: 240 },
            changedByName: 'Ana Ruiz',
            changedAt: '2025-05-01T08:00:00.000Z',
          },
        },
      },
    );
    expect(r.passed).toBe(true);
    expect(r.basis).toMatchObject({
      kind: 'site_setting',
      changedByName: 'Ana Ruiz',
      note: expect.stringContaining('Fine Woodworking'),
    });
  });

  it('fails slack and over-tight readings, and takes the blade maker range', () => {
    const slack = bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal', measuredMPa: 150 });
    expect(slack.passed).toBe(false);
    expect(slack.explanation).toContain('slack');
    const tight = bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal', measuredMPa: 300 });
    expect(tight.passed).toBe(false);
    expect(tight.explanation).toContain('too tight');
    const maker = bandTensionTarget({
      kind: 'band_tension',
      bladeMaterial: 'bimetal',
      minMPa: 180,
      maxMPa: 220,
      measuredMPa: 190,
    });
    expect(maker.passed).toBe(true);
    expect(maker.basis).toEqual({ kind: 'record', note: "the blade maker's range for this blade" });
  });

  it('rejects a range upside down or half given', () => {
    expect(() =>
      bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal', minMPa: 250, maxMPa: 200 }),
    ).toThrow(/Highest tension must not be below the lowest/);
    expect(() => bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'carbon', minMPa: 200 })).toThrow(
      /both ends/,
    );
    expect(() => bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'steel' as never })).toThrow(
      /carbon, bimetal or carbide_tipped/,
    );
  });
});

describe('chip brush', () => {
  it('passes only when it reaches the gullets and is not worn; unobserved until both are answered', () => {
    expect(chipBrushCheck({ kind: 'chip_brush', reachesGullets: true, worn: false }).passed).toBe(true);
    const off = chipBrushCheck({ kind: 'chip_brush', reachesGullets: false, worn: false });
    expect(off.passed).toBe(false);
    expect(off.explanation).toContain('set it closer');
    const worn = chipBrushCheck({ kind: 'chip_brush', reachesGullets: true, worn: true });
    expect(worn.passed).toBe(false);
    expect(worn.explanation).toContain('replace it');
    expect(chipBrushCheck({ kind: 'chip_brush', reachesGullets: true }).passed).toBeNull();
    expect(chipBrushCheck({ kind: 'chip_brush' }).unit).toBe('condition');
  });
});

describe('evaluateCheck and CHECK_KINDS', () => {
  it('dispatches every kind to its own target', () => {
    const inputs = [
      { kind: 'guide_clearance', bandThicknessMm: 0.9 },
      { kind: 'tracking', bandWidthMm: 34 },
      { kind: 'feed_pressure', headFeed: 'gravity_spring' },
      { kind: 'bearing_wear' },
      { kind: 'band_tension', bladeMaterial: 'bimetal' },
      { kind: 'chip_brush' },
    ] as const;
    expect(inputs.map((i) => evaluateCheck(i).kind)).toEqual([...CHECK_KIND_IDS]);
    expect(evaluateCheck({ kind: 'feed_pressure', headFeed: 'gravity_spring', measuredN: 10 }).passed).toBe(true);
    expect(
      evaluateCheck({ kind: 'feed_pressure', headFeed: 'gravity_spring' }, { system: 'imperial' }).explanation,
    ).toContain('lbf (');
  });

  it('rejects an unknown kind with the list of kinds', () => {
    expect(() => evaluateCheck({ kind: 'coolant' } as never)).toThrow(ZodError);
    expect(() => evaluateCheck({ kind: 'coolant' } as never)).toThrow(/guide_clearance, tracking/);
  });

  it('lists every kind once, blade-change kinds without an interval and periodic ones with one', () => {
    expect(CHECK_KINDS.map((k) => k.kind).sort()).toEqual([...CHECK_KIND_IDS].sort());
    for (const k of CHECK_KINDS) {
      if (k.due === 'blade_change') expect(k.defaultIntervalDays).toBeNull();
      else expect(k.defaultIntervalDays).toBeGreaterThan(0);
    }
    expect(CHECK_KINDS.filter((k) => k.due === 'blade_change').map((k) => k.kind)).toEqual([
      'guide_clearance',
      'tracking',
      'band_tension',
      'chip_brush',
    ]);
  });
});
