import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  largeAreaFromDisplay,
  largeAreaToDisplay,
  DISPLAY_UNITS,
  areaFromDisplay,
  areaRateFromDisplay,
  areaRateToDisplay,
  areaToDisplay,
  DISPLAY_QUANTITIES,
  dualText,
  moneyPerAreaToDisplay,
  quantityFromDisplay,
  quantityNumber,
  quantityToDisplay,
  smallLengthToDisplay,
  bandSpeedFromDisplay,
  bandSpeedToDisplay,
  forceFromDisplay,
  forceToDisplay,
  formatNumber,
  lengthFromDisplay,
  lengthToDisplay,
  parseDisplayNumber,
  stressFromDisplay,
  stressToDisplay,
} from './display.js';
import type { UnitSystem } from './display.js';
import { requireCount, requireNonNegative, requirePositive } from './guards.js';

const systems: UnitSystem[] = ['metric', 'imperial'];

describe('showing quantities in a unit system', () => {
  it('shows 31.75 mm as 1.25 in and 31.8 mm', () => {
    expect(lengthToDisplay(31.75, 'imperial')).toEqual({ value: 1.25, unit: 'in', text: '1.25 in' });
    expect(lengthToDisplay(31.75, 'metric')).toEqual({ value: 31.8, unit: 'mm', text: '31.8 mm' });
  });

  it('shows band speed in whole fpm or m/min, with thousands separators', () => {
    // 75 m/min ÷ 0.3048 m/ft = 246.06 ft/min (NIST SP 811 B.8, foot).
    expect(bandSpeedToDisplay(75, 'imperial').text).toBe('246 ft/min');
    expect(bandSpeedToDisplay(75, 'metric').text).toBe('75 m/min');
    expect(bandSpeedToDisplay(1000, 'imperial').text).toBe('3,281 ft/min');
  });

  it('shows areas in in² or cm² and cutting rates per minute', () => {
    // 645.16 mm² is 1 in² exactly and 6.4516 cm² (NIST SP 811 B.8, square inch).
    expect(areaToDisplay(645.16, 'imperial').text).toBe('1 in²');
    expect(areaToDisplay(645.16, 'metric').text).toBe('6.45 cm²');
    expect(areaRateToDisplay(6451.6, 'imperial').text).toBe('10 in²/min');
    expect(areaRateToDisplay(6451.6, 'metric').text).toBe('64.5 cm²/min');
  });

  it('shows force in lbf or N and stress in psi or MPa', () => {
    expect(forceToDisplay(4448.2216152605, 'imperial').text).toBe('1,000 lbf');
    expect(forceToDisplay(4448.2, 'metric').text).toBe('4,448 N');
    expect(stressToDisplay(6894757.29, 'imperial').text).toBe('1,000 psi');
    expect(stressToDisplay(206.84e6, 'metric').text).toBe('206.8 MPa');
  });

  it('takes decimals and locale from the options', () => {
    expect(lengthToDisplay(4000, 'metric', { decimals: 0 }).text).toBe('4,000 mm');
    expect(lengthToDisplay(123.45, 'metric', { locale: 'de-DE' }).text).toBe('123,5 mm');
    expect(lengthToDisplay(1234.5, 'metric', { locale: 'de-DE', decimals: 1 }).text).toBe('1.234,5 mm');
  });

  it('never prints a negative zero', () => {
    expect(lengthToDisplay(-0.01, 'metric', { decimals: 1 }).text).toBe('0.0 mm');
    expect(lengthToDisplay(-0.01, 'metric', { decimals: 1 }).value).toBe(0);
    expect(lengthToDisplay(-0.00001, 'metric').text).toBe('0 mm');
    expect(formatNumber(-0.0001, 2)).toBe('0.00');
  });

  it('gives every quantity a unit label and decimals in both systems', () => {
    for (const units of Object.values(DISPLAY_UNITS)) {
      for (const system of systems) {
        expect(units[system].unit.length).toBeGreaterThan(0);
        expect(units[system].decimals).toBeGreaterThanOrEqual(0);
      }
    }
  });
});

