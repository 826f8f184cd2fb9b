import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CM2_PER_IN2,
  MM2_PER_IN2,
  MM_PER_INCH,
  M_PER_FOOT,
  N_PER_LBF,
  PA_PER_PSI,
  cm2ToIn2,
  cm2ToMm2,
  fpmToMPerMin,
  ftToM,
  in2ToCm2,
  in2ToMm2,
  inToMm,
  lbfToN,
  mPerMinToFpm,
  mToFt,
  mm2ToCm2,
  mm2ToIn2,
  mmToIn,
  nToLbf,
  paToPsi,
  psiToPa,
} from './units.js';

/** True when a and b agree to within `rel` of their size (absolute near zero). */
function close(a: number, b: number, rel = 1e-12): boolean {
  return Math.abs(a - b) <= rel * Math.max(1, Math.abs(a), Math.abs(b));
}

/** Rounds to `digits` significant figures, as SP 811 prints its non-exact factors. */
function significant(value: number, digits: number): number {
  return Number(value.toPrecision(digits));
}

const magnitude = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });

describe('exact factors against NIST SP 811 (2008), Appendix B.8 (factors listed alphabetically)', () => {
  it('inch to metre is 2.54 E-02 exactly, so 25.4 mm', () => {
    // SP 811 B.8 "inch (in) → meter (m) 2.54 E−02", printed bold: exact.
    expect(MM_PER_INCH).toBe(2.54e-2 * 1000);
    expect(inToMm(1)).toBe(25.4);
  });

  it('foot to metre is 3.048 E-01 exactly', () => {
    // SP 811 B.8 "foot (ft) → meter (m) 3.048 E−01", exact.
    expect(M_PER_FOOT).toBe(3.048e-1);
    expect(ftToM(1)).toBe(0.3048);
    // A foot is twelve inches: the two exact factors must agree with each other.
    expect(close(ftToM(1) * 1000, inToMm(12), 1e-15)).toBe(true);
  });

  it('foot per minute to metre per second is 5.08 E-03 exactly', () => {
    // SP 811 B.8 "foot per minute (ft/min) → meter per second (m/s) 5.08 E−03", exact; × 60 s/min gives m/min.
    expect(close(fpmToMPerMin(1), 5.08e-3 * 60, 1e-15)).toBe(true);
  });

  it('pound-force to newton rounds to SP 811’s 4.448 222 E+00 and equals lb × standard gravity', () => {
    // SP 811 B.8 "pound-force (lbf) → newton (N) 4.448 222 E+00" (7 significant digits).
    expect(significant(N_PER_LBF, 7)).toBe(4.448222);
    // Exact: 1 lbf = 0.453 592 37 kg × 9.806 65 m/s² (international pound and standard gravity, both
    // exact by definition; from memory).
    expect(close(N_PER_LBF, 0.45359237 * 9.80665, 1e-15)).toBe(true);
    expect(lbfToN(1)).toBe(N_PER_LBF);
  });

  it('psi to pascal rounds to SP 811’s 6.894 757 E+03', () => {
    // SP 811 B.8 "pound-force per square inch (psi) (lbf/in²) → pascal (Pa) 6.894 757 E+03".
    expect(significant(PA_PER_PSI, 7)).toBe(6894.757);
    expect(psiToPa(1)).toBe(PA_PER_PSI);
  });

  it('square inch to square centimetre is 6.4516 E+00 and to square metre 6.4516 E-04, exactly', () => {
    // SP 811 B.8 "square inch (in²) → square centimeter (cm²) 6.4516 E+00" and "→ square meter (m²) 6.4516 E−04".
    expect(CM2_PER_IN2).toBe(6.4516);
    expect(close(MM2_PER_IN2 / 1e6, 6.4516e-4, 1e-15)).toBe(true);
    // Both follow from the exact inch.
    expect(close(MM2_PER_IN2, MM_PER_INCH * MM_PER_INCH, 1e-15)).toBe(true);
    expect(in2ToCm2(1)).toBe(6.4516);
    expect(in2ToMm2(1)).toBe(645.16);
  });
});

describe('round trips (fast-check)', () => {
  const pairs: [string, (x: number) => number, (x: number) => number][] = [
    ['in ↔ mm', inToMm, mmToIn],
    ['ft ↔ m', ftToM, mToFt],
    ['fpm ↔ m/min', fpmToMPerMin, mPerMinToFpm],
    ['lbf ↔ N', lbfToN, nToLbf],
    ['psi ↔ Pa', psiToPa, paToPsi],
    ['in² ↔ mm²', in2ToMm2, mm2ToIn2],
    ['in² ↔ cm²', in2ToCm2, cm2ToIn2],
    ['mm² ↔ cm²', mm2ToCm2, cm2ToMm2],
  ];

  for (const [name, there, back] of pairs) {
    it(`${name} returns the value it started from, both ways`, () => {
      fc.assert(fc.property(magnitude, (x) => close(back(there(x)), x) && close(there(back(x)), x)));
    });
  }

  it('every conversion is linear: f(a + b) = f(a) + f(b)', () => {
    fc.assert(
      fc.property(magnitude, magnitude, (a, b) =>
        // Tolerance scaled by the parts, not the sum: a + b may cancel to nearly nothing.
        pairs.every(
          ([, there]) =>
            Math.abs(there(a + b) - there(a) - there(b)) <= 1e-12 * (Math.abs(there(a)) + Math.abs(there(b)) + 1),
        ),
      ),
    );
  });

  it('area conversions agree with squaring the length conversion', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e4, noNaN: true }), (inches) =>
        close(in2ToMm2(inches * inches), inToMm(inches) ** 2, 1e-12),
      ),
    );
  });
});
