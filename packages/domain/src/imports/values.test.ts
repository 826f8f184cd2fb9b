import { describe, expect, it } from 'vitest';
import {
  normaliseHeader,
  parsePlainNumber,
  parseWallTime,
  readDate,
  readMoney,
  readQuantity,
  unitInHeader,
  wallTimeToInstant,
  type WallTime,
} from './values.js';
import { UNITS, unitFromText } from './units.js';
import { CM2_PER_IN2 } from '../units/units.js';

const wall = (r: ReturnType<typeof parseWallTime>): WallTime => {
  if (!r.ok || r.value === null) throw new Error(r.ok ? 'empty' : r.message);
  return r.value;
};

describe('numbers as shops write them', () => {
  it('reads decimal points and commas, thousands groups and inch fractions', () => {
    expect(parsePlainNumber('1,842.5', '.')).toBe(1842.5);
    expect(parsePlainNumber('1.842,5', ',')).toBe(1842.5);
    expect(parsePlainNumber('0,75', ',')).toBe(0.75);
    expect(parsePlainNumber('.042', '.')).toBe(0.042);
    expect(parsePlainNumber("1'234.5", '.')).toBe(1234.5);
    expect(parsePlainNumber('1 234,5', ',')).toBe(1234.5);
    expect(parsePlainNumber('1-1/4', '.')).toBe(1.25);
    expect(parsePlainNumber('1 1/2', '.')).toBe(1.5);
    expect(parsePlainNumber('3/8', ',')).toBe(0.375);
  });

  it('refuses what is not a number, and a comma that cannot be a decimal mark', () => {
    expect(parsePlainNumber('twelve', '.')).toBeNull();
    expect(parsePlainNumber('1,5', '.')).toBeNull();
    expect(parsePlainNumber('1/0', '.')).toBeNull();
    expect(parsePlainNumber('12.5.3', '.')).toBeNull();
  });
});

describe('quantities converted with the exact factors (NIST SP 811, B.8)', () => {
  it('converts a column unit to the stored unit, and lets a unit in the cell win', () => {
    expect(readQuantity('1-1/4', 'length', 'in', '.')).toEqual({ ok: true, value: 31.75 });
    expect(readQuantity('34 mm', 'length', 'in', '.')).toEqual({ ok: true, value: 34 });
    const feet = readQuantity('13.5', 'length', 'ft', '.');
    expect(feet.ok && feet.value).toBeCloseTo(4114.8, 9);
    const fpm = readQuantity('360', 'speed', 'ft/min', '.');
    expect(fpm.ok && fpm.value).toBeCloseTo(109.728, 9);
    const psi = readQuantity('27,500', 'stress', 'psi', '.');
    // 27 500 psi = 189.605 826 MPa (1 psi = 6 894.757 293 168 Pa, NIST SP 811 B.8).
    expect(psi.ok && psi.value).toBeCloseTo(189.6058256, 6);
    expect(readQuantity('1,5', 'duration', 'h', ',')).toEqual({ ok: true, value: 90 });
    expect(readQuantity('', 'length', 'mm', '.')).toEqual({ ok: true, value: null });
    const twelve = readQuantity(12, 'length', 'in', '.');
    expect(twelve.ok && twelve.value).toBeCloseTo(304.8, 10);
  });

  it('keeps 1 in² = 6.4516 cm² between the area units', () => {
    const in2 = UNITS.area.options.find((o) => o.id === 'in2')!.toStored;
    const cm2 = UNITS.area.options.find((o) => o.id === 'cm2')!.toStored;
    expect(in2 / cm2).toBeCloseTo(CM2_PER_IN2, 12);
  });

  it('names a unit it does not know for the column', () => {
    const r = readQuantity('12 furlongs', 'length', 'mm', '.');
    expect(r.ok).toBe(false);
    expect(readQuantity('abc', 'length', 'mm', '.').ok).toBe(false);
  });

  it('finds the unit in a header, bracketed or as its last words', () => {
    expect(unitInHeader('Wheel dia (in)', 'length')).toBe('in');
    expect(unitInHeader('Speed max SFPM', 'speed')).toBe('ft/min');
    expect(unitInHeader('Bandbreite in mm', 'length')).toBe('mm');
    expect(unitInHeader('Area cut (sq in)', 'area')).toBe('in2');
    expect(unitInHeader('Dauer (h)', 'duration')).toBe('h');
    expect(unitInHeader('Width', 'length')).toBeNull();
    expect(unitFromText('speed', 'm/min')?.id).toBe('m/min');
  });

  it('normalises headers without accents and units', () => {
    expect(normaliseHeader('  Säge (Nr.) ')).toBe('sage');
    expect(normaliseHeader('Band-Länge [mm]')).toBe('band lange');
  });
});

