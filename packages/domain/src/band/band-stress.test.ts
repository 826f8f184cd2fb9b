import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { inToMm, nToLbf, paToPsi, psiToPa } from '../units/units.js';
import {
  STEEL_ELASTIC_MODULUS_PA,
  bandFatigueIndex,
  bendingStressPa,
  tensionForceForStressN,
  tensionStressPa,
} from './band-stress.js';
import { flexCycles } from './flex-cycles.js';

describe('bending stress', () => {
  it('reproduces the flat metal belt worked example in Shigley’s Mechanical Engineering Design, chapter 17', () => {
    // The example: a stainless steel belt 0.003 in thick over two 4 in pulleys, E = 28 Mpsi, ν = 0.285, endurance
    // strength 51,210 psi; the allowable tight-side tension comes to 85.1 lbf per inch of belt width.
    const bendingPa = bendingStressPa({
      bandThicknessMm: inToMm(0.003),
      wheelDiameterMm: inToMm(4),
      elasticModulusPa: psiToPa(28e6),
      poissonRatio: 0.285,
    });
    // E·t/((1 − ν²)·D) = 28e6 × 0.003 / (0.918775 × 4) = 22,857 psi.
    expect(Math.round(paToPsi(bendingPa))).toBe(22857);
    const allowableN = tensionForceForStressN({
      tensionStressPa: psiToPa(51210) - bendingPa,
      bandWidthMm: inToMm(1),
      bandThicknessMm: inToMm(0.003),
    });
    expect(nToLbf(allowableN)).toBeCloseTo(85.1, 1);
  });

  it('agrees with beam theory σ = M·c/I with M = E·I/ρ (any mechanics of materials text)', () => {
    // A 27 × 0.9 mm band on a 600 mm wheel: the band's surface sits on radius ρ = D/2, its outer fibre c = t/2 out.
    const widthMm = 27;
    const thicknessMm = 0.9;
    const inertiaMm4 = (widthMm * thicknessMm ** 3) / 12;
    const momentNmm = ((STEEL_ELASTIC_MODULUS_PA / 1e6) * inertiaMm4) / (600 / 2);
    const stressMPa = (momentNmm * (thicknessMm / 2)) / inertiaMm4;
    expect(bendingStressPa({ bandThicknessMm: thicknessMm, wheelDiameterMm: 600 })).toBeCloseTo(stressMPa * 1e6, 3);
    // 207 GPa × 0.9 / 600 = 310.5 MPa.
    expect(stressMPa).toBeCloseTo(310.5, 9);
  });

  it('takes E = 207 GPa = 30 000 ksi for carbon steel, as the printed table of material constants gives it', () => {
    // Triton College strength-of-materials table: 0.2–0.8 % C steels E = 30,000 ksi, 207 GPa; Gere, Mechanics of
    // Materials, 5th ed.: steels 190–210 GPa. 30 000 ksi × 6.894 757 MPa/ksi (NIST SP 811 B.8) = 206.84 GPa.
    expect(STEEL_ELASTIC_MODULUS_PA / 1e9).toBeCloseTo(207, 9);
    expect(Math.abs(STEEL_ELASTIC_MODULUS_PA - 30000e3 * 6894.757293168) / STEEL_ELASTIC_MODULUS_PA).toBeLessThan(
      0.001,
    );
    expect(STEEL_ELASTIC_MODULUS_PA).toBeGreaterThanOrEqual(190e9);
    expect(STEEL_ELASTIC_MODULUS_PA).toBeLessThanOrEqual(210e9);
  });

  it('grows with thickness and falls with wheel diameter in proportion (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.1, max: 3, noNaN: true }),
        fc.double({ min: 100, max: 2000, noNaN: true }),
        fc.double({ min: 1.1, max: 4, noNaN: true }),
        (t, d, k) => {
          const base = bendingStressPa({ bandThicknessMm: t, wheelDiameterMm: d });
          const thicker = bendingStressPa({ bandThicknessMm: t * k, wheelDiameterMm: d });
          const bigger = bendingStressPa({ bandThicknessMm: t, wheelDiameterMm: d * k });
          return Math.abs(thicker - base * k) <= 1e-9 * thicker && Math.abs(bigger - base / k) <= 1e-9 * base;
        },
      ),
    );
  });

  it('refuses impossible inputs', () => {
    expect(() => bendingStressPa({ bandThicknessMm: 0, wheelDiameterMm: 600 })).toThrow(
      'Band thickness must be a number greater than 0 mm',
    );
    expect(() => bendingStressPa({ bandThicknessMm: 1, wheelDiameterMm: 600, poissonRatio: 0.5 })).toThrow(
      "Poisson's ratio must be below 0.5",
    );
    expect(() => bendingStressPa({ bandThicknessMm: 1, wheelDiameterMm: 600, poissonRatio: -0.1 })).toThrow(
      "Poisson's ratio must be a number of 0 or more (got -0.1)",
    );
    expect(() => bendingStressPa({ bandThicknessMm: 10, wheelDiameterMm: 5 })).toThrow(
      'far smaller than the wheel diameter',
    );
    expect(() => bendingStressPa({ bandThicknessMm: 1, wheelDiameterMm: 600, elasticModulusPa: -1 })).toThrow(
      'Elastic modulus',
    );
  });
});

