import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ForbiddenError } from '@casl/ability';
import { ZodError } from 'zod';
import {
  ExclusionConstraintError,
  ForeignKeyConstraintError,
  UniqueConstraintError,
  ValidationError as SequelizeValidationError,
  DatabaseError,
  ConnectionError,
} from 'sequelize';
import {
  DomainInputError,
  HTTP_STATUS_BY_CODE,
  detailsFromZodError,
  type ErrorBody,
  type ErrorCode,
  type ErrorDetail,
} from '@kerfline/domain/errors';
import { AppError } from '../errors.js';

/** Maps a Sequelize attribute list like `site_id, asset_tag` back to our field names. */
function camel(column: string): string {
  return column.replace(/_([a-z])/g, (_, c: string) => c.toUpperCase());
}

const UNIQUE_MESSAGES: Record<string, string> = {
  saws_asset_tag_per_site: 'Another saw at this site already has that asset tag',
  users_email: 'Someone already uses that e-mail address',
  sites_code_key: 'Another site already uses that code',
  regions_name_key: 'Another region already has that name',
};

// CASL's own default names the action and subject in code words; a service that knows better says so with
// `setMessage`, and that message is what the person reads.
ForbiddenError.setDefaultMessage('You are not allowed to do that');

/**
 * Turns any thrown value into an AppError; unknown errors become INTERNAL with their message hidden. `status` is
 * set only for a client error whose 4xx has no code of its own (a 416, say): it keeps that status.
 */
export function toAppError(err: unknown): { error: AppError; internal: boolean; status?: number } {
  if (err instanceof AppError) return { error: err, internal: false };
  if (err instanceof ZodError) {
    return { error: AppError.validation('Some fields need fixing', detailsFromZodError(err)), internal: false };
  }
  if (err instanceof DomainInputError) return { error: AppError.validation(err.message), internal: false };
  if (err instanceof ForbiddenError) {
    return { error: new AppError('FORBIDDEN', err.message), internal: false };
  }
  if (err instanceof UniqueConstraintError) {
    const constraint = (err.parent as { constraint?: string } | undefined)?.constraint ?? '';
    const details: ErrorDetail[] = err.errors.map((e) => ({ path: camel(e.path ?? ''), message: 'already taken' }));
    return {
      error: new AppError('CONFLICT', UNIQUE_MESSAGES[constraint] ?? 'That record already exists', details),
      internal: false,
    };
  }
  if (err instanceof ExclusionConstraintError) {
    return {
      error: new AppError('CONFLICT', 'Those times overlap another record of the same saw; change the times'),
      internal: false,
    };
  }
  if (err instanceof ForeignKeyConstraintError) {
    return {
      error: new AppError('CONFLICT', 'That change refers to a record that does not exist or is still in use'),
      internal: false,
    };
  }
  if (err instanceof SequelizeValidationError) {
    const details = err.errors.map((e) => ({ path: e.path ?? '', message: e.message }));
    return { error: AppError.validation('Some fields need fixing', details), internal: false };
  }
  if (err instanceof ConnectionError || databaseUnavailable(err)) {
    return {
      error: new AppError('UNAVAILABLE', 'The database is not reachable just now; try again in a moment'),
      internal: true,
    };
  }
  if (storageFull(err)) {
    return {
      error: new AppError(
        'INSUFFICIENT_STORAGE',
        'The server has no room left to store this, so nothing was saved; tell your administrator (the disk is full)',
      ),
      internal: true,
    };
  }
  if (err instanceof DatabaseError) {
    const code = (err.parent as { code?: string } | undefined)?.code;
    // 23514 check_violation, 22P02 invalid text representation, 22003 numeric out of range
    if (code === '23514' || code === '22P02' || code === '22003') {
      return { error: AppError.validation('A value is outside what Kerfline accepts'), internal: false };
    }
  }
  const clientError = fromClientError(err);
  if (clientError) return { ...clientError, internal: false };
  return {
    error: new AppError('INTERNAL', 'Something went wrong on our side; the error has been logged'),
    internal: true,
  };
}

/** The error itself and what a library wrapped in it (Sequelize's `parent`/`original`), for code checks. */
function causes(err: unknown): { code?: unknown; message?: unknown }[] {
  if (typeof err !== 'object' || err === null) return [];
  const e = err as { parent?: unknown; original?: unknown; cause?: unknown };
  return [err, e.parent, e.original, e.cause].filter((c): c is object => typeof c === 'object' && c !== null);
}

