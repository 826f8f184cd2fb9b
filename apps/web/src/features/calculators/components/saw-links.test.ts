import { describe, expect, it } from 'vitest';
import { calculatorHrefForSaw, sawStartTexts, startTextsFromSearch } from './saw-links';
import type { CalculatorSaw } from './saw-picker';

// 1 in = 25.4 mm and 1 ft = 0.3048 m exactly (NIST SP 811 (2008), B.8): a 1-1/4 x .035 band on 18 in wheels,
// 60–360 ft/min.
const saw: CalculatorSaw = {
  id: 'c4e8a1b2-7d3f-4e9a-b6c5-0f1d2e3a4b55',
  label: 'HAM-S01 · Bay 1 bar saw',
  headFeed: 'hydraulic',
  wheelDiameterMm: 18 * 25.4,
  bandThicknessMm: 0.035 * 25.4,
  bandWidthMm: 1.25 * 25.4,
  bandSpeedMinMPerMin: 60 * 0.3048,
  bandSpeedMaxMPerMin: 360 * 0.3048,
};

describe('a calculator opened for a saw', () => {
  it('carries the saw’s figures in the site’s units, as a person would type them', () => {
    expect(sawStartTexts(saw, 'imperial')).toEqual({
      thickness: '0.035',
      width: '1.25',
      wheel: '18',
      sawMin: '60',
      sawMax: '360',
    });
    // 0.035 in = 0.889 mm (the float 0.8890000000000001 is trimmed); 60 ft/min = 18.288 m/min.
    expect(sawStartTexts(saw, 'metric')).toEqual({
      thickness: '0.889',
      width: '31.75',
      wheel: '457.2',
      sawMin: '18.288',
      sawMax: '109.728',
    });
  });

  it('builds the address with the units, the saw and its figures, and reads the figures back', () => {
    const href = calculatorHrefForSaw('check-targets', saw, 'imperial');
    expect(href).toBe(
      `/calculators/check-targets?units=imperial&sawId=${saw.id}&thickness=0.035&width=1.25&wheel=18&sawMin=60&sawMax=360`,
    );
    const search = new URL(href, 'http://kerfline.test').searchParams;
    expect(startTextsFromSearch(search)).toEqual(sawStartTexts(saw, 'imperial'));
  });

  it('carries a spring-fed saw’s own head-force limits, and none for a hydraulic head or a limit left to the site', () => {
    // 6 lbf = 26.689 N (1 lbf = 4.4482216152605 N, NIST SP 811 (2008), B.8).
    const spring = { ...saw, headFeed: 'gravity_spring' as const, maxHeadForceN: 26.6893, minHeadForceN: null };
    expect(sawStartTexts(spring, 'imperial')).toMatchObject({ maxForce: '6' });
    expect(sawStartTexts(spring, 'imperial')).not.toHaveProperty('minForce');
    expect(sawStartTexts(spring, 'metric')).toMatchObject({ maxForce: '26.6893' });
    expect(sawStartTexts({ ...spring, headFeed: 'hydraulic' }, 'imperial')).not.toHaveProperty('maxForce');
  });
});
