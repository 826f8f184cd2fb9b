import { describe, expect, it } from 'vitest';
import { entryText, figure, messageInUnits, rangeFigure, readQuantity, unitSystemParam } from './quantities';
import { articleFor } from './words';

// Conversion factors: 1 in = 25.4 mm and 1 ft = 0.3048 m exactly (NIST SP 811 (2008), B.8); the products below
// are worked by hand.

describe('entries typed in one unit system and shown in the other', () => {
  it('shows a value typed in millimetres in inches, and the typed text again on the way back', () => {
    const typed = { text: '50', system: 'metric' as const };
    // 50 mm ÷ 25.4 = 1.968 503… in, kept to 0.0001 in.
    expect(entryText(typed, 'length', 'imperial')).toBe('1.9685');
    // The entry itself is untouched, so switching back shows exactly what was typed: no drift.
    expect(entryText(typed, 'length', 'metric')).toBe('50');
    // 2 in × 25.4 = 50.8 mm; 400 ft/min × 0.3048 = 121.92 m/min, shown to 0.1.
    expect(entryText({ text: '2', system: 'imperial' }, 'length', 'metric')).toBe('50.8');
    expect(entryText({ text: '400', system: 'imperial' }, 'bandSpeed', 'metric')).toBe('121.9');
  });

  it('leaves text it cannot read as it is, for its message to explain', () => {
    expect(entryText({ text: '1,5', system: 'metric' }, 'length', 'imperial')).toBe('1,5');
    expect(entryText({ text: '4/6', system: 'metric' }, null, 'imperial')).toBe('4/6');
  });

  it('reads what was typed into SI, fractions included', () => {
    // 1 1/4 in × 25.4 = 31.75 mm.
    expect(readQuantity({ text: '1 1/4', system: 'imperial' }, 'length')).toEqual({ kind: 'value', value: 31.75 });
    // 100 cm²/min = 10,000 mm²/min.
    expect(readQuantity({ text: '100', system: 'metric' }, 'areaRate')).toEqual({ kind: 'value', value: 10000 });
    expect(readQuantity({ text: '  ', system: 'metric' }, 'length')).toEqual({ kind: 'empty' });
    const bad = readQuantity({ text: 'abc', system: 'metric' }, 'length');
    expect(bad.kind).toBe('invalid');
    if (bad.kind === 'invalid') expect(bad.message).toMatch(/"abc" is not a number/);
  });
});

describe('figures and messages in the user’s units', () => {
  it('prints a figure with its unit on one line, and a range with one unit', () => {
    expect(figure('length', 4115.42, 'metric')).toEqual({ number: '4,115', unit: 'mm', text: '4,115\u00a0mm' });
    expect(figure('length', 4115.42, 'metric', 1).text).toBe('4,115.4\u00a0mm');
    // 50–90 m/min ÷ 0.3048 = 164.04–295.28 ft/min, shown whole.
    expect(rangeFigure('bandSpeed', 50, 90, 'imperial').text).toBe('164–295\u00a0ft/min');
    expect(rangeFigure('length', 50, 50, 'metric').text).toBe('50\u00a0mm');
  });

  it('puts the user’s unit first in a message, with the SI figure the domain wrote second', () => {
    // 3000 mm ÷ 25.4 = 118.11 in, shown to 0.1 in above 100 in.
    expect(messageInUnits('Diameter must be at most 3000 mm', 'imperial')).toBe(
      'Diameter must be at most 118.1\u00a0in (3,000\u00a0mm)',
    );
    expect(messageInUnits('Diameter must be at most 3000 mm', 'metric')).toBe('Diameter must be at most 3,000\u00a0mm');
    // 10,000,000 mm²/min = 100,000 cm²/min: the metric field is in cm², so the figure is given in it.
    expect(messageInUnits('Normal cutting rate must be at most 10 000 000 mm²/min', 'metric')).toBe(
      'Normal cutting rate must be at most 100,000\u00a0cm²/min',
    );
    expect(messageInUnits('Band width must be greater than 0 mm', 'imperial')).toBe(
      'Band width must be greater than 0\u00a0in',
    );
    // A long float tail from arithmetic on the user's figures is rounded.
    expect(messageInUnits('more than 454.99999999999994 mm', 'metric')).toBe('more than 455\u00a0mm');
  });

  it('turns a figure the domain gave in both systems round on an imperial site', () => {
    // 1.092 mm ÷ 25.4 = 0.04299 in.
    expect(messageInUnits('Set the opening to 1.092 mm (0.0430 in).', 'imperial')).toBe(
      'Set the opening to 0.043\u00a0in (1.09\u00a0mm).',
    );
    expect(messageInUnits('Set the opening to 1.092 mm (0.0430 in).', 'metric')).toBe(
      'Set the opening to 1.09\u00a0mm (0.043\u00a0in).',
    );
    // 30,000 psi = 206.843 MPa and 35,000 psi = 241.317 MPa (1 psi = 6,894.757 Pa, NIST SP 811 B.8).
    expect(messageInUnits('Tension to 206.843–241.317 MPa (30,000–35,000 psi) on a meter.', 'imperial')).toBe(
      'Tension to 30,000–35,000\u00a0psi (206.8–241.3\u00a0MPa) on a meter.',
    );
    // Each system's figure comes from the one written in it: 207 MPa rounded does not become 30,023 psi.
    expect(messageInUnits('Tension to 207–241 MPa (30,000–35,000 psi).', 'imperial')).toBe(
      'Tension to 30,000–35,000\u00a0psi (207–241\u00a0MPa).',
    );
    // An inch figure alone is left as written: "in" is also a word.
    expect(messageInUnits('3 in a row', 'metric')).toBe('3 in a row');
  });

  it('reads the unit system from the address, ignoring anything else', () => {
    expect(unitSystemParam('imperial')).toBe('imperial');
    expect(unitSystemParam('metric')).toBe('metric');
    expect(unitSystemParam('furlongs')).toBeNull();
    expect(unitSystemParam(null)).toBeNull();
  });

  it('says "an" before figures spoken with a vowel', () => {
    expect(articleFor('8 mm')).toBe('an');
    expect(articleFor('80.5 mm')).toBe('an');
    expect(articleFor('11 in')).toBe('an');
    expect(articleFor('18,000 mm')).toBe('an');
    expect(articleFor('110 mm')).toBe('a');
    expect(articleFor('1,100 mm')).toBe('a');
    expect(articleFor('4,115.4 mm')).toBe('a');
  });
});
