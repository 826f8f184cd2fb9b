import { describe, expect, it } from 'vitest';
import { ForbiddenError, createMongoAbility } from '@casl/ability';
import { z } from 'zod';
import { DomainInputError } from '@kerfline/domain/errors';
import { requirePositive } from '@kerfline/domain/units/guards';
import { AppError } from '../errors.js';
import { toAppError } from './error-handler.js';

describe('turning thrown values into one error shape', () => {
  it('keeps an AppError as it is', () => {
    const err = new AppError('CONFLICT', 'taken');
    expect(toAppError(err)).toEqual({ error: err, internal: false });
  });

  it('reports a computation refusing its input as a 400 with its message', () => {
    let thrown: unknown;
    try {
      requirePositive(-2, 'Band width', 'mm');
    } catch (e) {
      thrown = e;
    }
    expect(thrown).toBeInstanceOf(DomainInputError);
    const { error, internal } = toAppError(thrown);
    expect(error.code).toBe('VALIDATION_FAILED');
    expect(error.message).toMatch(/Band width must be a number greater than 0 mm/);
    expect(internal).toBe(false);
  });

  it('gives zod failures their field paths', () => {
    const result = z.object({ a: z.number() }).safeParse({ a: 'x' });
    const { error } = toAppError(result.error);
    expect(error.details?.[0]?.path).toBe('a');
  });

  it('maps a CASL refusal to FORBIDDEN', () => {
    let thrown: unknown;
    try {
      ForbiddenError.from(createMongoAbility([])).throwUnlessCan('read', 'Saw');
    } catch (e) {
      thrown = e;
    }
    expect(toAppError(thrown).error.code).toBe('FORBIDDEN');
  });

  it('hides the message of anything unexpected and marks it for the log', () => {
    const { error, internal } = toAppError(new TypeError('secret detail about the server'));
    expect(error.code).toBe('INTERNAL');
    expect(error.message).not.toMatch(/secret/);
    expect(internal).toBe(true);
  });
});
