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

  it('keeps the 4xx an error carries (body-parser, http-errors, the router), with the one error body', () => {
    const withStatus = (status: number, extra: Record<string, unknown> = {}) =>
      Object.assign(new Error('library words'), { status, ...extra });
    expect(toAppError(withStatus(413, { type: 'entity.too.large' })).error.code).toBe('PAYLOAD_TOO_LARGE');
    expect(toAppError(withStatus(415, { type: 'charset.unsupported' })).error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
    expect(toAppError(withStatus(404)).error.code).toBe('NOT_FOUND');
    expect(toAppError(Object.assign(new Error('x'), { statusCode: 400 })).error.code).toBe('VALIDATION_FAILED');
    // A 4xx without a code of its own keeps its status.
    const odd = toAppError(withStatus(416));
    expect(odd).toMatchObject({ internal: false, status: 416 });
    expect(odd.error.message).toMatch(/HTTP 416/);
    // Never a server error's status, and never the library's own words.
    const server = toAppError(withStatus(502));
    expect(server.error.code).toBe('INTERNAL');
    expect(toAppError(withStatus(400)).error.message).not.toMatch(/library words/);
  });

  it('answers 503 when the database is away or restarting, whatever layer reports it', () => {
    const pg = (code: string) =>
      Object.assign(new Error('terminating connection due to administrator command'), { code });
    for (const code of ['57P01', '57P03', '08006', 'ECONNREFUSED']) {
      expect(toAppError(pg(code)).error.code, code).toBe('UNAVAILABLE');
      expect(toAppError({ name: 'SequelizeDatabaseError', parent: pg(code) }).error.code, code).toBe('UNAVAILABLE');
    }
    expect(toAppError(new Error('Connection terminated unexpectedly')).error.code).toBe('UNAVAILABLE');
    expect(toAppError(new Error('Client has encountered a connection error and is not queryable')).error.code).toBe(
      'UNAVAILABLE',
    );
  });

  it('answers 507 with a clear message when the disk is full: a file store’s ENOSPC or PostgreSQL’s 53100', () => {
    const enospc = Object.assign(new Error('ENOSPC: no space left on device, write'), { code: 'ENOSPC' });
    const disk = toAppError(enospc);
    expect(disk.error.code).toBe('INSUFFICIENT_STORAGE');
    expect(disk.error.message).toMatch(/nothing was saved/);
    expect(toAppError({ parent: { code: '53100' } }).error.code).toBe('INSUFFICIENT_STORAGE');
  });
});
