import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inToMm } from '../units/units.js';
import { cutFaceAreaMm2 } from '../stock-area/cut-area.js';
import type { StockShape } from '../stock-area/schema.js';
import { engagedLengthMm } from './engaged-length.js';
import { meanTpi, parsePitchLabel, pitchLabel, STANDARD_PITCHES } from './pitch.js';
import { recommendPitches } from './recommend-pitches.js';
import type { Pitch } from './schema.js';
import { judgeTeethInWork, TEETH_FITS, TEETH_IN_WORK_RULE, teethInWork, teethInWorkForStock } from './teeth-in-work.js';

const constant = (tpi: number): Pitch => ({ kind: 'constant', tpi });
const variable = (coarseTpi: number, fineTpi: number): Pitch => ({ kind: 'variable', coarseTpi, fineTpi });
const close = (a: number, b: number, rel = 1e-9) => Math.abs(a - b) <= rel * Math.max(1, Math.abs(a), Math.abs(b));

describe('pitch', () => {
  it('counts a variable pitch by its mean and prints it the trade’s way', () => {
    expect(meanTpi(variable(4, 6))).toBe(5);
    expect(meanTpi(constant(3))).toBe(3);
    expect(pitchLabel(variable(0.75, 1.25))).toBe('0.75/1.25');
    expect(pitchLabel(constant(3))).toBe('3');
  });

  it('reads pitches as printed on a blade', () => {
    expect(parsePitchLabel('3')).toEqual({ ok: true, pitch: constant(3) });
    expect(parsePitchLabel(' 4/6 TPI ')).toEqual({ ok: true, pitch: variable(4, 6) });
    expect(parsePitchLabel('0.75 / 1.25 tpi')).toEqual({ ok: true, pitch: variable(0.75, 1.25) });
    expect(parsePitchLabel('.75')).toEqual({ ok: true, pitch: constant(0.75) });
    for (const bad of ['', 'abc', '6/4', '4/4', '40', '0.2', '4/60', '4/6/8']) {
      const parsed = parsePitchLabel(bad);
      expect(parsed.ok, bad).toBe(false);
      if (!parsed.ok) expect(parsed.message.length).toBeGreaterThan(0);
    }
  });

  it('round-trips every standard pitch through its label', () => {
    for (const pitch of STANDARD_PITCHES) expect(parsePitchLabel(pitchLabel(pitch))).toEqual({ ok: true, pitch });
    // The list named in the trade: 10 constant and 11 variable pitches (common practice, no source).
    expect(STANDARD_PITCHES.filter((p) => p.kind === 'constant')).toHaveLength(10);
    expect(STANDARD_PITCHES.filter((p) => p.kind === 'variable')).toHaveLength(11);
  });
});

describe('teeth in the work', () => {
  it('is TPI × inches of metal: 50 mm solid square at 4/6 TPI holds 9.8 teeth', () => {
    // Worked by hand: 50 mm ÷ 25.4 mm/in (NIST SP 811 B.8, inch) = 1.9685 in; × 5 TPI = 9.84 teeth.
    const teeth = teethInWorkForStock({ kind: 'square_bar', sideMm: 50 }, variable(4, 6));
    expect(teeth.min).toBeCloseTo(9.8425, 4);
    expect(teeth.max).toBeCloseTo(9.8425, 4);
    expect(teethInWork(constant(3), inToMm(2))).toBeCloseTo(6, 12);
  });

  it('refuses a length or pitch that is not positive', () => {
    expect(() => teethInWork(constant(3), 0)).toThrow(
      'Length of metal under the band must be a number greater than 0 mm',
    );
    expect(() => teethInWork(constant(-3), 10)).toThrow('Pitch must be a number greater than 0 TPI');
    expect(() => engagedLengthMm({ kind: 'round_bar', diameterMm: 30 }, 0)).toThrow('Pieces side by side');
    expect(() => engagedLengthMm({ kind: 'round_tube', outsideDiameterMm: 30, wallMm: 20 })).toThrow(
      'half the outside diameter',
    );
    expect(() => engagedLengthMm({ kind: 'cone' } as unknown as StockShape)).toThrow('Unknown stock shape');
  });

  it('doubling the TPI doubles the teeth (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.25, max: 16, noNaN: true }),
        fc.double({ min: 0.1, max: 3000, noNaN: true }),
        (tpi, lengthMm) => close(teethInWork(constant(2 * tpi), lengthMm), 2 * teethInWork(constant(tpi), lengthMm)),
      ),
    );
  });

  it('is linear in the length and in the pieces side by side (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1000, noNaN: true }), fc.integer({ min: 1, max: 20 }), (d, n) => {
        const one = teethInWorkForStock({ kind: 'round_bar', diameterMm: d }, variable(2, 3));
        const bundle = teethInWorkForStock({ kind: 'round_bar', diameterMm: d }, variable(2, 3), n);
        return (
          close(bundle.min, n * one.min) &&
          close(bundle.max, n * one.max) &&
          bundle.basis.includes(`${n} pieces`) === n > 1
        );
      }),
    );
  });
});

