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

describe('guide bearing clearance (thickness + 0.001 in: common practice, no source)', () => {
  it('0.035 in band: 0.035 + 0.001 = 0.036 in = 0.9144 mm (1 in = 25.4 mm exactly, NIST SP 811 B.8)', () => {
    const r = guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: inToMm(0.035) });
    // Hand arithmetic: 0.036 × 25.4 = 0.9144.
    expect(r.target).toBeCloseTo(0.9144, 12);
    expect(mmToIn(r.target!)).toBeCloseTo(0.036, 12);
    expect(r.target).toBeCloseTo(inToMm(0.036), 12);
    // Our tolerance: from the thickness itself (0.889 mm) to thickness + 0.002 in (0.037 in = 0.9398 mm).
    expect(r.min).toBeCloseTo(0.889, 12);
    expect(r.max).toBeCloseTo(0.9398, 12);
    expect(r.unit).toBe('mm');
    expect(r.passed).toBeNull();
    expect(r.basis).toBe('common practice, no source');
  });

  it('passes a reading on either limit and fails one just outside, saying which way', () => {
    const base = { kind: 'guide_clearance' as const, bandThicknessMm: inToMm(0.035) };
    expect(guideClearanceTarget({ ...base, measuredMm: inToMm(0.035) }).passed).toBe(true);
    expect(guideClearanceTarget({ ...base, measuredMm: inToMm(0.037) }).passed).toBe(true);
    const tight = guideClearanceTarget({ ...base, measuredMm: inToMm(0.034) });
    expect(tight.passed).toBe(false);
    expect(tight.explanation).toContain('too tight');
    const loose = guideClearanceTarget({ ...base, measuredMm: inToMm(0.039) });
    expect(loose.passed).toBe(false);
    expect(loose.explanation).toContain('too loose');
  });

  it('a site may change the clearance and tolerance', () => {
    const r = guideClearanceTarget({
      kind: 'guide_clearance',
      bandThicknessMm: 1.1,
      extraClearanceMm: 0.05,
      toleranceMm: 0.02,
      measuredMm: 1.16,
    });
    expect(r.target).toBeCloseTo(1.15, 12);
    expect(r.passed).toBe(true);
    expect(r.basis).toBe('site setting');
  });

  it('property: the target is the band thickness plus 0.0254 mm and always lies inside its own range', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 5, noNaN: true }), (t) => {
        const r = guideClearanceTarget({ kind: 'guide_clearance', bandThicknessMm: t, measuredMm: t + inToMm(0.001) });
        expect(r.target! - t).toBeCloseTo(0.0254, 12);
        expect(r.passed).toBe(true);
        expect(r.min).toBeCloseTo(t, 12);
      }),
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

describe('feed / head pressure (8 lbf default: common practice for one class of saw, no source)', () => {
  it('default maximum is 8 lbf = 35.585 773 N (1 lbf = 4.448 221 615 260 5 N, NIST SP 811 B.8)', () => {
    const r = feedPressureTarget({ kind: 'feed_pressure' });
    expect(r.max).toBeCloseTo(35.585773, 6);
    expect(r.max).toBe(lbfToN(8));
    expect(r.unit).toBe('N');
    expect(r.basis).toBe('common practice, no source');
  });

  it('passes at or under the maximum and fails above it', () => {
    expect(feedPressureTarget({ kind: 'feed_pressure', measuredN: lbfToN(8) }).passed).toBe(true);
    const heavy = feedPressureTarget({ kind: 'feed_pressure', measuredN: 40 });
    expect(heavy.passed).toBe(false);
    expect(heavy.explanation).toContain('too heavy');
    const own = feedPressureTarget({ kind: 'feed_pressure', maxHeadForceN: 60, measuredN: 40 });
    expect(own.passed).toBe(true);
    expect(own.basis).toBe('saw setting');
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

describe('band tension (default ranges from memory)', () => {
  it('bi-metal: 30 000–35 000 psi = 206.84–241.32 MPa (1 psi = 6 894.757 Pa, from the exact lbf and inch)', () => {
    const r = bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal' });
    expect(r.min).toBeCloseTo(206.843, 3);
    expect(r.max).toBeCloseTo(241.317, 3);
    expect(r.min).toBeCloseTo(psiToPa(30000) / 1e6, 12);
    expect(r.target).toBeCloseTo((r.min! + r.max!) / 2, 12);
    expect(r.basis).toBe('from memory');
    expect(r.explanation).toContain('30,000–35,000 psi');
  });

  it('carbon bands are tensioned lower than bi-metal', () => {
    expect(DEFAULT_TENSION_RANGE_MPA.carbon.maxMPa).toBeLessThan(DEFAULT_TENSION_RANGE_MPA.bimetal.minMPa);
    expect(bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'carbide_tipped', measuredMPa: 220 }).passed).toBe(
      true,
    );
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
    expect(maker.basis).toBe("blade maker's range");
  });

  it('rejects a range upside down, also against a default', () => {
    expect(() =>
      bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'bimetal', minMPa: 250, maxMPa: 200 }),
    ).toThrow(/Highest tension must not be below the lowest/);
    expect(() => bandTensionTarget({ kind: 'band_tension', bladeMaterial: 'carbon', minMPa: 200 })).toThrow(
      /Highest tension/,
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
      { kind: 'feed_pressure' },
      { kind: 'bearing_wear' },
      { kind: 'band_tension', bladeMaterial: 'bimetal' },
      { kind: 'chip_brush' },
    ] as const;
    expect(inputs.map((i) => evaluateCheck(i).kind)).toEqual([...CHECK_KIND_IDS]);
    expect(evaluateCheck({ kind: 'feed_pressure', measuredN: 10 }).passed).toBe(true);
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
