import type { ErrorCode, ErrorDetail } from '@kerfline/domain/errors';

/** The one error services throw. Routers never build error bodies; the error handler does. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: ErrorDetail[],
  ) {
    super(message);
    this.name = 'AppError';
  }

  static notFound(what: string): AppError {
    return new AppError('NOT_FOUND', `${what} was not found`);
  }

  static validation(message: string, details?: ErrorDetail[]): AppError {
    return new AppError('VALIDATION_FAILED', message, details);
  }
}