describe('engaged length, checked by brute-force geometry', () => {
  it('round bar: π·D/4 is the mean chord over the diameter (numerical integration), D the greatest', () => {
    // Independent check: integrate the chord 2√(R² − y²) over the depth by the midpoint rule and divide by D.
    const d = 80;
    const r = d / 2;
    const steps = 200000;
    let sum = 0;
    for (let i = 0; i < steps; i++) {
      const y = -r + ((i + 0.5) * d) / steps;
      sum += 2 * Math.sqrt(r * r - y * y);
    }
    const meanChord = sum / steps;
    const engaged = engagedLengthMm({ kind: 'round_bar', diameterMm: d });
    expect(engaged.minMm).toBeCloseTo(meanChord, 3);
    expect(engaged.minMm).toBeCloseTo(cutFaceAreaMm2({ kind: 'round_bar', diameterMm: d }) / d, 9);
    expect(engaged.maxMm).toBe(d);
  });

  it('round tube: least is 2 × wall at the centre line, greatest is the chord just above the bore', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 5, max: 1000, noNaN: true }),
        fc.double({ min: 0.02, max: 0.49, noNaN: true }),
        (od, f) => {
          const wall = od * f;
          const big = od / 2;
          const bore = big - wall;
          // Metal under the band at height h: the outer chord less the bore chord where the bore is cut.
          const metalAt = (h: number) =>
            2 * Math.sqrt(Math.max(0, big * big - h * h)) -
            (Math.abs(h) < bore ? 2 * Math.sqrt(bore * bore - h * h) : 0);
          let least = Infinity;
          let most = 0;
          for (let i = 0; i <= 2000; i++) {
            const h = -bore + (2 * bore * i) / 2000;
            least = Math.min(least, metalAt(h));
            most = Math.max(most, metalAt(h));
          }
          const engaged = engagedLengthMm({ kind: 'round_tube', outsideDiameterMm: od, wallMm: wall });
          return close(engaged.minMm, least, 1e-9) && close(engaged.maxMm, most, 1e-6);
        },
      ),
    );
  });

  it('gives least and greatest lengths for every shape', () => {
    const cases: [StockShape, number, number][] = [
      [{ kind: 'flat_bar', widthMm: 100, heightMm: 10 }, 100, 100],
      [{ kind: 'square_tube', sideMm: 60, wallMm: 3 }, 6, 60],
      [{ kind: 'rect_tube', widthMm: 100, heightMm: 50, wallMm: 4 }, 8, 100],
      [{ kind: 'angle', legOnBedMm: 75, legUpMm: 50, thicknessMm: 6 }, 6, 75],
      [{ kind: 'channel', depthMm: 100, flangeWidthMm: 50, webThicknessMm: 6, flangeThicknessMm: 8.5 }, 17, 100],
      [{ kind: 'beam', depthMm: 200, flangeWidthMm: 100, webThicknessMm: 5.6, flangeThicknessMm: 8.5 }, 5.6, 100],
    ];
    for (const [shape, minMm, maxMm] of cases) {
      const engaged = engagedLengthMm(shape);
      expect(engaged.minMm).toBeCloseTo(minMm, 9);
      expect(engaged.maxMm).toBeCloseTo(maxMm, 9);
      expect(engaged.basis.length).toBeGreaterThan(0);
    }
  });
});

