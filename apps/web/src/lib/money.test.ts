import { describe, expect, it } from 'vitest';
import { formatMoney, minorFromText, moneyInput } from './money';

describe('money in forms', () => {
  it('reads major units as typed into minor units, by the currency’s own decimals', () => {
    expect(minorFromText('64.50', 'USD')).toEqual({ ok: true, value: 6450 });
    expect(minorFromText('1,200', 'EUR')).toEqual({ ok: true, value: 120000 });
    expect(minorFromText('$ 12.5', 'USD')).toEqual({ ok: true, value: 1250 });
    expect(minorFromText('6450', 'JPY')).toEqual({ ok: true, value: 6450 });
    expect(minorFromText('', 'USD')).toEqual({ ok: true, value: null });
  });

  it('says what is wrong with an amount it cannot read', () => {
    expect(minorFromText('12,5', 'EUR')).toMatchObject({ ok: false });
    expect(minorFromText('1.005', 'USD')).toEqual({ ok: false, message: 'USD has 2 decimals at most, such as 64.50' });
    expect(minorFromText('64.5', 'JPY')).toEqual({ ok: false, message: 'JPY has no decimals' });
  });

  it('prints minor units as money and back as a person types it', () => {
    expect(formatMoney(6450, 'USD')).toBe('$64.50');
    expect(formatMoney(6450, 'JPY')).toBe('¥6,450');
    expect(moneyInput(6450, 'EUR')).toBe('64.5');
  });
});
