import { z } from 'zod';
import { stockShapeSchema } from '../stock-area/schema.js';

/** Band saw pitches run from well under 1 TPI (very large stock) to about 24 TPI (thin wall); 0.5–32 leaves room. */
export const MIN_TPI = 0.5;
export const MAX_TPI = 32;

const tpi = (label: string) =>
  z
    .number({ message: `${label} must be a number of teeth per inch` })
    .min(MIN_TPI, { message: `${label} must be at least ${MIN_TPI} TPI` })
    .max(MAX_TPI, { message: `${label} must be at most ${MAX_TPI} TPI` });

/**
 * A blade's tooth pitch in teeth per inch (TPI), the trade's unit; it stays in TPI because blades are sold by it
 * in metric countries too. Constant pitch: one spacing (e.g. 3 TPI). Variable pitch: spacing varies along the
 * band between a coarse and a fine end, written "coarse/fine" (e.g. 4/6 TPI).
 */
export const pitchSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('constant'), tpi: tpi('Pitch') }),
    z
      .object({ kind: z.literal('variable'), coarseTpi: tpi('Coarse pitch'), fineTpi: tpi('Fine pitch') })
      .refine((v) => v.coarseTpi < v.fineTpi, {
        path: ['fineTpi'],
        message: 'The fine end must have more teeth per inch than the coarse end (e.g. 4/6)',
      }),
  ],
  { message: 'Choose a constant or a variable pitch' },
);
export type Pitch = z.infer<typeof pitchSchema>;

const piecesAcrossSchema = z
  .number({ message: 'Pieces side by side must be a number' })
  .int({ message: 'Pieces side by side must be a whole number' })
  .min(1, { message: 'Pieces side by side must be at least 1' })
  .max(100, { message: 'Pieces side by side must be at most 100' })
  .default(1);

/** Teeth-in-the-work calculator: a stock shape (mm), a pitch, and how many pieces lie side by side along the band. */
export const teethInWorkInputSchema = z.object({
  shape: stockShapeSchema,
  pitch: pitchSchema,
  piecesAcross: piecesAcrossSchema,
});
export type TeethInWorkInput = z.input<typeof teethInWorkInputSchema>;

/** Pitch advice: a stock shape (mm) and the pieces side by side; the product ranks the standard pitches. */
export const pitchAdviceInputSchema = z.object({
  shape: stockShapeSchema,
  piecesAcross: piecesAcrossSchema,
});
export type PitchAdviceInput = z.input<typeof pitchAdviceInputSchema>;
