import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fpmToMPerMin } from '../units/units.js';
import { checkBandSpeed } from './check-band-speed.js';
import { MATERIAL_GROUPS, MATERIAL_GROUP_LABELS, bandSpeedCheckInputSchema, materialGroupSchema } from './schema.js';
import type { MaterialGroup } from './schema.js';
import {
  BI_METAL_BAND_SPEEDS,
  PRINTED_SPEED_CHANGES,
  recommendedBandSpeed,
  speedChangeForLengthOfCut,
} from './speed-ranges.js';
import { inToMm } from '../units/units.js';

const saw = { minMPerMin: 15, maxMPerMin: 120 };

describe('recommended band speeds (bi-metal reference ranges: shipped site settings)', () => {
  it('has a range for every group, slow for hard and stainless grades, fast for aluminium', () => {
    for (const group of MATERIAL_GROUPS) {
      const range = recommendedBandSpeed(group);
      expect(range.minMPerMin).toBeGreaterThan(0);
      expect(range.maxMPerMin).toBeGreaterThan(range.minMPerMin);
      expect(MATERIAL_GROUP_LABELS[group]).toBeTruthy();
    }
    // The ordering every speed chart of the trade agrees on (common practice, no source).
    const top = (g: MaterialGroup) => BI_METAL_BAND_SPEEDS[g].maxMPerMin;
    expect(top('stainless_steel')).toBeLessThan(top('alloy_steel'));
    expect(top('alloy_steel')).toBeLessThan(top('carbon_steel'));
    expect(top('carbon_steel')).toBeLessThan(top('aluminium'));
  });

  it('shows the range in fpm with the exact foot (NIST SP 811 B.8)', () => {
    const carbon = recommendedBandSpeed('carbon_steel');
    expect(fpmToMPerMin(carbon.minFpm)).toBeCloseTo(carbon.minMPerMin, 12);
    expect(carbon.maxFpm).toBeCloseTo(90 / 0.3048, 9);
    expect(() => recommendedBandSpeed('wood' as MaterialGroup)).toThrow('Unknown material group: wood');
  });
});

describe("band speed corrections printed in Machinery's Handbook, 31st ed., p. 1245", () => {
  it('changes the speed by length of cut as printed: +15 %, +12 %, +10 %, 0, −12 % at 1/4, 3/4, 1 1/4, 4, 8 in', () => {
    const printed: [number, number][] = [
      [0.25, 0.15],
      [0.75, 0.12],
      [1.25, 0.1],
      [4, 0],
      [8, -0.12],
    ];
    expect(PRINTED_SPEED_CHANGES.map((p) => [p.lengthOfCutIn, p.change])).toEqual(printed);
    for (const [inches, change] of printed) expect(speedChangeForLengthOfCut(inToMm(inches))).toBeCloseTo(change, 12);
    // Between printed lengths, linear in the length (our reading); beyond them, the end value (ours).
    expect(speedChangeForLengthOfCut(inToMm(6))).toBeCloseTo(-0.06, 12);
    expect(speedChangeForLengthOfCut(inToMm(0.1))).toBeCloseTo(0.15, 12);
    expect(speedChangeForLengthOfCut(inToMm(20))).toBeCloseTo(-0.12, 12);
  });

  it('applies the length of cut, a carbon steel blade (−50 %) and dry cutting (−30 to −50 %) to the site range', () => {
    const ref = BI_METAL_BAND_SPEEDS.carbon_steel;
    const small = recommendedBandSpeed('carbon_steel', { lengthOfCutMm: inToMm(0.25) });
    expect(small.minMPerMin).toBeCloseTo(ref.minMPerMin * 1.15, 12);
    expect(small.maxMPerMin).toBeCloseTo(ref.maxMPerMin * 1.15, 12);
    expect(small.correctionBasis).toEqual({ kind: 'published', citation: expect.stringContaining('p. 1245') });
    const carbonDry = recommendedBandSpeed('carbon_steel', { bladeMaterial: 'carbon', dry: true });
    expect(carbonDry.minMPerMin).toBeCloseTo(ref.minMPerMin * 0.5 * 0.5, 12);
    expect(carbonDry.maxMPerMin).toBeCloseTo(ref.maxMPerMin * 0.5 * 0.7, 12);
    expect(carbonDry.corrections.map((c) => c.label)).toEqual([
      '−50 % for a carbon steel blade',
      '−30 % to −50 % for cutting dry',
    ]);
    expect(recommendedBandSpeed('carbon_steel').correctionBasis).toBeNull();
  });

  it("the shipped stainless range holds the Handbook's worked figure: 120 ft/min for 304 stainless at 4 in", () => {
    const stainless = recommendedBandSpeed('stainless_steel', { lengthOfCutMm: inToMm(4) });
    expect(stainless.minFpm).toBeLessThanOrEqual(120);
    expect(stainless.maxFpm).toBeGreaterThanOrEqual(120);
  });

  it("takes the site's range, and says it is the site's", () => {
    const r = recommendedBandSpeed('aluminium', {
      settings: {
        'band_speed.aluminium': {
          key: 'band_speed.aluminium',
          values: { minMPerMin: 150, maxMPerMin: 250 },
          changedByName: 'Ana Ruiz',
          changedAt: '2025-06-01T00:00:00.000Z',
        },
      },
    });
    expect(r).toMatchObject({ minMPerMin: 150, maxMPerMin: 250 });
    expect(r.basis).toMatchObject({
      kind: 'site_setting',
      settingKey: 'band_speed.aluminium',
      changedByName: 'Ana Ruiz',
    });
    expect(recommendedBandSpeed('aluminium').basis).toMatchObject({ kind: 'site_setting', changedAt: null });
  });
});