describe('judging teeth in the work (3–24, best 6–12: common practice, no source)', () => {
  it('labels and warns', () => {
    expect(TEETH_IN_WORK_RULE).toEqual({ fewest: 3, most: 24, bestFewest: 6, bestMost: 12 });
    expect(judgeTeethInWork({ min: 6, max: 12 })).toEqual({ fit: 'best', warnings: [] });
    expect(judgeTeethInWork({ min: 3, max: 24 })).toEqual({ fit: 'workable', warnings: [] });
    const few = judgeTeethInWork({ min: 1.84, max: 8 });
    expect(few.fit).toBe('outside_limits');
    expect(few.warnings).toEqual([
      {
        code: 'too_few_teeth',
        message: 'As few as 1.8 teeth in the work (fewer than 3): teeth may strip. Choose a finer pitch.',
      },
    ]);
    const both = judgeTeethInWork({ min: 2, max: 30 });
    expect(both.warnings.map((w) => w.code)).toEqual(['too_few_teeth', 'too_many_teeth']);
    expect(both.warnings[1]?.message).toBe(
      'Up to 30.0 teeth in the work (more than 24): gullets pack with chips and the cut slows. Choose a coarser pitch.',
    );
  });
});

describe('recommendPitches', () => {
  it('ranks best fits first for a 50 mm round bar', () => {
    const ranked = recommendPitches({ kind: 'round_bar', diameterMm: 50 });
    expect(ranked).toHaveLength(STANDARD_PITCHES.length);
    const top = ranked[0];
    expect(top?.fit).toBe('best');
    // Mean chord 39.27 mm = 1.546 in and diameter 1.969 in: 6–12 teeth needs 3.9 to 6.1 TPI.
    expect(top?.meanTpi).toBeGreaterThanOrEqual(3.9);
    expect(top?.meanTpi).toBeLessThanOrEqual(6.1);
    expect(ranked.at(-1)?.fit).toBe('outside_limits');
  });

  it('puts coarse pitches first for large solids and fine pitches first for thin walls', () => {
    expect(recommendPitches({ kind: 'round_bar', diameterMm: 300 })[0]?.meanTpi).toBeLessThanOrEqual(1.25);
    const tube = recommendPitches({ kind: 'round_tube', outsideDiameterMm: 50, wallMm: 3 });
    expect(tube[0]?.meanTpi).toBeGreaterThanOrEqual(10);
    expect(tube[0]?.fit).toBe('workable');
  });

  it('warns when no pitch fits, ranking too many teeth above too few', () => {
    // 200 × 100 × 4 mm tube: 8 mm of side walls (0.315 in) and 200 mm of top (7.87 in).
    // 10 TPI: 3.1 to 78.7 teeth (too many); 2 TPI: 0.63 to 15.7 teeth (too few).
    const shape: StockShape = { kind: 'rect_tube', widthMm: 200, heightMm: 100, wallMm: 4 };
    const ranked = recommendPitches(shape, { pitches: [constant(2), constant(10)] });
    expect(ranked.every((c) => c.fit === 'outside_limits')).toBe(true);
    expect(ranked.map((c) => c.label)).toEqual(['10', '2']);
    expect(ranked[0]?.warnings.map((w) => w.code)).toEqual(['too_many_teeth']);
    expect(ranked[1]?.warnings.map((w) => w.code)).toEqual(['too_few_teeth']);
  });

  it('takes a pitch list, bundle layout and limit', () => {
    const ranked = recommendPitches(
      { kind: 'square_bar', sideMm: 20 },
      { piecesAcross: 3, pitches: [constant(3), constant(6)], limit: 1 },
    );
    expect(ranked).toHaveLength(1);
    // 3 × 20 mm = 2.362 in: 3 TPI gives 7.1 teeth (best), 6 TPI 14.2 (workable).
    expect(ranked[0]?.label).toBe('3');
    expect(recommendPitches({ kind: 'square_bar', sideMm: 20 }, { limit: -1 })).toEqual([]);
  });

  it('never ranks a worse fit above a better one (fast-check)', () => {
    const order = (fit: string) => TEETH_FITS.indexOf(fit as (typeof TEETH_FITS)[number]);
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 1000, noNaN: true }),
        fc.double({ min: 0.01, max: 0.49, noNaN: true }),
        (od, f) => {
          for (const shape of [
            { kind: 'round_bar', diameterMm: od },
            { kind: 'round_tube', outsideDiameterMm: od, wallMm: od * f },
          ] as StockShape[]) {
            const fits = recommendPitches(shape).map((c) => order(c.fit));
            if (fits.some((fit, i) => i > 0 && fit < (fits[i - 1] ?? 0))) return false;
          }
          return true;
        },
      ),
    );
  });
});