describe('tension stress', () => {
  it('spreads the force over the section: 5,000 N on 27 × 0.9 mm is 205.8 MPa', () => {
    // 5000 N / 24.3 mm² = 205.76 N/mm² (worked by hand).
    expect(tensionStressPa({ tensionForceN: 5000, bandWidthMm: 27, bandThicknessMm: 0.9 }) / 1e6).toBeCloseTo(
      205.761,
      3,
    );
    expect(tensionStressPa({ tensionForceN: 0, bandWidthMm: 27, bandThicknessMm: 0.9 })).toBe(0);
  });

  it('force for a stress is the inverse of stress for a force (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 1e5, noNaN: true }),
        fc.double({ min: 5, max: 80, noNaN: true }),
        fc.double({ min: 0.3, max: 2, noNaN: true }),
        (f, w, t) => {
          const stress = tensionStressPa({ tensionForceN: f, bandWidthMm: w, bandThicknessMm: t });
          return (
            Math.abs(tensionForceForStressN({ tensionStressPa: stress, bandWidthMm: w, bandThicknessMm: t }) - f) <=
            1e-9 * (f + 1)
          );
        },
      ),
    );
  });

  it('refuses negative force, stress and empty sections', () => {
    expect(() => tensionStressPa({ tensionForceN: -1, bandWidthMm: 27, bandThicknessMm: 0.9 })).toThrow(
      'Tension force must be a number of 0 N or more',
    );
    expect(() => tensionStressPa({ tensionForceN: 1, bandWidthMm: 0, bandThicknessMm: 0.9 })).toThrow('Band width');
    expect(() => tensionForceForStressN({ tensionStressPa: -5, bandWidthMm: 27, bandThicknessMm: 0.9 })).toThrow(
      'Tension stress',
    );
  });
});

describe('fatigue index', () => {
  const band = { bandThicknessMm: 0.9, bandWidthMm: 27, wheelDiameterMm: 600, tensionForceN: 5000 };

  it('adds bending and tension and flags above the chosen threshold', () => {
    const below = bandFatigueIndex({ ...band, fatigueThresholdPa: 600e6 });
    expect(below.bendingStressPa / 1e6).toBeCloseTo(310.5, 9);
    expect(below.tensionStressPa / 1e6).toBeCloseTo(205.761, 3);
    expect(below.combinedStressPa / 1e6).toBeCloseTo(516.261, 3);
    expect(below.aboveThreshold).toBe(false);
    expect(bandFatigueIndex({ ...band, fatigueThresholdPa: 500e6 }).aboveThreshold).toBe(true);
    expect(() => bandFatigueIndex({ ...band, fatigueThresholdPa: 0 })).toThrow('Fatigue threshold');
  });

  it('flags exactly when the combined stress is above the threshold (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e6, max: 2e9, noNaN: true }), (threshold) => {
        const index = bandFatigueIndex({ ...band, fatigueThresholdPa: threshold });
        return index.aboveThreshold === index.combinedStressPa > threshold && index.fatigueThresholdPa === threshold;
      }),
    );
  });
});

describe('flex cycles', () => {
  it('counts passes and wheel bends per hour: a 4,000 mm band at 60 m/min', () => {
    // Worked by hand: 60 m/min ÷ 4 m = 15 passes/min = 900 passes/h; two wheels bend it 1,800 times an hour.
    expect(flexCycles({ bandSpeedMPerMin: 60, bandLengthMm: 4000 })).toEqual({
      passesPerHour: 900,
      bendCyclesPerHour: 1800,
    });
    expect(flexCycles({ bandSpeedMPerMin: 60, bandLengthMm: 4000, wheelCount: 3 }).bendCyclesPerHour).toBe(2700);
  });

  it('is proportional to speed and inversely to length; bends are passes × wheels (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 500, noNaN: true }),
        fc.double({ min: 1000, max: 20000, noNaN: true }),
        fc.integer({ min: 1, max: 4 }),
        (v, l, n) => {
          const base = flexCycles({ bandSpeedMPerMin: v, bandLengthMm: l, wheelCount: n });
          const faster = flexCycles({ bandSpeedMPerMin: 2 * v, bandLengthMm: l, wheelCount: n });
          const longer = flexCycles({ bandSpeedMPerMin: v, bandLengthMm: 2 * l, wheelCount: n });
          const near = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.abs(b);
          return (
            near(faster.passesPerHour, 2 * base.passesPerHour) &&
            near(longer.passesPerHour, base.passesPerHour / 2) &&
            near(base.bendCyclesPerHour, n * base.passesPerHour)
          );
        },
      ),
    );
  });

  it('refuses a stopped band or no wheels', () => {
    expect(() => flexCycles({ bandSpeedMPerMin: 0, bandLengthMm: 4000 })).toThrow(
      'Band speed must be a number greater than 0 m/min',
    );
    expect(() => flexCycles({ bandSpeedMPerMin: 60, bandLengthMm: 4000, wheelCount: 0 })).toThrow(
      'Wheels must be a whole number',
    );
  });
});