describe('money', () => {
  it('reads major units with signs and codes into minor units of the currency', () => {
    expect(readMoney('$118.50', 'CAD', '.')).toEqual({ ok: true, value: 11850 });
    expect(readMoney('CAD 246.00', 'CAD', '.')).toEqual({ ok: true, value: 24600 });
    expect(readMoney('89,50 €', 'EUR', ',')).toEqual({ ok: true, value: 8950 });
    expect(readMoney('1500', 'JPY', '.')).toEqual({ ok: true, value: 1500 });
    expect(readMoney('USD 12', 'CAD', '.').ok).toBe(false);
  });
});

describe('dates in the orders people write them', () => {
  it('reads ISO, day-first, month-first, dotted and named-month dates', () => {
    expect(wall(parseWallTime('2023-05-12 14:30', 'dmy'))).toMatchObject({
      year: 2023,
      month: 5,
      day: 12,
      hour: 14,
      minute: 30,
    });
    expect(wall(parseWallTime('03/04/2023', 'dmy'))).toMatchObject({ year: 2023, month: 4, day: 3, hasTime: false });
    expect(wall(parseWallTime('03/04/2023', 'mdy'))).toMatchObject({ year: 2023, month: 3, day: 4 });
    expect(wall(parseWallTime('14.03.2023 06:30', 'dmy'))).toMatchObject({ month: 3, day: 14, hour: 6, minute: 30 });
    expect(wall(parseWallTime('Mar 4, 2023', 'dmy'))).toMatchObject({ month: 3, day: 4 });
    expect(wall(parseWallTime('19 Jun 2023', 'mdy'))).toMatchObject({ month: 6, day: 19 });
    expect(wall(parseWallTime('4. März 2023', 'dmy'))).toMatchObject({ month: 3, day: 4 });
    expect(wall(parseWallTime('4 de marzo de 2023', 'dmy'))).toMatchObject({ month: 3, day: 4 });
    expect(wall(parseWallTime('3/4/23 2:15 pm', 'mdy'))).toMatchObject({
      year: 2023,
      month: 3,
      day: 4,
      hour: 14,
      minute: 15,
    });
    expect(wall(parseWallTime('2023-05-12T14:30:00+02:00', 'dmy')).offsetMinutes).toBe(120);
  });

  it('refuses impossible dates and words', () => {
    const feb = parseWallTime('31/02/2023 08:00', 'dmy');
    expect(feb.ok).toBe(false);
    if (!feb.ok) expect(feb.message).toContain('no day 31');
    expect(parseWallTime('soon', 'dmy').ok).toBe(false);
    expect(parseWallTime('2023-13-01', 'dmy').ok).toBe(false);
    expect(parseWallTime('25:00 01/02/2023', 'dmy').ok).toBe(false);
  });

  it('reads spreadsheet serial numbers (days since 1899-12-30)', () => {
    // 44927 is 2023-01-01 in the 1900 date system.
    expect(wall(parseWallTime(44927.5, 'dmy'))).toMatchObject({ year: 2023, month: 1, day: 1, hour: 12 });
    expect(parseWallTime(12, 'dmy').ok).toBe(false);
    expect(readDate('2023-08-02', 'mdy')).toEqual({ ok: true, value: '2023-08-02' });
  });

  it('puts local times in the site’s zone, across daylight saving changes', () => {
    const w = (text: string) => wall(parseWallTime(text, 'ymd'));
    // Toronto: EST (−5) in January, EDT (−4) in July.
    expect(wallTimeToInstant(w('2023-01-09 07:10'), 'America/Toronto').toISOString()).toBe('2023-01-09T12:10:00.000Z');
    expect(wallTimeToInstant(w('2023-07-09 07:10'), 'America/Toronto').toISOString()).toBe('2023-07-09T11:10:00.000Z');
    // Amsterdam on 26 March 2023: 02:30 does not exist (clocks 02:00 → 03:00); the later offset is used.
    expect(wallTimeToInstant(w('2023-03-26 02:30'), 'Europe/Amsterdam').toISOString()).toBe('2023-03-26T00:30:00.000Z');
    // A written offset wins over the zone.
    expect(wallTimeToInstant(w('2023-05-12T14:30:00Z'), 'Europe/Amsterdam').toISOString()).toBe(
      '2023-05-12T14:30:00.000Z',
    );
  });
});

describe('the contributor guide', () => {
  it('lists every accepted column of every kind', async () => {
    const { readFileSync } = await import('node:fs');
    const { IMPORT_FIELDS, IMPORT_KINDS } = await import('./fields.js');
    const guide = readFileSync(new URL('../../../../DEVELOPERS.md', import.meta.url), 'utf8');
    const section = guide.slice(guide.indexOf('### Accepted columns'));
    for (const kind of IMPORT_KINDS) {
      const part = section.slice(section.indexOf(`(\`${kind}\`)`));
      for (const field of IMPORT_FIELDS[kind]) expect(part, `${kind}.${field.key}`).toContain(`| ${field.label} |`);
    }
  });
});
