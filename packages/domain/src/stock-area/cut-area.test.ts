import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inToMm, mm2ToIn2 } from '../units/units.js';
import {
  angleAreaMm2,
  beamAreaMm2,
  bundleCutAreaMm2,
  channelAreaMm2,
  cutFaceAreaMm2,
  flatBarAreaMm2,
  rectTubeAreaMm2,
  roundBarAreaMm2,
  roundTubeAreaMm2,
  squareBarAreaMm2,
  squareTubeAreaMm2,
} from './cut-area.js';
import type { StockShape } from './schema.js';

const mm = (min: number, max: number) => fc.double({ min, max, noNaN: true });
const close = (a: number, b: number, rel = 1e-9) => Math.abs(a - b) <= rel * Math.max(1, Math.abs(a), Math.abs(b));

describe('pipe against ASME B36.10M (welded and seamless wrought steel pipe)', () => {
  // Outside diameters and walls of the standard's dimension table, and the metal areas printed in common pipe
  // data tables, quoted from memory. The weights check below ties them to the standard's own plain-end
  // weight formula, W = 10.69·(D − t)·t lb/ft with D and t in inches (also from memory).
  const pipes = [
    { size: 'NPS 1 schedule 40', odIn: 1.315, wallIn: 0.133, areaIn2: 0.494, weightLbPerFt: 1.68 },
    { size: 'NPS 2 schedule 40', odIn: 2.375, wallIn: 0.154, areaIn2: 1.075, weightLbPerFt: 3.65 },
    { size: 'NPS 4 schedule 40', odIn: 4.5, wallIn: 0.237, areaIn2: 3.174, weightLbPerFt: 10.79 },
    { size: 'NPS 6 schedule 40', odIn: 6.625, wallIn: 0.28, areaIn2: 5.581, weightLbPerFt: 18.97 },
  ];

  for (const pipe of pipes) {
    it(`${pipe.size}: OD ${pipe.odIn} in, wall ${pipe.wallIn} in → metal area ${pipe.areaIn2} in²`, () => {
      const areaIn2 = mm2ToIn2(roundTubeAreaMm2({ outsideDiameterMm: inToMm(pipe.odIn), wallMm: inToMm(pipe.wallIn) }));
      // The tables print three decimals.
      expect(Math.abs(areaIn2 - pipe.areaIn2)).toBeLessThanOrEqual(0.0006);
      // Same metal from the tabulated weight: area = π·W/10.69; weights are printed to 0.01 lb/ft.
      const areaFromWeightIn2 = (Math.PI * pipe.weightLbPerFt) / 10.69;
      expect(Math.abs(areaIn2 - areaFromWeightIn2) / areaIn2).toBeLessThan(0.005);
    });
  }
});

describe('structural shapes against the AISC Steel Construction Manual dimension tables (from memory)', () => {
  it('L4×4×1/2 angle: 3.75 in² (sharp corners give the tabulated figure)', () => {
    const area = angleAreaMm2({ legOnBedMm: inToMm(4), legUpMm: inToMm(4), thicknessMm: inToMm(0.5) });
    expect(mm2ToIn2(area)).toBeCloseTo(3.75, 6);
  });

  it('W8×31 beam: tabulated 9.13 in²; leaving the root fillets out comes in under it by less than 3 %', () => {
    // d = 8.00 in, bf = 7.995 in, tw = 0.285 in, tf = 0.435 in.
    const area = mm2ToIn2(
      beamAreaMm2({
        depthMm: inToMm(8),
        flangeWidthMm: inToMm(7.995),
        webThicknessMm: inToMm(0.285),
        flangeThicknessMm: inToMm(0.435),
      }),
    );
    expect(area).toBeLessThan(9.13);
    expect((9.13 - area) / 9.13).toBeLessThan(0.03);
  });
});

