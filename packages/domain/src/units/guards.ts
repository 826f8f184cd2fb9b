import { DomainInputError } from '../errors.js';
/**
 * Guards for the quantities handed to the trade's computations. The zod schemas catch bad input at the edge;
 * these guards stop a direct caller from getting NaN or a silent nonsense figure, and say what to fix.
 * They throw `DomainInputError` (a RangeError) with a message naming the quantity, the rule and the value received.
 */

function describe(value: number): string {
  return Number.isNaN(value) ? 'not a number' : String(value);
}

/** "0 mm", or a bare "0" for a quantity without a unit. */
function zero(unit: string): string {
  return unit === '' ? '0' : `0 ${unit}`;
}

/** Requires a finite number greater than 0; `unit` ("mm", "N", or '' for none) goes into the message. */
export function requirePositive(value: number, label: string, unit: string): number {
  if (!Number.isFinite(value) || value <= 0) {
    throw new DomainInputError(`${label} must be a number greater than ${zero(unit)} (got ${describe(value)})`);
  }
  return value;
}

/** Requires a finite number of 0 or more. */
export function requireNonNegative(value: number, label: string, unit: string): number {
  if (!Number.isFinite(value) || value < 0) {
    throw new DomainInputError(`${label} must be a number of ${zero(unit)} or more (got ${describe(value)})`);
  }
  return value;
}

/** Requires a whole number of 1 or more (a count of pieces, wheels...). */
export function requireCount(value: number, label: string): number {
  if (!Number.isInteger(value) || value < 1) {
    throw new DomainInputError(`${label} must be a whole number of 1 or more (got ${describe(value)})`);
  }
  return value;
}