describe('the formatting policy', () => {
  // Conversions by the exact factors of NIST SP 811 (2008), Appendix B.8; the decimals are the policy's own.
  it('shows lengths with the decimals their size deserves, without trailing zeros', () => {
    const inches = (value: number) => lengthToDisplay(value * 25.4, 'imperial').text;
    expect(inches(0.042)).toBe('0.042 in');
    expect(inches(1.25)).toBe('1.25 in');
    expect(inches(1.5)).toBe('1.5 in');
    expect(inches(52.874)).toBe('52.87 in');
    expect(inches(162.01)).toBe('162 in');
    expect(inches(1234.56)).toBe('1,235 in');
    expect(lengthToDisplay(0.9, 'metric').text).toBe('0.9 mm');
    expect(lengthToDisplay(455, 'metric').text).toBe('455 mm');
    expect(lengthToDisplay(3505, 'metric').text).toBe('3,505 mm');
  });

  it('shows gauges and clearances in thousandths of an inch or hundredths of a millimetre, zeros kept', () => {
    expect(smallLengthToDisplay(0.05 * 25.4, 'imperial').text).toBe('0.050 in');
    expect(smallLengthToDisplay(1.0668, 'imperial').text).toBe('0.042 in');
    expect(smallLengthToDisplay(1.0668, 'metric').text).toBe('1.07 mm');
    expect(smallLengthToDisplay(1.1, 'metric').text).toBe('1.10 mm');
    // A tolerance of 0.001 in (0.0254 mm) keeps two significant digits instead of printing 0.
    expect(smallLengthToDisplay(0.0254, 'imperial').text).toBe('0.001 in');
    expect(smallLengthToDisplay(0.0254, 'metric').text).toBe('0.025 mm');
    expect(lengthToDisplay(0.0254, 'metric').text).toBe('0.025 mm');
  });

  it('shows speeds whole, forces to a tenth below 100, stresses in whole psi or tenths of a MPa', () => {
    expect(bandSpeedToDisplay(24.384, 'imperial').text).toBe('80 ft/min');
    expect(bandSpeedToDisplay(24.384, 'metric').text).toBe('24 m/min');
    expect(forceToDisplay(35.585772922084, 'imperial').text).toBe('8 lbf');
    expect(forceToDisplay(35.585772922084, 'metric').text).toBe('35.6 N');
    expect(forceToDisplay(4448.2216152605, 'metric').text).toBe('4,448 N');
    expect(stressToDisplay(206.84e6, 'imperial').text).toBe('30,000 psi');
    expect(stressToDisplay(200e6, 'metric').text).toBe('200 MPa');
  });

  it('offers every quantity through one pair of functions', () => {
    for (const kind of DISPLAY_QUANTITIES) {
      for (const system of systems) {
        const shown = quantityToDisplay(kind, 1234.5, system);
        expect(shown.unit).toBe(DISPLAY_UNITS[kind][system].unit);
        expect(
          quantityFromDisplay(kind, quantityToDisplay(kind, 1234.5, system, { decimals: 9 }).value, system),
        ).toBeCloseTo(1234.5, 3);
        expect(`${quantityNumber(kind, 1234.5, system)} ${shown.unit}`).toBe(shown.text);
      }
    }
  });

  it('puts the site’s own unit first and the other system’s second', () => {
    expect(dualText('smallLength', 1.0922, 'imperial')).toBe('0.043 in (1.09 mm)');
    expect(dualText('smallLength', 1.0922, 'metric')).toBe('1.09 mm (0.043 in)');
    expect(dualText('bandSpeed', 121.92, 'imperial')).toBe('400 ft/min (122 m/min)');
    expect(dualText('stress', 206.84e6, 'imperial')).toBe('30,000 psi (206.8 MPa)');
    expect(dualText('force', 35.585772922084, 'imperial')).toBe('8 lbf (35.6 N)');
  });

  it('shows a blade’s life or a month’s cutting in square feet or square metres', () => {
    // 1 ft = 0.3048 m exactly (NIST SP 811 B.8), so 1 ft² = 92 903.04 mm²; worked by hand:
    // 4 500 000 mm² = 48.4375… ft² → "48.4 ft²"; = 4.5 m² → "4.5 m²"; 250 000 000 mm² = 2 690.97 ft² → "2,691 ft²".
    expect(largeAreaToDisplay(4_500_000, 'imperial').text).toBe('48.4 ft²');
    expect(largeAreaToDisplay(4_500_000, 'metric').text).toBe('4.5 m²');
    expect(largeAreaToDisplay(250_000_000, 'imperial').text).toBe('2,691 ft²');
    expect(largeAreaFromDisplay(1, 'imperial')).toBe(92_903.04);
  });

  it('shows money per area cut per square inch or square centimetre, with two significant digits at least', () => {
    // 1 in² = 645.16 mm² and 1 cm² = 100 mm² exactly (NIST SP 811 B.8); worked by hand.
    // 0.0019 cents/mm² = $0.000019/mm² → $0.012258/in² → "$0.012/in²".
    expect(moneyPerAreaToDisplay(0.0019, 'USD', 'imperial').text).toBe('$0.012/in²');
    // 0.0019 cents/mm² → €0.0019/cm².
    expect(moneyPerAreaToDisplay(0.0019, 'EUR', 'metric').text).toBe('€0.0019/cm²');
    // 0.2 cents/mm² → $1.29032/in² → "$1.29/in²".
    expect(moneyPerAreaToDisplay(0.2, 'USD', 'imperial').text).toBe('$1.29/in²');
    // Yen have no minor unit: 0.01 yen/mm² → ¥6.4516/in² → "¥6/in²"; 0.001 yen/mm² → ¥0.645/in² → "¥0.65/in²".
    expect(moneyPerAreaToDisplay(0.01, 'JPY', 'imperial').text).toBe('¥6/in²');
    expect(moneyPerAreaToDisplay(0.001, 'JPY', 'imperial').text).toBe('¥0.65/in²');
  });
});