describe('worked figures for each shape', () => {
  it('computes each formula', () => {
    expect(roundBarAreaMm2({ diameterMm: 100 })).toBeCloseTo(7853.9816, 3);
    expect(squareBarAreaMm2({ sideMm: 50 })).toBe(2500);
    expect(flatBarAreaMm2({ widthMm: 100, heightMm: 10 })).toBe(1000);
    // 100 × 50 × 5 tube: 100·50 − 90·40 = 1400 mm².
    expect(rectTubeAreaMm2({ widthMm: 100, heightMm: 50, wallMm: 5 })).toBe(1400);
    // 60 × 60 × 4: 3600 − 52² = 896 mm².
    expect(squareTubeAreaMm2({ sideMm: 60, wallMm: 4 })).toBe(896);
    // 100 × 50 × 5 channel, 8 mm flanges: 2·50·8 + 84·5 = 1220 mm².
    expect(channelAreaMm2({ depthMm: 100, flangeWidthMm: 50, webThicknessMm: 5, flangeThicknessMm: 8 })).toBe(1220);
  });

  it('dispatches every shape kind and scales a bundle by its pieces', () => {
    const shapes: StockShape[] = [
      { kind: 'round_bar', diameterMm: 40 },
      { kind: 'square_bar', sideMm: 40 },
      { kind: 'flat_bar', widthMm: 80, heightMm: 20 },
      { kind: 'round_tube', outsideDiameterMm: 60, wallMm: 5 },
      { kind: 'square_tube', sideMm: 60, wallMm: 5 },
      { kind: 'rect_tube', widthMm: 80, heightMm: 40, wallMm: 4 },
      { kind: 'angle', legOnBedMm: 50, legUpMm: 50, thicknessMm: 5 },
      { kind: 'channel', depthMm: 100, flangeWidthMm: 50, webThicknessMm: 5, flangeThicknessMm: 8 },
      { kind: 'beam', depthMm: 200, flangeWidthMm: 100, webThicknessMm: 5.6, flangeThicknessMm: 8.5 },
    ];
    for (const shape of shapes) {
      const one = cutFaceAreaMm2(shape);
      expect(one).toBeGreaterThan(0);
      expect(bundleCutAreaMm2(shape, 7)).toBeCloseTo(7 * one, 9);
    }
  });
});

describe('guards', () => {
  it('names the field that is wrong', () => {
    expect(() => roundBarAreaMm2({ diameterMm: 0 })).toThrow('Diameter must be a number greater than 0 mm');
    expect(() => roundTubeAreaMm2({ outsideDiameterMm: 50, wallMm: 26 })).toThrow('half the outside diameter');
    expect(() => rectTubeAreaMm2({ widthMm: 50, heightMm: 20, wallMm: 11 })).toThrow('half the smaller side');
    expect(() => angleAreaMm2({ legOnBedMm: 50, legUpMm: 30, thicknessMm: 31 })).toThrow('either leg');
    expect(() => channelAreaMm2({ depthMm: 100, flangeWidthMm: 50, webThicknessMm: 5, flangeThicknessMm: 51 })).toThrow(
      'flanges together',
    );
    expect(() => beamAreaMm2({ depthMm: 100, flangeWidthMm: 50, webThicknessMm: 60, flangeThicknessMm: 8 })).toThrow(
      'flange width',
    );
    expect(() => bundleCutAreaMm2({ kind: 'square_bar', sideMm: 10 }, 0)).toThrow('Pieces must be a whole number');
    expect(() => cutFaceAreaMm2({ kind: 'hexagon' } as unknown as StockShape)).toThrow('Unknown stock shape');
  });
});

