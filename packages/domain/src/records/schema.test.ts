import { describe, expect, it } from 'vitest';
import { CLOCK_SKEW_MS, notesSchema, rangeBoundSchema, recordTimeSchema } from './schema.js';
import {
  bladeRunInstallSchema,
  bladeRunListQuerySchema,
  bladeRunRemoveSchema,
  bladeRunUpdateSchema,
} from '../blade-runs/schema.js';
import { stopCreateSchema, stopListQuerySchema, stopUpdateSchema } from '../stops/schema.js';
import { cutLogCreateSchema } from '../cut-logs/schema.js';
import { bladeSpecCreateSchema, bladeSpecUpdateSchema, pitchLabel } from '../blade-specs/schema.js';
import { siteStockQuerySchema, stockLevelsInputSchema, stockReceiptCreateSchema } from '../blade-stock/schema.js';

const ID = '00000000-0000-4000-8000-000000000001';
const messages = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  result.error?.issues.map((i) => [i.path.join('.'), i.message]) ?? [];

describe('times of records', () => {
  const at = recordTimeSchema('Start');

  it('reads an ISO date-time with its offset into a Date', () => {
    expect(at.parse('2026-03-04T07:30:00+01:00').toISOString()).toBe('2026-03-04T06:30:00.000Z');
  });

  it('accepts a time a little ahead (clock skew), refuses one further in the future', () => {
    expect(at.safeParse(new Date(Date.now() + CLOCK_SKEW_MS - 10_000).toISOString()).success).toBe(true);
    expect(messages(at.safeParse(new Date(Date.now() + CLOCK_SKEW_MS + 60_000).toISOString()))).toEqual([
      ['', 'Start must not be in the future'],
    ]);
  });

  it('refuses a time before 1990, a time without its offset, and text', () => {
    expect(messages(at.safeParse('1989-12-31T23:59:00Z'))).toEqual([['', 'Start must be on or after 1 January 1990']]);
    expect(at.safeParse('2026-03-04T07:30:00').success).toBe(false);
    expect(messages(at.safeParse('yesterday'))[0]?.[1]).toBe(
      'Start must be a date and time such as 2026-03-04T07:30:00Z',
    );
  });

  it('reads list bounds as dates at midnight UTC or as date-times', () => {
    expect(rangeBoundSchema('From').parse('2026-03-04').toISOString()).toBe('2026-03-04T00:00:00.000Z');
    expect(rangeBoundSchema('From').parse('2026-03-04T12:00:00Z').toISOString()).toBe('2026-03-04T12:00:00.000Z');
    expect(messages(stopListQuerySchema.safeParse({ from: '2026-03-04', to: '2026-03-01' }))).toEqual([
      ['to', 'To must be after From'],
    ]);
    // An offset that moves year 1 back into year 0 is refused with a message, not passed to the database.
    expect(messages(stopListQuerySchema.safeParse({ to: '0001-01-01T00:00:00+14:00' }))).toEqual([
      ['to', 'To must fall between the years 1 and 9999 (in UTC)'],
    ]);
    expect(rangeBoundSchema('To').parse('0001-01-01T00:00:00Z').getUTCFullYear()).toBe(1);
  });

  it('keeps notes as text with line breaks, empty as none, and refuses control characters', () => {
    expect(notesSchema.parse('  Guide worn\non the left ')).toBe('Guide worn\non the left');
    expect(notesSchema.parse('   ')).toBeNull();
    expect(notesSchema.safeParse('bad\u0000byte').success).toBe(false);
    expect(notesSchema.safeParse('x'.repeat(2001)).success).toBe(false);
  });
});

describe('blade run inputs', () => {
  it('defaults what a technician may leave out when putting a blade on', () => {
    expect(bladeRunInstallSchema.parse({ sawId: ID, bladeSpecId: ID })).toEqual({
      sawId: ID,
      bladeSpecId: ID,
      tensionMpa: null,
      materialGroup: null,
      breakInFollowed: null,
      notes: null,
    });
  });

  it('refuses a site (it is the saw’s), negative and absurd figures, and an unknown reason', () => {
    expect(bladeRunInstallSchema.safeParse({ sawId: ID, bladeSpecId: ID, siteId: ID }).success).toBe(false);
    expect(messages(bladeRunInstallSchema.safeParse({ sawId: ID, bladeSpecId: ID, tensionMpa: 900 }))).toEqual([
      ['tensionMpa', 'Tension must be at most 600 MPa (band steel yields well below that)'],
    ]);
    expect(messages(bladeRunRemoveSchema.safeParse({ reason: 'bent', cuts: -1 }))).toEqual([
      ['reason', 'Reason must be one of worn_out, tooth_strippage, fatigue_crack, broken, crooked_cutting, other'],
      ['cuts', 'Cuts must not be negative'],
    ]);
    expect(bladeRunRemoveSchema.parse({ reason: 'broken' })).toEqual({
      reason: 'broken',
      areaCutMm2: null,
      cuts: null,
      notes: null,
    });
    expect(bladeRunUpdateSchema.safeParse({ costMinor: 1 }).success).toBe(false);
  });

  it('reads list filters and sorting from a query string', () => {
    expect(bladeRunListQuerySchema.parse({ open: 'false', reason: 'broken' })).toMatchObject({
      open: false,
      reason: 'broken',
      sort: '-installedAt',
      limit: 100,
      offset: 0,
    });
    expect(bladeRunListQuerySchema.safeParse({ sort: 'cost' }).success).toBe(false);
  });
});

