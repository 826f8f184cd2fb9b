import { describe, expect, it } from 'vitest';
import { settingDefinition } from '@kerfline/domain/settings/registry';
import {
  fieldBounds,
  fieldDualText,
  fieldEntryText,
  settingFormTexts,
  settingInputFromTexts,
  storedFromDisplay,
} from './setting-values';

// 1 psi = 6,894.757 Pa and 1 lbf = 4.4482216152605 N exactly by definition (NIST SP 811 (2008), B.8); the
// products are worked by hand.
const tension = settingDefinition('band_tension.bimetal')!;
const [lowest, highest] = tension.fields;
const PSI_IN_MPA = 6894.757293168361 / 1e6;

describe('a setting’s fields in the site’s units', () => {
  it('shows a tension stored in MPa in psi first on an imperial site, MPa first on a metric one', () => {
    expect(fieldDualText(lowest!, 30000 * PSI_IN_MPA, 'imperial')).toBe('30,000\u00a0psi (206.8\u00a0MPa)');
    expect(fieldDualText(lowest!, 30000 * PSI_IN_MPA, 'metric')).toBe('206.8\u00a0MPa (30,000\u00a0psi)');
  });

  it('puts a value in a field as plain digits, and reads a typed one back into the stored unit', () => {
    expect(fieldEntryText(lowest!, 30000 * PSI_IN_MPA, 'imperial')).toBe('30000');
    expect(fieldEntryText(lowest!, 206.8427, 'metric')).toBe('206.84');
    expect(storedFromDisplay(lowest!, 31000, 'imperial')).toBeCloseTo(31000 * PSI_IN_MPA, 9);
    expect(storedFromDisplay(lowest!, 210, 'metric')).toBeCloseTo(210, 12);
    const force = settingDefinition('head_force')!.fields[1]!;
    // 8 lbf = 35.5858 N.
    expect(storedFromDisplay(force, 8, 'imperial')).toBeCloseTo(35.585772922084, 9);
  });

  it('says the accepted range in the site’s unit, rounded inwards', () => {
    // 10–1000 MPa = 1,450.4–145,037.7 psi: 1,451 to 145,037 psi typed as shown are both accepted.
    expect(fieldBounds(lowest!, 'imperial')).toEqual({ min: 1451, max: 145037 });
    expect(fieldBounds(lowest!, 'metric')).toEqual({ min: 10, max: 1000 });
  });
});

describe('what the editor sends', () => {
  const value = { minMPa: 30000 * PSI_IN_MPA, maxMPa: 35000 * PSI_IN_MPA };
  const start = { texts: settingFormTexts(tension, value, 'metric'), value };

  it('keeps an untouched field’s stored number exactly, and converts the one typed', () => {
    const { input, fieldErrors } = settingInputFromTexts(tension, { ...start.texts, maxMPa: '250' }, start, 'metric');
    expect(fieldErrors).toEqual({});
    expect(input).toEqual({ minMPa: value.minMPa, maxMPa: 250 });
  });

  it('words a range or a misread number in the site’s unit', () => {
    const imperialStart = { texts: settingFormTexts(tension, value, 'imperial'), value };
    const { fieldErrors } = settingInputFromTexts(
      tension,
      { minMPa: '500', maxMPa: 'lots' },
      imperialStart,
      'imperial',
    );
    expect(fieldErrors.minMPa).toBe(`${lowest!.label} must be from 1,451 to 145,037 psi`);
    expect(fieldErrors.maxMPa).toMatch(/"lots" is not a number/);
    expect(highest!.label.length).toBeGreaterThan(0);
  });
});
