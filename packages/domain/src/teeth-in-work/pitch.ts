/**
 * Tooth pitch helpers: the mean TPI used to count teeth, the printed label ("4/6") and the standard list.
 */
import { MAX_TPI, MIN_TPI } from './schema.js';
import type { Pitch } from './schema.js';

/**
 * Teeth per inch a pitch stands for when counting teeth in the work. A variable pitch is counted by the mean of its
 * two ends (4/6 TPI → 5 TPI): over a length of several teeth the spacing averages out.
 */
export function meanTpi(pitch: Pitch): number {
  return pitch.kind === 'constant' ? pitch.tpi : (pitch.coarseTpi + pitch.fineTpi) / 2;
}

/** The pitch as the trade writes it: "3" or "4/6" (TPI, unit not included). */
export function pitchLabel(pitch: Pitch): string {
  return pitch.kind === 'constant' ? String(pitch.tpi) : `${String(pitch.coarseTpi)}/${String(pitch.fineTpi)}`;
}

export type ParsedPitch = { ok: true; pitch: Pitch } | { ok: false; message: string };

const PITCH_TEXT = /^(\d+(?:\.\d+)?|\.\d+)(?:\s*\/\s*(\d+(?:\.\d+)?|\.\d+))?(?:\s*tpi)?$/i;

/**
 * Reads a pitch as printed on a blade or typed by a user: "3", "3 TPI", "4/6", "0.75/1.25 tpi".
 * Returns a message rather than throwing.
 */
export function parsePitchLabel(text: string): ParsedPitch {
  const match = PITCH_TEXT.exec(text.trim());
  if (!match) return { ok: false, message: `"${text.trim()}" is not a pitch: write it as 3 or 4/6 (teeth per inch)` };
  const first = Number(match[1]);
  const inRange = (v: number) => v >= MIN_TPI && v <= MAX_TPI;
  if (match[2] === undefined) {
    if (!inRange(first)) return { ok: false, message: `Pitch must be between ${MIN_TPI} and ${MAX_TPI} TPI` };
    return { ok: true, pitch: { kind: 'constant', tpi: first } };
  }
  const second = Number(match[2]);
  if (!inRange(first) || !inRange(second)) {
    return { ok: false, message: `Both ends of the pitch must be between ${MIN_TPI} and ${MAX_TPI} TPI` };
  }
  if (first >= second) return { ok: false, message: 'Write a variable pitch coarse end first, e.g. 4/6' };
  return { ok: true, pitch: { kind: 'variable', coarseTpi: first, fineTpi: second } };
}

const constant = (tpi: number): Pitch => ({ kind: 'constant', tpi });
const variable = (coarseTpi: number, fineTpi: number): Pitch => ({ kind: 'variable', coarseTpi, fineTpi });

/**
 * Pitches commonly stocked for production band sawing (common practice, no source): constant 0.75–18 TPI and
 * variable 0.75/1.25–14/18 TPI, coarsest first.
 */
export const STANDARD_PITCHES: readonly Pitch[] = [
  constant(0.75),
  constant(1.25),
  constant(2),
  constant(3),
  constant(4),
  constant(6),
  constant(8),
  constant(10),
  constant(14),
  constant(18),
  variable(0.75, 1.25),
  variable(1, 1.5),
  variable(1.4, 2),
  variable(2, 3),
  variable(3, 4),
  variable(4, 6),
  variable(5, 8),
  variable(6, 10),
  variable(8, 12),
  variable(10, 14),
  variable(14, 18),
];