describe('stop inputs', () => {
  it('starts now unless told, stays open without an end, unplanned by default', () => {
    expect(stopCreateSchema.parse({ sawId: ID, category: 'electrical' })).toEqual({
      sawId: ID,
      category: 'electrical',
      endedAt: null,
      planned: false,
      notes: null,
    });
  });

  it('needs the end after the start', () => {
    const r = stopCreateSchema.safeParse({
      sawId: ID,
      category: 'other',
      startedAt: '2026-03-04T08:00:00Z',
      endedAt: '2026-03-04T08:00:00Z',
    });
    expect(messages(r)).toEqual([['endedAt', 'The end must be after the start']]);
    expect(stopUpdateSchema.parse({ endedAt: null })).toEqual({ endedAt: null });
  });
});

describe('cut log inputs', () => {
  it('takes a stock cut with the domain’s shape schema, one cut by default', () => {
    const parsed = cutLogCreateSchema.parse({
      sawId: ID,
      stock: { shape: { kind: 'round_bar', diameterMm: 80 } },
      materialGroup: 'alloy_steel',
    });
    expect(parsed).toMatchObject({
      quantity: 1,
      stock: { pieceCount: 1, piecesAcross: 1 },
      bandSpeedMPerMin: null,
      cutTimeS: null,
    });
    expect(
      messages(
        cutLogCreateSchema.safeParse({
          sawId: ID,
          stock: { shape: { kind: 'round_bar', diameterMm: 80 }, pieceCount: 2, piecesAcross: 3 },
          materialGroup: 'alloy_steel',
        }),
      ),
    ).toEqual([['stock.piecesAcross', 'Pieces side by side cannot be more than the pieces in the bundle']]);
  });
});

describe('blade spec and stock inputs', () => {
  const spec = {
    name: '34 × 1.1 bi-metal',
    widthMm: 34,
    thicknessMm: 1.1,
    lengthMm: 4115,
    pitch: { kind: 'variable', coarseTpi: 3, fineTpi: 4 },
    toothForm: 'hook',
    toothSet: 'raker',
    material: 'bimetal',
    unitCostMinor: 6450,
    currency: 'eur',
  };

  it('defaults a new spec to the fleet catalogue, offered, without a supplier', () => {
    expect(bladeSpecCreateSchema.parse(spec)).toMatchObject({
      siteId: null,
      supplier: null,
      archived: false,
      currency: 'EUR',
    });
    expect(bladeSpecUpdateSchema.safeParse({ siteId: ID }).success).toBe(false);
    expect(messages(bladeSpecCreateSchema.safeParse({ ...spec, unitCostMinor: 500_000_000 }))[0]?.[1]).toMatch(
      /at most 100,000,000/,
    );
  });

  it('writes a pitch as the trade does', () => {
    expect(pitchLabel({ kind: 'variable', coarseTpi: 4, fineTpi: 6 })).toBe('4/6 TPI');
    expect(pitchLabel({ kind: 'constant', tpi: 3 })).toBe('3 TPI');
  });

  it('takes a receipt’s currency from the site unless named, and bounds stock settings', () => {
    const receipt = stockReceiptCreateSchema.parse({
      siteId: ID,
      bladeSpecId: ID,
      quantity: 10,
      unitCostMinor: 5900,
      receivedOn: '2026-01-15',
    });
    expect(receipt).toEqual({
      siteId: ID,
      bladeSpecId: ID,
      quantity: 10,
      unitCostMinor: 5900,
      receivedOn: '2026-01-15',
      reference: null,
      notes: null,
    });
    expect(messages(stockReceiptCreateSchema.safeParse({ ...receipt, receivedOn: '1980-01-01' }))).toEqual([
      ['receivedOn', 'Received on must be on or after 1990-01-01'],
    ]);
    expect(messages(stockLevelsInputSchema.safeParse({ leadTimeDays: 400, safetyStock: -1 }))).toEqual([
      ['leadTimeDays', 'Lead time must be at most 365 days'],
      ['safetyStock', 'Safety stock must not be negative'],
    ]);
    expect(siteStockQuerySchema.parse({})).toEqual({ windowDays: 90 });
  });
});
