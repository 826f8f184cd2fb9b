import { describe, expect, it } from 'vitest';
import {
  bandLengthInputSchema,
  bandStressInputSchema,
  centreDistanceInputSchema,
  flexCyclesInputSchema,
} from './schema.js';

const issues = (result: { error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (result.error?.issues ?? []).map((i) => [i.path.map(String).join('.'), i.message]);

describe('band calculator schemas', () => {
  it('accepts a sensible saw and fills defaults', () => {
    expect(
      bandLengthInputSchema.safeParse({ driveWheelDiameterMm: 600, idlerWheelDiameterMm: 600, centreDistanceMm: 1800 })
        .success,
    ).toBe(true);
    expect(
      centreDistanceInputSchema.safeParse({ driveWheelDiameterMm: 600, idlerWheelDiameterMm: 600, bandLengthMm: 5500 })
        .success,
    ).toBe(true);
    const stress = bandStressInputSchema.parse({
      bandThicknessMm: 0.9,
      bandWidthMm: 27,
      wheelDiameterMm: 600,
      tensionForceN: 5000,
      fatigueThresholdPa: 600e6,
    });
    expect(stress.elasticModulusPa).toBe(207e9);
    expect(stress.poissonRatio).toBeUndefined();
    expect(flexCyclesInputSchema.parse({ bandSpeedMPerMin: 60, bandLengthMm: 4000 }).wheelCount).toBe(2);
  });

  it('says what to fix', () => {
    expect(
      issues(
        bandLengthInputSchema.safeParse({
          driveWheelDiameterMm: 600,
          idlerWheelDiameterMm: 600,
          centreDistanceMm: 500,
        }),
      ),
    ).toEqual([
      [
        'centreDistanceMm',
        'Centre distance must be more than half the sum of the wheel diameters, or the wheels overlap',
      ],
    ]);
    expect(
      issues(
        centreDistanceInputSchema.safeParse({
          driveWheelDiameterMm: 600,
          idlerWheelDiameterMm: 600,
          bandLengthMm: 3000,
        }),
      ),
    ).toEqual([
      ['bandLengthMm', 'Band length must be more than 3085 mm to go round these wheels without them overlapping'],
    ]);
    // A wheel left empty reports the wheel, without the band-length rule tripping over it.
    expect(issues(centreDistanceInputSchema.safeParse({ idlerWheelDiameterMm: 600, bandLengthMm: 3000 }))).toEqual([
      ['driveWheelDiameterMm', 'Drive wheel diameter must be a number (mm)'],
    ]);
    expect(
      issues(
        bandStressInputSchema.safeParse({
          bandThicknessMm: 4,
          bandWidthMm: 3,
          wheelDiameterMm: 2,
          tensionForceN: 5000,
          poissonRatio: 0.5,
        }),
      ),
    ).toEqual([
      ['poissonRatio', "Poisson's ratio must be below 0.5 (steel is about 0.29)"],
      ['fatigueThresholdPa', 'Fatigue threshold must be a number (Pa)'],
    ]);
    expect(
      issues(
        bandStressInputSchema.safeParse({
          bandThicknessMm: 4,
          bandWidthMm: 3,
          wheelDiameterMm: 2,
          tensionForceN: 5000,
          fatigueThresholdPa: 1e8,
        }),
      ),
    ).toEqual([
      ['bandThicknessMm', 'Band thickness must be smaller than the band width'],
      ['bandThicknessMm', 'Band thickness must be far smaller than the wheel diameter'],
    ]);
    expect(
      issues(flexCyclesInputSchema.safeParse({ bandSpeedMPerMin: 60, bandLengthMm: 4000, wheelCount: 1 })),
    ).toEqual([['wheelCount', 'A band saw has at least 2 wheels']]);
  });
});

describe('centre distance input with a bad wheel', () => {
  it('reports the wheel instead of throwing', () => {
    const result = centreDistanceInputSchema.safeParse({
      driveWheelDiameterMm: 0,
      idlerWheelDiameterMm: 455,
      bandLengthMm: 4115,
    });
    expect(result.success).toBe(false);
    expect(result.error?.issues.map((i) => i.path.join('.'))).toEqual(['driveWheelDiameterMm']);
  });
});
