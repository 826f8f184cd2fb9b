import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  bandLengthExactMm,
  bandLengthMm,
  centreDistanceForBandLengthExactMm,
  centreDistanceForBandLengthMm,
  shortestBandLengthMm,
  touchingCentreDistanceMm,
} from './band-length.js';

/**
 * Independent check of the band path: a band round two wheels follows the boundary of the convex hull of the two
 * wheel discs. Sample both rims finely, build the hull (Andrew's monotone chain) and measure its perimeter.
 */
function hullPerimeterMm(d1: number, d2: number, c: number, samples = 20000): number {
  const points: [number, number][] = [];
  for (let i = 0; i < samples; i++) {
    const a = (2 * Math.PI * i) / samples;
    points.push([(d1 / 2) * Math.cos(a), (d1 / 2) * Math.sin(a)]);
    points.push([c + (d2 / 2) * Math.cos(a), (d2 / 2) * Math.sin(a)]);
  }
  points.sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  const cross = (o: [number, number], a: [number, number], b: [number, number]) =>
    (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const half = (list: [number, number][]) => {
    const chain: [number, number][] = [];
    for (const p of list) {
      while (chain.length >= 2 && cross(chain[chain.length - 2]!, chain[chain.length - 1]!, p) <= 0) chain.pop();
      chain.push(p);
    }
    chain.pop();
    return chain;
  };
  const hull = [...half(points), ...half([...points].reverse())];
  let perimeter = 0;
  for (let i = 0; i < hull.length; i++) {
    const p = hull[i]!;
    const q = hull[(i + 1) % hull.length]!;
    perimeter += Math.hypot(q[0] - p[0], q[1] - p[1]);
  }
  return perimeter;
}

const wheels = (d1: number, d2: number) => ({ driveWheelDiameterMm: d1, idlerWheelDiameterMm: d2 });

describe('band length', () => {
  // No published worked example is quoted here; the formula is checked against independent figures instead.
  it('equal wheels give 2C + πD, by both formulas (independent check)', () => {
    // 610 mm wheels at 1,800 mm: 3,600 + 1,916.37 = 5,516.37 mm.
    const expected = 2 * 1800 + Math.PI * 610;
    expect(bandLengthMm({ ...wheels(610, 610), centreDistanceMm: 1800 })).toBeCloseTo(expected, 9);
    expect(bandLengthExactMm({ ...wheels(610, 610), centreDistanceMm: 1800 })).toBeCloseTo(expected, 9);
    expect(expected).toBeCloseTo(5516.37, 2);
  });

  it('the exact geometry matches the perimeter of the convex hull of the two wheels (independent check)', () => {
    for (const [d1, d2, c] of [
      [610, 610, 1800],
      [500, 300, 900],
      [900, 200, 600],
    ] as const) {
      expect(bandLengthExactMm({ ...wheels(d1, d2), centreDistanceMm: c })).toBeCloseTo(hullPerimeterMm(d1, d2, c), 2);
    }
  });

  it('the open-belt formula stays within 0.1 mm of the exact geometry on saw-like wheels (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 250, max: 1000, noNaN: true }),
        fc.double({ min: -100, max: 100, noNaN: true }),
        fc.double({ min: 1200, max: 6000, noNaN: true }),
        (d, delta, c) => {
          const w = wheels(d, d + delta);
          return (
            Math.abs(bandLengthMm({ ...w, centreDistanceMm: c }) - bandLengthExactMm({ ...w, centreDistanceMm: c })) <
            0.1
          );
        },
      ),
    );
  });

  it('the open-belt formula never exceeds the exact geometry (fast-check)', () => {
    // exact − open = 2C·g(φ) with g(φ) = cos φ + φ·sin φ − 1 − sin²φ/2, g(0) = 0 and g′(φ) = cos φ·(φ − sin φ) ≥ 0.
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 2000, noNaN: true }),
        fc.double({ min: 10, max: 2000, noNaN: true }),
        fc.double({ min: 1.001, max: 20, noNaN: true }),
        (d1, d2, k) => {
          const c = ((d1 + d2) / 2) * k;
          return (
            bandLengthMm({ ...wheels(d1, d2), centreDistanceMm: c }) <=
            bandLengthExactMm({ ...wheels(d1, d2), centreDistanceMm: c }) + 1e-9 * c
          );
        },
      ),
    );
  });

  it('says what is wrong', () => {
    expect(() => bandLengthMm({ ...wheels(600, 600), centreDistanceMm: 600 })).toThrow(
      'Centre distance must be more than 600 mm (half the sum of the wheel diameters), or the wheels overlap',
    );
    expect(() => bandLengthExactMm({ ...wheels(0, 600), centreDistanceMm: 1000 })).toThrow(
      'Drive wheel diameter must be a number greater than 0 mm',
    );
    expect(() => touchingCentreDistanceMm(wheels(600, -1))).toThrow('Idler wheel diameter');
    expect(() => centreDistanceForBandLengthMm({ ...wheels(600, 600), bandLengthMm: 3000 })).toThrow(
      'A 3000 mm band is too short for these wheels: it must be longer than 3085 mm, or the wheels overlap',
    );
    expect(() => centreDistanceForBandLengthExactMm({ ...wheels(600, 600), bandLengthMm: Number.NaN })).toThrow(
      'Band length must be a number greater than 0 mm',
    );
  });
});

describe('centre distance for a band length', () => {
  it('inverts the equal-wheel case by hand: C = (L − πD)/2', () => {
    expect(centreDistanceForBandLengthMm({ ...wheels(610, 610), bandLengthMm: 5516.37 })).toBeCloseTo(
      (5516.37 - Math.PI * 610) / 2,
      9,
    );
  });

  it('the shortest band is the length with the wheels touching', () => {
    expect(shortestBandLengthMm(wheels(600, 600))).toBeCloseTo(1200 + Math.PI * 600, 9);
  });

  it('returns the C that reproduces L, for the open-belt formula and the exact geometry (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 2000, noNaN: true }),
        fc.double({ min: 10, max: 2000, noNaN: true }),
        fc.double({ min: 1.0001, max: 20, noNaN: true }),
        (d1, d2, k) => {
          const w = wheels(d1, d2);
          const c = touchingCentreDistanceMm(w) * k;
          const open = bandLengthMm({ ...w, centreDistanceMm: c });
          const exact = bandLengthExactMm({ ...w, centreDistanceMm: c });
          const cOpen = centreDistanceForBandLengthMm({ ...w, bandLengthMm: open });
          const cExact = centreDistanceForBandLengthExactMm({ ...w, bandLengthMm: exact });
          return Math.abs(cOpen - c) <= 1e-7 * c && Math.abs(cExact - c) <= 1e-7 * c;
        },
      ),
    );
  });
});
