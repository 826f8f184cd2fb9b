import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inToMm } from '../units/units.js';
import { cutFaceAreaMm2 } from '../stock-area/cut-area.js';
import type { StockShape } from '../stock-area/schema.js';
import { engagedLengthMm } from './engaged-length.js';
import { meanTpi, parsePitchLabel, pitchLabel, STANDARD_PITCHES } from './pitch.js';
import { pitchAdvice, recommendPitches } from './recommend-pitches.js';
import { PRINTED_PITCH_PAIRS, tablePitchForLengthOfCut } from './pitch-table.js';
import type { Pitch } from './schema.js';
import {
  judgeTeethInWork,
  TEETH_IN_WORK_RULE,
  teethInWork,
  teethInWorkForStock,
  teethInWorkRule,
} from './teeth-in-work.js';

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

describe('judging teeth in the work (3–24 guards, 6–12 preference: common practice, no source)', () => {
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

describe('round bar: each figure named for what it is, and the warning on the centre line', () => {
  it('gives the mean over the cut π·D/4 and the chord at the centre line D, and names them', () => {
    const engaged = engagedLengthMm({ kind: 'round_bar', diameterMm: 40 });
    expect(engaged).toMatchObject({ minLabel: 'mean over the cut', maxLabel: 'at the centre line' });
    expect(engaged.minMm).toBeCloseTo((Math.PI * 40) / 4, 12);
    expect(engaged.maxMm).toBe(40);
    // Published pitch tables read a round solid's diameter as its length of cut (Machinery's Handbook, 31st ed.,
    // p. 1245): the too-few-teeth warning reads the same figure.
    expect(engaged.fewestTeethMm).toBe(40);
    const square = engagedLengthMm({ kind: 'square_bar', sideMm: 40 });
    expect(square).toMatchObject({ minLabel: 'least', maxLabel: 'greatest', fewestTeethMm: 40 });
  });

  it('does not warn when the centre line holds 3 teeth, though the mean over the cut holds fewer', () => {
    // 1 in bar at 3.5 TPI (a pitch typed in): 3.5 teeth at the centre line, 3.5·π/4 = 2.75 on the mean.
    const teeth = teethInWorkForStock({ kind: 'round_bar', diameterMm: inToMm(1) }, constant(3.5));
    expect(teeth.fewest).toBeCloseTo(3.5, 12);
    expect(teeth.min).toBeCloseTo(2.7489, 4);
    expect(judgeTeethInWork(teeth).warnings).toEqual([]);
    // Under the old reading (the mean called "least") this warned:
    expect(judgeTeethInWork({ min: teeth.min, max: teeth.max }).warnings.map((w) => w.code)).toEqual(['too_few_teeth']);
  });

  it('warns when the centre line itself holds fewer than 3 teeth, and says where', () => {
    // 0.7 in bar at 3 TPI: 2.1 teeth at the centre line.
    const teeth = teethInWorkForStock({ kind: 'round_bar', diameterMm: inToMm(0.7) }, constant(3));
    const judged = judgeTeethInWork(teeth);
    expect(judged.fit).toBe('outside_limits');
    expect(judged.warnings[0]?.message).toBe(
      'As few as 2.1 teeth in the work at the centre line (fewer than 3): teeth may strip. Choose a finer pitch.',
    );
  });
});

describe('pitch for solids from the printed table', () => {
  // Machinery's Handbook, 31st ed. (Industrial Press, 2020), p. 1245, notes to the table "Bimetal Band Saw
  // Speeds for Cutting 4-Inch Material with Coolant": length of cut → blade pitch.
  const printed: [number, string][] = [
    [0.25, '10/14'],
    [0.75, '6/10'],
    [1.25, '4/6'],
    [4, '3/4'],
    [8, '2/3'],
  ];

  it('the table data are the printed pairs', () => {
    expect(PRINTED_PITCH_PAIRS.map((p) => [p.lengthOfCutIn, pitchLabel(p.pitch)])).toEqual(printed);
  });

  for (const [inches, label] of printed) {
    it(`MH 31st ed. p. 1245: ${inches} in of solid → ${label} TPI (round, square and flat bar)`, () => {
      const shapes: StockShape[] = [
        { kind: 'round_bar', diameterMm: inToMm(inches) },
        { kind: 'square_bar', sideMm: inToMm(inches) },
        { kind: 'flat_bar', widthMm: inToMm(inches), heightMm: 10 },
      ];
      for (const shape of shapes) {
        const advice = pitchAdvice(shape);
        expect(advice.candidates[0]?.label, shape.kind).toBe(label);
        expect(advice.candidates[0]?.recommended).toBe(true);
        expect(advice.source).toBe('published_table');
        expect(advice.basis).toEqual({ kind: 'published', citation: expect.stringContaining('p. 1245') });
        expect(advice.candidates[0]?.fit).not.toBe('outside_limits');
      }
    });
  }

  it('accepts about 3 teeth on small solids and about 20 on large ones, as the table does', () => {
    const small = recommendPitches({ kind: 'round_bar', diameterMm: inToMm(0.25) })[0]!;
    expect(small.teethFewest).toBeCloseTo(3, 9);
    expect(small.warnings).toEqual([]);
    const large = recommendPitches({ kind: 'round_bar', diameterMm: inToMm(8) })[0]!;
    expect(large.teethMax).toBeCloseTo(20, 9);
    // The 6–12 preference is shown, not ranked above the table: 1/1.5 TPI would put 10 teeth in 8 in.
    expect(large.inPreferredRange).toBe(false);
    const preferred = recommendPitches({ kind: 'round_bar', diameterMm: inToMm(8) }).find((c) => c.label === '1/1.5');
    expect(preferred?.inPreferredRange).toBe(true);
    expect(preferred?.recommended).toBe(false);
  });

  it('between printed lengths takes the nearest printed length on a ratio scale (our reading)', () => {
    expect(pitchLabel(tablePitchForLengthOfCut(inToMm(0.43)).pitch)).toBe('10/14');
    expect(pitchLabel(tablePitchForLengthOfCut(inToMm(0.44)).pitch)).toBe('6/10');
    expect(pitchLabel(tablePitchForLengthOfCut(inToMm(2.2)).pitch)).toBe('4/6');
    expect(pitchLabel(tablePitchForLengthOfCut(inToMm(2.3)).pitch)).toBe('3/4');
    expect(pitchLabel(tablePitchForLengthOfCut(inToMm(5.6)).pitch)).toBe('3/4');
    expect(pitchLabel(tablePitchForLengthOfCut(inToMm(5.7)).pitch)).toBe('2/3');
    expect(tablePitchForLengthOfCut(inToMm(9)).withinTable).toBe(false);
    expect(() => tablePitchForLengthOfCut(0)).toThrow('Length of cut must be a number greater than 0 mm');
  });

  it('beyond the table the guards choose (fewer than 3 / more than 24 teeth: common practice, no source)', () => {
    const thin = pitchAdvice({ kind: 'flat_bar', widthMm: inToMm(0.2), heightMm: 20 });
    expect(thin.source).toBe('teeth_in_work');
    expect(thin.basis).toMatchObject({ kind: 'site_setting', settingKey: 'teeth_in_work', changedAt: null });
    expect(thin.candidates[0]!.teethFewest).toBeGreaterThanOrEqual(3);
    expect(thin.note).toContain('beyond the printed pitch table');
    const big = pitchAdvice({ kind: 'round_bar', diameterMm: inToMm(14) });
    expect(big.source).toBe('teeth_in_work');
    expect(big.candidates[0]!.teethMax).toBeLessThanOrEqual(24);
  });

  it('reads the guards from the site’s teeth_in_work setting, and says whose they are', () => {
    // 4 in round bar: 1 TPI puts 4 teeth at the centre line. With the shipped fewest 3 it passes; a site that
    // wants at least 5 gets a too-few warning and a finer pitch chosen beyond the table.
    const settings = {
      teeth_in_work: {
        key: 'teeth_in_work',
        values: { fewestTeeth: 5, preferredFewestTeeth: 8, preferredMostTeeth: 14, mostTeeth: 30 },
        changedByName: 'Ines Carvalho',
        changedAt: '2026-10-01T08:00:00.000Z',
      },
    };
    const range = { min: 4, max: 4 };
    expect(judgeTeethInWork(range).warnings).toEqual([]);
    const own = teethInWorkRule(settings);
    expect(own).toEqual({ fewest: 5, most: 30, bestFewest: 8, bestMost: 14 });
    expect(judgeTeethInWork(range, own).warnings[0]?.message).toContain('(fewer than 5)');
    const big = pitchAdvice({ kind: 'round_bar', diameterMm: inToMm(14) }, { settings });
    expect(big.rule).toEqual(own);
    expect(big.basis).toMatchObject({ kind: 'site_setting', changedByName: 'Ines Carvalho' });
    expect(big.note).toContain('5 to 30 teeth');
  });

  it('takes the nearest pitch of a site list that lacks the printed one', () => {
    const advice = pitchAdvice(
      { kind: 'round_bar', diameterMm: inToMm(4) },
      { pitches: [constant(2), constant(4), constant(8)] },
    );
    // Printed 3/4 (3.5 TPI): 4 TPI is nearest.
    expect(advice.source).toBe('nearest_to_table');
    expect(advice.candidates[0]?.label).toBe('4');
    expect(advice.note).toContain('3/4 TPI');
  });

  it('tubes and shapes keep the teeth-in-work choice and say so', () => {
    const tube = pitchAdvice({ kind: 'round_tube', outsideDiameterMm: 50, wallMm: 3 });
    expect(tube.source).toBe('teeth_in_work');
    expect(tube.table).toBeNull();
    expect(tube.note).toContain('solid sections only');
    expect(tube.candidates[0]?.meanTpi).toBeGreaterThanOrEqual(10);
    expect(tube.candidates[0]?.fit).toBe('workable');
  });

  it('warns when no pitch fits a tube, ranking too many teeth above too few', () => {
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
    // 3 × 20 mm = 2.362 in of cut takes the printed 3/4 (3.5 TPI): 3 TPI is nearer it than 6 on a ratio scale.
    expect(ranked[0]?.label).toBe('3');
    expect(recommendPitches({ kind: 'square_bar', sideMm: 20 }, { limit: -1 })).toEqual([]);
  });

  it('never ranks a pitch outside the guards above one within them (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 2, max: 1000, noNaN: true }),
        fc.double({ min: 0.01, max: 0.49, noNaN: true }),
        (od, f) => {
          for (const shape of [
            { kind: 'round_bar', diameterMm: od },
            { kind: 'round_tube', outsideDiameterMm: od, wallMm: od * f },
          ] as StockShape[]) {
            const outside = recommendPitches(shape).map((c) => c.fit === 'outside_limits');
            if (outside.some((o, i) => i > 0 && !o && outside[i - 1])) return false;
          }
          return true;
        },
      ),
    );
  });
});
