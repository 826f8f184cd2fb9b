import type { z } from 'zod';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { DomainInputError } from '@kerfline/domain/errors';
import { messageInUnits, type Reading } from './quantities';
import type { FieldErrors } from './use-entries';

/** "Drive wheel diameter" → "drive wheel diameter", for "Enter the …". */
function lowerFirst(label: string): string {
  return label.charAt(0).toLowerCase() + label.slice(1);
}

/**
 * The value of one reading, or undefined with the field's message set: what was wrong with the text, or, for a
 * required field left empty, what to enter.
 */
export function take<K extends string>(
  reading: Reading,
  key: K,
  label: string,
  errors: FieldErrors<K>,
  required = true,
): number | undefined {
  if (reading.kind === 'value') return reading.value;
  if (reading.kind === 'invalid') errors[key] = reading.message;
  else if (required) errors[key] = `Enter the ${lowerFirst(label)}`;
  return undefined;
}

/**
 * Puts the domain schema's messages beside their fields, in the user's units. A field that already has a
 * message (it could not be read at all) keeps it. Returns the messages that belong to no field.
 */
export function placeIssues<K extends string>(
  issues: readonly z.core.$ZodIssue[],
  fieldFor: (path: readonly PropertyKey[]) => K | undefined,
  errors: FieldErrors<K>,
  system: UnitSystem,
): string[] {
  const unplaced: string[] = [];
  for (const issue of issues) {
    const key = fieldFor(issue.path);
    const message = messageInUnits(issue.message, system);
    if (key === undefined) unplaced.push(message);
    else if (errors[key] === undefined) errors[key] = message;
  }
  return unplaced;
}

export const hasErrors = <K extends string>(errors: FieldErrors<K>): boolean => Object.keys(errors).length > 0;

/**
 * Runs a domain computation whose input already passed its schema. The guards inside can still refuse an
 * impossible combination (DomainInputError): its message is shown; anything else is a fault and is thrown.
 */
export function compute<T>(run: () => T): { ok: true; value: T } | { ok: false; message: string } {
  try {
    return { ok: true, value: run() };
  } catch (error) {
    if (error instanceof DomainInputError) return { ok: false, message: error.message };
    throw error;
  }
}
