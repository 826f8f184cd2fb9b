import { describe, expect, it } from 'vitest';
import { cutLogCreateSchema } from '@kerfline/domain/cut-logs/schema';
import { cutLogDefaults, cutLogFieldForPath, cutLogInput } from './cut-log-values';

const SAW = 'c4e8a1b2-7d3f-4e9a-b6c5-0f1d2e3a4b55';

describe('a cut log as typed', () => {
  it('turns inches, ft/min and minutes into the domain’s mm, m/min and seconds', () => {
    const values = {
      ...cutLogDefaults('America/Chicago', 'carbon_steel'),
      shape: 'rect_tube' as const,
      widthMm: '4',
      heightMm: '2',
      wallMm: '1/4',
      quantity: '12',
      bandSpeed: '200',
      cutTimeMin: '1.5',
    };
    const { input, fieldErrors } = cutLogInput(values, SAW, 'imperial', 'America/Chicago');
    expect(fieldErrors).toEqual({});
    // 1 in = 25.4 mm and 1 ft = 0.3048 m exactly (NIST SP 811, B.8).
    expect(input.stock.shape).toEqual({ kind: 'rect_tube', widthMm: 101.6, heightMm: 50.8, wallMm: 6.35 });
    expect(input.bandSpeedMPerMin).toBe(60.96);
    expect(input.cutTimeS).toBe(90);
    expect(cutLogCreateSchema.safeParse(input).success).toBe(true);
  });

  it('says which size is missing or not a number, and maps the schema’s paths back to the fields', () => {
    const values = { ...cutLogDefaults('UTC', null), diameterMm: 'two' };
    const { fieldErrors } = cutLogInput(values, SAW, 'metric', 'UTC');
    expect(fieldErrors.diameterMm).toMatch(/^Diameter: "two" is not a number/);
    expect(fieldErrors.materialGroup).toBe('Choose the material that was cut');
    expect(cutLogFieldForPath('stock.shape.wallMm')).toBe('wallMm');
    expect(cutLogFieldForPath('stock.piecesAcross')).toBe('piecesAcross');
    expect(cutLogFieldForPath('bandSpeedMPerMin')).toBe('bandSpeed');
  });
});