/**
 * The database went away or is restarting: SQLSTATE class 08 (connection exception), 57P01–57P03 (shut down by
 * an administrator or a crash, or starting up), 53300 (too many connections), a refused or reset socket, or
 * the driver's "Connection terminated" (or, when the cut reached the client before the next query, "Client has
 * encountered a connection error and is not queryable"). The request may be tried again; the pool reconnects by itself.
 */
function databaseUnavailable(err: unknown): boolean {
  return causes(err).some(({ code, message }) => {
    if (typeof code === 'string') {
      if (code.startsWith('08') || ['57P01', '57P02', '57P03', '53300'].includes(code)) return true;
      if (['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE'].includes(code)) return true;
    }
    return (
      typeof message === 'string' &&
      /^Connection terminated|connection timeout|connection error and is not queryable/i.test(message)
    );
  });
}

/** A full disk: Node's ENOSPC/EDQUOT from a file store, or PostgreSQL's disk_full (53100). */
function storageFull(err: unknown): boolean {
  return causes(err).some(({ code }) => code === 'ENOSPC' || code === 'EDQUOT' || code === '53100');
}

/** What each kind of unreadable request says, by body-parser's `type` (the status comes with the error). */
const CLIENT_ERROR_MESSAGES: Record<string, string> = {
  'entity.parse.failed': 'The request body must be a JSON object',
  'entity.too.large': 'The request body is larger than 1 MB; send less at a time',
  'charset.unsupported': 'The request body must be JSON in UTF-8 (Content-Type: application/json; charset=utf-8)',
  'encoding.unsupported':
    'The request body is compressed in a way Kerfline does not read; send it uncompressed or gzip',
  'request.aborted': 'The request body was cut off before it ended; send it again',
  'request.size.invalid': 'The request body is not as long as its Content-Length says; send it again',
};

/** The codes whose status is the 4xx an error carries; any other 4xx keeps its status under VALIDATION_FAILED. */
const CODE_BY_STATUS: Record<number, ErrorCode> = {
  400: 'VALIDATION_FAILED',
  401: 'UNAUTHENTICATED',
  403: 'FORBIDDEN',
  404: 'NOT_FOUND',
  409: 'CONFLICT',
  413: 'PAYLOAD_TOO_LARGE',
  415: 'UNSUPPORTED_MEDIA_TYPE',
  429: 'RATE_LIMITED',
};

/**
 * Errors that say the client sent something unreadable carry a 4xx `status` or `statusCode` (body-parser,
 * http-errors, the router's path decoding, zlib errors wrapped by body-parser): they answer that 4xx with the
 * one error body, never a 500.
 */
function fromClientError(err: unknown): { error: AppError; status?: number } | null {
  if (typeof err !== 'object' || err === null) return null;
  const e = err as { status?: unknown; statusCode?: unknown; type?: unknown; errno?: unknown; code?: unknown };
  const status = typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : NaN;
  if (!(status >= 400 && status < 500)) return null;
  const code = CODE_BY_STATUS[status] ?? 'VALIDATION_FAILED';
  let message = typeof e.type === 'string' ? CLIENT_ERROR_MESSAGES[e.type] : undefined;
  if (!message && err instanceof URIError)
    message = 'The address has a malformed percent-encoding (a % not followed by two hex digits); check the link';
  if (!message && typeof e.code === 'string' && e.code.startsWith('Z_'))
    message = 'The request body could not be decompressed; send it again uncompressed';
  message ??= `The request could not be handled as sent (HTTP ${status})`;
  return { error: new AppError(code, message), ...(HTTP_STATUS_BY_CODE[code] === status ? {} : { status }) };
}

export function errorBody(error: AppError, requestId: string | undefined): ErrorBody {
  return {
    error: {
      code: error.code,
      message: error.message,
      ...(error.details && error.details.length > 0 ? { details: error.details } : {}),
      ...(requestId ? { requestId } : {}),
    },
  };
}

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const { error, internal, status } = toAppError(err);
  const requestId = typeof req.id === 'string' ? req.id : String(req.id ?? '');
  if (internal) req.log?.error({ err }, 'request failed');
  // A streamed answer (a CSV export) that fails half way: cut the connection, so the download shows as broken
  // instead of ending like a complete file.
  if (res.headersSent) {
    res.destroy();
    return;
  }
  res.status(status ?? HTTP_STATUS_BY_CODE[error.code]).json(errorBody(error, requestId));
};

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new AppError('NOT_FOUND', `No API route ${req.method} ${req.path}`));
};
