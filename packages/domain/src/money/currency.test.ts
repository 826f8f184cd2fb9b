import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { convertMinor, convertTotal, crossRate, minorUnitDigits, missingRateWords } from './currency.js';

describe('minorUnitDigits against ISO 4217', () => {
  it('matches the minor units of ISO 4217 list one (SIX, current currency and funds list)', () => {
    // ISO 4217 "Minor unit" column: USD 2, EUR 2, CAD 2, MXN 2, GBP 2, JPY 0, CLP 0, KWD 3, BHD 3.
    const iso: Record<string, number> = { USD: 2, EUR: 2, CAD: 2, MXN: 2, GBP: 2, JPY: 0, CLP: 0, KWD: 3, BHD: 3 };
    for (const [code, digits] of Object.entries(iso)) expect(minorUnitDigits(code), code).toBe(digits);
  });
  it('refuses what is not a currency code', () => {
    expect(() => minorUnitDigits('EURO')).toThrow(/three-letter ISO 4217/);
  });
});

describe('convertMinor', () => {
  it('hand-worked: CAD 123.45 at 0.7312 USD per CAD = USD 90.266 64 → 9 027 cents', () => {
    expect(convertMinor({ amountMinor: 12_345, from: 'CAD', to: 'USD', rate: 0.7312 })).toBe(9027);
  });
  it('allows for minor units: ¥100 000 at 0.0067 USD per yen = USD 670.00; USD 1.00 at 149.5 yen = ¥150 (149.5 rounds away from zero)', () => {
    expect(convertMinor({ amountMinor: 100_000, from: 'JPY', to: 'USD', rate: 0.0067 })).toBe(67_000);
    expect(convertMinor({ amountMinor: 100, from: 'USD', to: 'JPY', rate: 149.5 })).toBe(150);
    // KWD has three decimals: USD 10.00 at 0.307 KWD per USD = KWD 3.070 → 3 070 fils.
    expect(convertMinor({ amountMinor: 1000, from: 'USD', to: 'KWD', rate: 0.307 })).toBe(3070);
  });
  it('keeps the same currency as it is, and refuses a bad rate or a fraction of a cent', () => {
    expect(convertMinor({ amountMinor: 555, from: 'EUR', to: 'eur', rate: 123 })).toBe(555);
    expect(() => convertMinor({ amountMinor: 1, from: 'EUR', to: 'USD', rate: 0 })).toThrow(/greater than 0/);
    expect(() => convertMinor({ amountMinor: 1.5, from: 'EUR', to: 'USD', rate: 1 })).toThrow(/whole number/);
  });
  it('property: converting there and back at reciprocal rates returns within a cent per conversion', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e9 }), fc.double({ min: 0.01, max: 100, noNaN: true }), (amount, rate) => {
        const there = convertMinor({ amountMinor: amount, from: 'EUR', to: 'USD', rate });
        const back = convertMinor({ amountMinor: there, from: 'USD', to: 'EUR', rate: 1 / rate });
        expect(Math.abs(back - amount)).toBeLessThanOrEqual(1 + 0.5 / rate);
      }),
    );
  });
});

describe('convertTotal', () => {
  const rates: Record<string, number> = { 'CAD|2026-03': 0.75, 'CAD|2026-04': 0.7, 'MXN|2026-03': 0.05 };
  const rateOf = (c: string, m: string) => rates[`${c}|${m}`] ?? null;

  it('converts each month at its own rate and adds the reporting currency as it is (hand-worked)', () => {
    // 100.00 USD + CAD 200.00 × 0.75 + CAD 100.00 × 0.70 + MXN 1 000.00 × 0.05 = 100 + 150 + 70 + 50 = USD 370.00.
    const t = convertTotal(
      [
        { amountMinor: 10_000, currency: 'USD', month: '2026-03' },
        { amountMinor: 20_000, currency: 'CAD', month: '2026-03' },
        { amountMinor: 10_000, currency: 'CAD', month: '2026-04' },
        { amountMinor: 100_000, currency: 'MXN', month: '2026-03' },
      ],
      'USD',
      rateOf,
    );
    expect(t).toEqual({ amountMinor: 37_000, currency: 'USD', complete: true, missing: [] });
  });

  it('leaves out what has no rate, lists it merged by currency and month, and marks the total incomplete', () => {
    const t = convertTotal(
      [
        { amountMinor: 10_000, currency: 'USD', month: '2026-05' },
        { amountMinor: 3000, currency: 'CAD', month: '2026-05' },
        { amountMinor: 2000, currency: 'CAD', month: '2026-05' },
        { amountMinor: 700, currency: 'MXN', month: '2026-04' },
      ],
      'USD',
      rateOf,
    );
    expect(t.amountMinor).toBe(10_000);
    expect(t.complete).toBe(false);
    expect(t.missing).toEqual([
      { amountMinor: 700, currency: 'MXN', month: '2026-04' },
      { amountMinor: 5000, currency: 'CAD', month: '2026-05' },
    ]);
    expect(missingRateWords(t.missing, 'USD')).toEqual([
      'MXN → USD: no rate for 2026-04',
      'CAD → USD: no rate for 2026-05',
    ]);
  });

  it('gives a cross rate through the reporting currency, or none when a rate is missing', () => {
    // MXN → CAD in March: 0.05 / 0.75 = 0.0666…; CAD → USD is the rate itself; USD → CAD its reciprocal.
    expect(crossRate('MXN', 'CAD', '2026-03', 'USD', rateOf)).toBeCloseTo(0.05 / 0.75, 15);
    expect(crossRate('USD', 'CAD', '2026-04', 'USD', rateOf)).toBeCloseTo(1 / 0.7, 15);
    expect(crossRate('MXN', 'CAD', '2026-04', 'USD', rateOf)).toBeNull();
  });
});