describe('geometric identities (fast-check)', () => {
  it('a round tube whose wall is half the OD is the round bar', () => {
    fc.assert(
      fc.property(mm(1, 3000), (d) =>
        close(roundTubeAreaMm2({ outsideDiameterMm: d, wallMm: d / 2 }), roundBarAreaMm2({ diameterMm: d })),
      ),
    );
  });

  it('a round tube is the bar of its OD less the bar of its bore', () => {
    fc.assert(
      fc.property(mm(1, 3000), fc.double({ min: 0.001, max: 0.5, noNaN: true }), (d, f) => {
        const wall = d * f;
        const tube = roundTubeAreaMm2({ outsideDiameterMm: d, wallMm: wall });
        const bore = d - 2 * wall;
        return close(tube, roundBarAreaMm2({ diameterMm: d }) - (Math.PI * bore * bore) / 4, 1e-9);
      }),
    );
  });

  it('a rectangular tube with no bore left is the flat bar; a square one is the square bar', () => {
    fc.assert(
      fc.property(mm(1, 3000), mm(1, 3000), (w, h) => {
        const tube = rectTubeAreaMm2({ widthMm: w, heightMm: h, wallMm: Math.min(w, h) / 2 });
        const square = squareTubeAreaMm2({ sideMm: w, wallMm: w / 2 });
        return (
          close(tube, flatBarAreaMm2({ widthMm: w, heightMm: h })) && close(square, squareBarAreaMm2({ sideMm: w }))
        );
      }),
    );
  });

  it('an angle is two overlapping flat bars less the overlap square', () => {
    fc.assert(
      fc.property(mm(1, 3000), mm(1, 3000), fc.double({ min: 0.001, max: 1, noNaN: true }), (a, b, f) => {
        const t = Math.min(a, b) * f;
        const angle = angleAreaMm2({ legOnBedMm: a, legUpMm: b, thicknessMm: t });
        return close(angle, a * t + b * t - t * t);
      }),
    );
  });

  it('an I/H beam and a channel of the same dimensions have the same area, no more than the enclosing rectangle', () => {
    fc.assert(
      fc.property(
        mm(10, 1000),
        mm(10, 500),
        fc.double({ min: 0.01, max: 1, noNaN: true }),
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        (d, b, fw, ff) => {
          const dims = { depthMm: d, flangeWidthMm: b, webThicknessMm: b * fw, flangeThicknessMm: d * ff };
          const beam = beamAreaMm2(dims);
          return close(beam, channelAreaMm2(dims)) && beam <= d * b * (1 + 1e-12);
        },
      ),
    );
  });

  it('area grows with size', () => {
    fc.assert(
      fc.property(
        mm(1, 1500),
        fc.double({ min: 1.0001, max: 2, noNaN: true }),
        fc.double({ min: 0.01, max: 0.49, noNaN: true }),
        (d, grow, f) => {
          const wall = d * f;
          return (
            roundBarAreaMm2({ diameterMm: d * grow }) > roundBarAreaMm2({ diameterMm: d }) &&
            squareBarAreaMm2({ sideMm: d * grow }) > squareBarAreaMm2({ sideMm: d }) &&
            // Bigger OD at the same wall, and a thicker wall at the same OD, both add metal.
            roundTubeAreaMm2({ outsideDiameterMm: d * grow, wallMm: wall }) >
              roundTubeAreaMm2({ outsideDiameterMm: d, wallMm: wall }) &&
            roundTubeAreaMm2({ outsideDiameterMm: d, wallMm: Math.min(wall * grow, d / 2) }) >
              roundTubeAreaMm2({ outsideDiameterMm: d, wallMm: wall }) &&
            squareTubeAreaMm2({ sideMm: d * grow, wallMm: wall }) > squareTubeAreaMm2({ sideMm: d, wallMm: wall })
          );
        },
      ),
    );
  });

  it('a bundle is linear in its piece count', () => {
    fc.assert(
      fc.property(mm(1, 3000), fc.integer({ min: 1, max: 500 }), (d, n) =>
        close(bundleCutAreaMm2({ kind: 'round_bar', diameterMm: d }, n), n * roundBarAreaMm2({ diameterMm: d })),
      ),
    );
  });
});
