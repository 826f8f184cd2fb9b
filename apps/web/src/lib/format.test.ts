import { describe, expect, it } from 'vitest';
import {
  formatArea,
  formatDateTime,
  formatDual,
  formatForce,
  formatLength,
  formatMoneyPerArea,
  formatSmallLength,
  formatStress,
  formatNumber,
  formatSpeed,
  formatSpeedRange,
  lengthToMm,
  speedToMPerMin,
} from './format';

/** Intl writes narrow no-break spaces in times; compare with plain spaces. */
const plain = (text: string) => text.replace(/\s/g, ' ');

describe('unit conversion at the edge', () => {
  // 1 in = 25.4 mm and 1 ft = 0.3048 m exactly (NIST SP 811 (2008), Appendix B.8); products worked by hand.
  it('turns inches typed on an imperial site into millimetres', () => {
    expect(lengthToMm(1.25, 'imperial')).toBe(31.75);
    expect(lengthToMm(0.042, 'imperial')).toBe(1.0668);
    expect(lengthToMm(162, 'imperial')).toBe(4114.8);
    expect(lengthToMm(27, 'metric')).toBe(27);
  });

  it('turns feet per minute into metres per minute', () => {
    expect(speedToMPerMin(80, 'imperial')).toBe(24.384);
    expect(speedToMPerMin(400, 'imperial')).toBe(121.92);
    expect(speedToMPerMin(75, 'metric')).toBe(75);
  });
});

describe('display', () => {
  it('groups thousands', () => {
    expect(formatNumber(1234567)).toBe('1,234,567');
    expect(formatNumber(1234.5678, 2)).toBe('1,234.57');
  });

  it('shows lengths in the site unit with the unit beside the figure', () => {
    expect(plain(formatLength(31.75, 'imperial'))).toBe('1.25 in');
    expect(plain(formatLength(1.0668, 'imperial'))).toBe('0.042 in');
    expect(plain(formatLength(4114.8, 'imperial'))).toBe('162 in');
    expect(plain(formatLength(3505, 'metric'))).toBe('3,505 mm');
    expect(plain(formatLength(0.9, 'metric'))).toBe('0.9 mm');
  });

  it('shows band speeds in m/min or ft/min', () => {
    expect(plain(formatSpeed(121.92, 'imperial'))).toBe('400 ft/min');
    expect(plain(formatSpeedRange(20, 120, 'metric'))).toBe('20–120 m/min');
    expect(plain(formatSpeedRange(24.384, 121.92, 'imperial'))).toBe('80–400 ft/min');
  });

  it('shows every other quantity in the site’s own unit, by the domain’s policy', () => {
    // Exact factors: 1 lbf = 4.4482216152605 N, 1 psi = 6894.757… Pa, 1 in² = 645.16 mm² (NIST SP 811 B.8).
    expect(plain(formatSmallLength(1.0668, 'imperial'))).toBe('0.042 in');
    expect(plain(formatSmallLength(1.0668, 'metric'))).toBe('1.07 mm');
    expect(plain(formatForce(35.585772922084, 'imperial'))).toBe('8 lbf');
    expect(plain(formatStress(206.84e6, 'imperial'))).toBe('30,000 psi');
    expect(plain(formatArea(645.16 * 12.57, 'imperial'))).toBe('12.57 in²');
    expect(plain(formatMoneyPerArea(0.0019, 'USD', 'imperial'))).toBe('$0.012/in²');
  });

  it('puts the imperial figure first on an imperial site, the metric one second', () => {
    expect(plain(formatDual('smallLength', 1.0922, 'imperial'))).toBe('0.043 in (1.09 mm)');
    expect(plain(formatDual('smallLength', 1.0922, 'metric'))).toBe('1.09 mm (0.043 in)');
    expect(formatDual('force', 35.585772922084, 'imperial')).toBe('8\u00a0lbf (35.6\u00a0N)');
  });

  it('shows a moment as the clock at the site, with the zone when asked', () => {
    // 13:05 UTC on 12 March 2025: Chicago is on CDT (UTC−5) from 9 March, Berlin still on CET (UTC+1).
    expect(plain(formatDateTime('2025-03-12T13:05:00Z', 'America/Chicago'))).toBe('Mar 12, 2025, 8:05 AM');
    expect(plain(formatDateTime('2025-03-12T13:05:00Z', 'America/Chicago', true))).toBe('Mar 12, 2025, 8:05 AM CDT');
    expect(plain(formatDateTime('2025-03-12T13:05:00Z', 'Europe/Berlin'))).toBe('Mar 12, 2025, 2:05 PM');
    expect(formatDateTime('not a date', 'Europe/Berlin')).toBe('—');
  });
});
