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

/** Turns any thrown value into an AppError; unknown errors become INTERNAL with their message hidden. */
export function toAppError(err: unknown): { error: AppError; internal: boolean } {
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
  if (err instanceof ConnectionError) {
    return { error: new AppError('UNAVAILABLE', 'The database is not reachable; try again shortly'), internal: true };
  }
  if (err instanceof DatabaseError) {
    const code = (err.parent as { code?: string } | undefined)?.code;
    // 23514 check_violation, 22P02 invalid text representation, 22003 numeric out of range
    if (code === '23514' || code === '22P02' || code === '22003') {
      return { error: AppError.validation('A value is outside what Kerfline accepts'), internal: false };
    }
  }
  const bodyError = err as { type?: string; status?: number };
  if (bodyError?.type === 'entity.parse.failed') {
    return { error: AppError.validation('The request body must be a JSON object'), internal: false };
  }
  if (bodyError?.type === 'entity.too.large') {
    return { error: AppError.validation('The request body is too large'), internal: false };
  }
  return {
    error: new AppError('INTERNAL', 'Something went wrong on our side; the error has been logged'),
    internal: true,
  };
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
  const { error, internal } = toAppError(err);
  const requestId = typeof req.id === 'string' ? req.id : String(req.id ?? '');
  if (internal) req.log?.error({ err }, 'request failed');
  // A streamed answer (a CSV export) that fails half way: cut the connection, so the download shows as broken
  // instead of ending like a complete file.
  if (res.headersSent) {
    res.destroy();
    return;
  }
  res.status(HTTP_STATUS_BY_CODE[error.code as ErrorCode]).json(errorBody(error, requestId));
};

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new AppError('NOT_FOUND', `No API route ${req.method} ${req.path}`));
};
