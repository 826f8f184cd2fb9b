import { describe, expect, it } from 'vitest';
import { STOCK_SHAPE_KINDS, STOCK_SHAPE_LABELS, stockCutSchema, stockShapeSchema } from './schema.js';

/** The messages zod reports, keyed by the dotted path of the field. */
function messages(result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) {
  return Object.fromEntries((result.error?.issues ?? []).map((i) => [i.path.map(String).join('.'), i.message]));
}

describe('stockShapeSchema', () => {
  it('accepts each shape with sensible dimensions', () => {
    const good = [
      { kind: 'round_bar', diameterMm: 40 },
      { kind: 'square_bar', sideMm: 40 },
      { kind: 'flat_bar', widthMm: 80, heightMm: 10 },
      { kind: 'round_tube', outsideDiameterMm: 60.3, wallMm: 3.91 },
      { kind: 'square_tube', sideMm: 60, wallMm: 4 },
      { kind: 'rect_tube', widthMm: 100, heightMm: 50, wallMm: 5 },
      { kind: 'angle', legOnBedMm: 50, legUpMm: 50, thicknessMm: 5 },
      { kind: 'channel', depthMm: 100, flangeWidthMm: 50, webThicknessMm: 6, flangeThicknessMm: 8.5 },
      { kind: 'beam', depthMm: 200, flangeWidthMm: 100, webThicknessMm: 5.6, flangeThicknessMm: 8.5 },
    ];
    for (const shape of good) expect(stockShapeSchema.safeParse(shape).success).toBe(true);
    expect(new Set(good.map((s) => s.kind))).toEqual(new Set(STOCK_SHAPE_KINDS));
    for (const kind of STOCK_SHAPE_KINDS) expect(STOCK_SHAPE_LABELS[kind]).toBeTruthy();
  });

  it('says what to fix for impossible walls and thicknesses', () => {
    expect(messages(stockShapeSchema.safeParse({ kind: 'round_tube', outsideDiameterMm: 50, wallMm: 25 }))).toEqual({
      wallMm: 'Wall must be less than half the outside diameter (with no bore left it is a round bar)',
    });
    expect(messages(stockShapeSchema.safeParse({ kind: 'square_tube', sideMm: 40, wallMm: 20 })).wallMm).toMatch(
      /less than half the side/,
    );
    expect(
      messages(stockShapeSchema.safeParse({ kind: 'rect_tube', widthMm: 100, heightMm: 20, wallMm: 10 })).wallMm,
    ).toMatch(/half the smaller side/);
    expect(
      messages(stockShapeSchema.safeParse({ kind: 'angle', legOnBedMm: 50, legUpMm: 30, thicknessMm: 30 })).thicknessMm,
    ).toBe('Thickness must be less than each leg');
    expect(
      messages(
        stockShapeSchema.safeParse({
          kind: 'channel',
          depthMm: 20,
          flangeWidthMm: 5,
          webThicknessMm: 6,
          flangeThicknessMm: 10,
        }),
      ),
    ).toEqual({
      flangeThicknessMm: 'The two flanges together must be thinner than the depth',
      webThicknessMm: 'Web thickness must be less than the flange width',
    });
    expect(
      messages(
        stockShapeSchema.safeParse({
          kind: 'beam',
          depthMm: 200,
          flangeWidthMm: 100,
          webThicknessMm: 100,
          flangeThicknessMm: 8,
        }),
      ).webThicknessMm,
    ).toMatch(/less than the flange width/);
  });

  it('rejects missing, zero, oversized and non-numeric dimensions and unknown shapes', () => {
    expect(messages(stockShapeSchema.safeParse({ kind: 'round_bar', diameterMm: 0 }))).toEqual({
      diameterMm: 'Diameter must be greater than 0',
    });
    expect(messages(stockShapeSchema.safeParse({ kind: 'round_bar', diameterMm: 5000 }))).toEqual({
      diameterMm: 'Diameter must be at most 3000 mm',
    });
    expect(messages(stockShapeSchema.safeParse({ kind: 'flat_bar', widthMm: '80', heightMm: 10 }))).toEqual({
      widthMm: 'Width must be a number (mm)',
    });
    expect(Object.values(messages(stockShapeSchema.safeParse({ kind: 'hexagon', sideMm: 10 })))[0]).toMatch(
      /Choose a stock shape/,
    );
  });
});

describe('stockCutSchema', () => {
  it('defaults to one piece and checks the bundle layout', () => {
    expect(stockCutSchema.parse({ shape: { kind: 'round_bar', diameterMm: 30 } })).toEqual({
      shape: { kind: 'round_bar', diameterMm: 30 },
      pieceCount: 1,
      piecesAcross: 1,
    });
    expect(
      messages(
        stockCutSchema.safeParse({ shape: { kind: 'round_bar', diameterMm: 30 }, pieceCount: 4, piecesAcross: 5 }),
      ),
    ).toEqual({
      piecesAcross: 'Pieces side by side cannot be more than the pieces in the bundle',
    });
    expect(
      messages(stockCutSchema.safeParse({ shape: { kind: 'round_bar', diameterMm: 30 }, pieceCount: 2.5 })),
    ).toEqual({
      pieceCount: 'Pieces must be a whole number',
    });
    expect(
      messages(stockCutSchema.safeParse({ shape: { kind: 'round_bar', diameterMm: 30 }, pieceCount: 0 })).pieceCount,
    ).toBe('Pieces must be at least 1');
  });
});