describe('reading quantities back to SI', () => {
  it('reads typed values into mm, m/min, mm², N and Pa', () => {
    expect(lengthFromDisplay(1.25, 'imperial')).toBe(31.75);
    expect(lengthFromDisplay(31.75, 'metric')).toBe(31.75);
    expect(bandSpeedFromDisplay(100, 'imperial')).toBeCloseTo(30.48, 12);
    expect(bandSpeedFromDisplay(30, 'metric')).toBe(30);
    expect(areaFromDisplay(1, 'imperial')).toBe(645.16);
    expect(areaFromDisplay(1, 'metric')).toBe(100);
    expect(areaRateFromDisplay(2, 'imperial')).toBe(1290.32);
    expect(areaRateFromDisplay(2, 'metric')).toBe(200);
    expect(forceFromDisplay(1, 'imperial')).toBe(4.4482216152605);
    expect(forceFromDisplay(10, 'metric')).toBe(10);
    expect(stressFromDisplay(1, 'imperial')).toBeCloseTo(6894.757293168, 6);
    expect(stressFromDisplay(200, 'metric')).toBe(200e6);
  });

  const pairs = [
    ['length', lengthToDisplay, lengthFromDisplay],
    ['band speed', bandSpeedToDisplay, bandSpeedFromDisplay],
    ['area', areaToDisplay, areaFromDisplay],
    ['area rate', areaRateToDisplay, areaRateFromDisplay],
    ['force', forceToDisplay, forceFromDisplay],
    ['stress', stressToDisplay, stressFromDisplay],
  ] as const;

  for (const [name, show, read] of pairs) {
    it(`${name}: reading the shown value back lands within half a display step of the original`, () => {
      fc.assert(
        fc.property(fc.double({ min: 0, max: 1e7, noNaN: true }), fc.constantFrom(...systems), (si, system) => {
          const shown = show(si, system, { decimals: 6 });
          const back = read(shown.value, system);
          // Rounding to 6 decimals in the display unit moves the value by at most 0.5e-6 display units.
          const step = Math.abs(read(1, system) - read(0, system));
          return Math.abs(back - si) <= 0.5e-6 * step * (1 + 1e-9) + 1e-9 * si;
        }),
      );
    });
  }
});

describe('parseDisplayNumber', () => {
  it('reads plain, grouped and fractional numbers', () => {
    expect(parseDisplayNumber('1250')).toEqual({ ok: true, value: 1250 });
    expect(parseDisplayNumber(' 1,250.5 ')).toEqual({ ok: true, value: 1250.5 });
    expect(parseDisplayNumber('.75')).toEqual({ ok: true, value: 0.75 });
    expect(parseDisplayNumber('-3.5')).toEqual({ ok: true, value: -3.5 });
    expect(parseDisplayNumber('3/4')).toEqual({ ok: true, value: 0.75 });
    expect(parseDisplayNumber('1 1/4')).toEqual({ ok: true, value: 1.25 });
    expect(parseDisplayNumber('2-3/8')).toEqual({ ok: true, value: 2.375 });
  });

  it('refuses what it cannot read unambiguously, with a message', () => {
    for (const text of ['', '   ', 'abc', '1,5', '1.2.3', '12,34', '.', '-', '1/0']) {
      const parsed = parseDisplayNumber(text);
      expect(parsed.ok).toBe(false);
      if (!parsed.ok) expect(parsed.message.length).toBeGreaterThan(0);
    }
  });

  it('reads back whatever formatNumber prints (en-US)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e9, max: 1e9, noNaN: true }),
        fc.integer({ min: 0, max: 4 }),
        (value, decimals) => {
          const parsed = parseDisplayNumber(formatNumber(value, decimals));
          return parsed.ok && Math.abs(parsed.value - value) <= 0.5 * 10 ** -decimals + 1e-6;
        },
      ),
    );
  });
});

describe('quantity guards', () => {
  it('pass good values through and name the quantity when they refuse', () => {
    expect(requirePositive(2, 'Width', 'mm')).toBe(2);
    expect(requireNonNegative(0, 'Area', 'mm²')).toBe(0);
    expect(requireCount(3, 'Pieces')).toBe(3);
    expect(() => requirePositive(0, 'Width', 'mm')).toThrow('Width must be a number greater than 0 mm (got 0)');
    expect(() => requirePositive(Number.NaN, 'Width', 'mm')).toThrow('got not a number');
    expect(() => requirePositive(Number.POSITIVE_INFINITY, 'Width', 'mm')).toThrow(RangeError);
    expect(() => requireNonNegative(-1, 'Area', 'mm²')).toThrow('Area must be a number of 0 mm² or more (got -1)');
    expect(() => requireCount(1.5, 'Pieces')).toThrow('Pieces must be a whole number of 1 or more (got 1.5)');
    expect(() => requireCount(0, 'Pieces')).toThrow(RangeError);
  });
});
