import { describe, expect, it } from 'vitest';
import { pitchAdviceInputSchema, pitchSchema, teethInWorkInputSchema } from './schema.js';

describe('teeth-in-work input schemas', () => {
  it('accepts constant and variable pitches with a shape, defaulting to one piece', () => {
    expect(
      teethInWorkInputSchema.parse({
        shape: { kind: 'round_bar', diameterMm: 50 },
        pitch: { kind: 'variable', coarseTpi: 4, fineTpi: 6 },
      }),
    ).toEqual({
      shape: { kind: 'round_bar', diameterMm: 50 },
      pitch: { kind: 'variable', coarseTpi: 4, fineTpi: 6 },
      piecesAcross: 1,
    });
    expect(
      pitchAdviceInputSchema.parse({ shape: { kind: 'square_bar', sideMm: 20 }, piecesAcross: 4 }).piecesAcross,
    ).toBe(4);
  });

  it('says what to fix', () => {
    const reversed = pitchSchema.safeParse({ kind: 'variable', coarseTpi: 6, fineTpi: 4 });
    expect(reversed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
      ['fineTpi', 'The fine end must have more teeth per inch than the coarse end (e.g. 4/6)'],
    ]);
    expect(pitchSchema.safeParse({ kind: 'constant', tpi: 0.1 }).error?.issues[0]?.message).toBe(
      'Pitch must be at least 0.5 TPI',
    );
    expect(pitchSchema.safeParse({ kind: 'constant', tpi: 40 }).error?.issues[0]?.message).toBe(
      'Pitch must be at most 32 TPI',
    );
    expect(pitchSchema.safeParse({ kind: 'wavy' }).error?.issues[0]?.message).toBe(
      'Choose a constant or a variable pitch',
    );
    const pieces = pitchAdviceInputSchema.safeParse({ shape: { kind: 'square_bar', sideMm: 20 }, piecesAcross: 0 });
    expect(pieces.error?.issues[0]?.message).toBe('Pieces side by side must be at least 1');
  });
});
