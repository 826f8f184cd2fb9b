import { z } from 'zod';
import { stockCutSchema } from '../stock-area/schema.js';

/** Calculator inputs for cutting rate and cut time: areas in mm², times in s, rates in mm²/min (SI inside). */

/** Longest cut accepted: 24 hours, so a minutes-for-seconds slip shows. */
export const MAX_CUT_TIME_S = 86400;

const cutTimeS = z
  .number({ message: 'Cut time must be a number (seconds)' })
  .positive({ message: 'Cut time must be greater than 0 seconds' })
  .max(MAX_CUT_TIME_S, { message: `Cut time must be at most ${MAX_CUT_TIME_S} seconds (24 hours)` });

const areaMm2 = z
  .number({ message: 'Area cut must be a number (mm²)' })
  .positive({ message: 'Area cut must be greater than 0' })
  .max(1e8, { message: 'Area cut must be at most 100,000,000 mm²' });

/** Cutting rate from a known area and the time the cut took. */
export const cuttingRateInputSchema = z.object({ areaMm2, cutTimeS });
export type CuttingRateForm = z.infer<typeof cuttingRateInputSchema>;

/** Cutting rate from a stock cut (shape, pieces) and the time it took. */
export const stockCuttingRateInputSchema = z.object({ stock: stockCutSchema, cutTimeS });
export type StockCuttingRateForm = z.input<typeof stockCuttingRateInputSchema>;

/** Time for a cut of a known area at a cutting rate. */
export const cutTimeInputSchema = z.object({
  areaMm2,
  rateMm2PerMin: z
    .number({ message: 'Cutting rate must be a number (mm²/min)' })
    .positive({ message: 'Cutting rate must be greater than 0' }),
});
export type CutTimeForm = z.infer<typeof cutTimeInputSchema>;
