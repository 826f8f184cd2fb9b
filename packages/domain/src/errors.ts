import { z } from 'zod';

/** Every error the API sends carries one of these codes; the HTTP status follows from the code alone. */
export const ERROR_CODES = [
  'VALIDATION_FAILED',
  'UNAUTHENTICATED',
  'FORBIDDEN',
  'NOT_FOUND',
  'CONFLICT',
  'PAYLOAD_TOO_LARGE',
  'UNSUPPORTED_MEDIA_TYPE',
  'RATE_LIMITED',
  'UNAVAILABLE',
  'INSUFFICIENT_STORAGE',
  'INTERNAL',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

export const HTTP_STATUS_BY_CODE: Record<ErrorCode, number> = {
  VALIDATION_FAILED: 400,
  UNAUTHENTICATED: 401,
  FORBIDDEN: 403,
  NOT_FOUND: 404,
  CONFLICT: 409,
  PAYLOAD_TOO_LARGE: 413,
  /** A body that is not JSON (or multipart on an upload route), or in a charset or encoding we do not read. */
  UNSUPPORTED_MEDIA_TYPE: 415,
  RATE_LIMITED: 429,
  UNAVAILABLE: 503,
  /** The server's disk (or the database's) is full: nothing was stored. */
  INSUFFICIENT_STORAGE: 507,
  INTERNAL: 500,
};

export const errorDetailSchema = z.object({
  /** Dotted path of the offending field, e.g. `bandWidthMm` or `items.3.qty`; empty for the whole input. */
  path: z.string(),
  message: z.string(),
});
export type ErrorDetail = z.infer<typeof errorDetailSchema>;

export const errorBodySchema = z.object({
  error: z.object({
    code: z.enum(ERROR_CODES),
    message: z.string(),
    details: z.array(errorDetailSchema).optional(),
    requestId: z.string().optional(),
  }),
});
export type ErrorBody = z.infer<typeof errorBodySchema>;

/** Turns a zod failure into field details a form can show beside its inputs. */
export function detailsFromZodError(error: z.ZodError): ErrorDetail[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.'),
    message: issue.message,
  }));
}

/**
 * Thrown by the trade's computations when a direct caller hands them a quantity they cannot use (a
 * negative width, a band too short for the wheels). The message says what to fix; the API answers 400.
 * It extends RangeError so callers that only know the standard error still recognise it.
 */
export class DomainInputError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'DomainInputError';
  }
}