describe('checkBandSpeed', () => {
  it('says within, below or above, with what to do', () => {
    const within = checkBandSpeed('carbon_steel', 70, saw);
    expect(within).toMatchObject({
      position: 'within',
      speedWithinSaw: true,
      sawCanReachRange: true,
      reachableMPerMin: { minMPerMin: 50, maxMPerMin: 90 },
    });
    expect(within.explanation).toBe('70 m/min is within the 50–90 m/min range for carbon steel.');

    const below = checkBandSpeed('carbon_steel', 30, saw);
    expect(below.position).toBe('below');
    expect(below.explanation).toBe(
      '30 m/min is below the 50–90 m/min range for carbon steel; raise it to at least 50 m/min.',
    );

    const above = checkBandSpeed('stainless_steel', 60, saw, { system: 'imperial' });
    expect(above.position).toBe('above');
    // 60 m/min = 197 fpm; 20–40 m/min = 66–131 fpm.
    expect(above.explanation).toBe(
      '197 ft/min is above the 66–131 ft/min range for stainless steel; lower it to at most 131 ft/min.',
    );
  });

  it('says when the saw cannot reach the range at all, or only part of it', () => {
    const alu = checkBandSpeed('aluminium', 90, { minMPerMin: 20, maxMPerMin: 90 });
    expect(alu).toMatchObject({ position: 'below', sawCanReachRange: false, reachableMPerMin: null });
    expect(alu.explanation).toBe(
      '90 m/min is below the 100–300 m/min range for aluminium; this saw runs 20–90 m/min and cannot reach that range.',
    );

    const partly = checkBandSpeed('aluminium', 400, { minMPerMin: 20, maxMPerMin: 150 });
    expect(partly.reachableMPerMin).toEqual({ minMPerMin: 100, maxMPerMin: 150 });
    expect(partly.speedWithinSaw).toBe(false);
    expect(partly.explanation).toBe(
      '400 m/min is above the 100–300 m/min range for aluminium; lower it to at most 150 m/min (this saw runs 20–150 m/min).',
    );
  });

  it('position agrees with the range and reach with the overlap (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...MATERIAL_GROUPS),
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 1, max: 500, noNaN: true }),
        fc.double({ min: 0, max: 500, noNaN: true }),
        (group, speed, sawMin, spread) => {
          const result = checkBandSpeed(group, speed, { minMPerMin: sawMin, maxMPerMin: sawMin + spread });
          const { minMPerMin, maxMPerMin } = BI_METAL_BAND_SPEEDS[group];
          const position = speed < minMPerMin ? 'below' : speed > maxMPerMin ? 'above' : 'within';
          const overlaps = sawMin <= maxMPerMin && sawMin + spread >= minMPerMin;
          return (
            result.position === position && result.sawCanReachRange === overlaps && result.explanation.endsWith('.')
          );
        },
      ),
    );
  });

  it('refuses a stopped band or a reversed saw range', () => {
    expect(() => checkBandSpeed('cast_iron', 0, saw)).toThrow('Band speed must be a number greater than 0 m/min');
    expect(() => checkBandSpeed('cast_iron', 40, { minMPerMin: 90, maxMPerMin: 20 })).toThrow(
      'must not be below the lowest',
    );
    expect(() => checkBandSpeed('cast_iron', 40, { minMPerMin: -1, maxMPerMin: 20 })).toThrow(
      'Lowest band speed of the saw',
    );
  });
});

describe('band speed check schema', () => {
  it('parses and says what to fix', () => {
    expect(
      bandSpeedCheckInputSchema.parse({
        materialGroup: 'tool_steel',
        speedMPerMin: 30,
        sawRange: { minMPerMin: 20, maxMPerMin: 100 },
      }).unitSystem,
    ).toBe('metric');
    expect(materialGroupSchema.safeParse('wood').error?.issues[0]?.message).toMatch(
      /^Choose a material group: carbon steel/,
    );
    const reversed = bandSpeedCheckInputSchema.safeParse({
      materialGroup: 'tool_steel',
      speedMPerMin: 30,
      sawRange: { minMPerMin: 100, maxMPerMin: 20 },
    });
    expect(reversed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['sawRange.maxMPerMin', 'Highest band speed must not be below the lowest'],
    ]);
    expect(
      bandSpeedCheckInputSchema.safeParse({
        materialGroup: 'tool_steel',
        speedMPerMin: -5,
        sawRange: { minMPerMin: 20, maxMPerMin: 100 },
      }).error?.issues[0]?.message,
    ).toBe('Band speed must be greater than 0');
  });
});
