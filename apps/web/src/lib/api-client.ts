import type { z } from 'zod';
import {
  ERROR_CODES,
  HTTP_STATUS_BY_CODE,
  detailsFromZodError,
  errorBodySchema,
  type ErrorCode,
  type ErrorDetail,
} from '@kerfline/domain/errors';

/**
 * The one error every request to Kerfline's API rejects with: the server's error body, or an equivalent
 * made here when the server could not be reached or answered in a shape we do not understand.
 * Transport only: it never shows a message or moves the user; the router and the screens decide that.
 */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  readonly code: ErrorCode;
  /** HTTP status; 0 when no answer came back at all. */
  readonly status: number;
  readonly details: ErrorDetail[];
  readonly requestId: string | undefined;

  constructor(init: {
    code: ErrorCode;
    status: number;
    message: string;
    details?: ErrorDetail[];
    requestId?: string | undefined;
  }) {
    super(init.message);
    this.code = init.code;
    this.status = init.status;
    this.details = init.details ?? [];
    this.requestId = init.requestId;
  }
}

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

const MESSAGE_BY_CODE: Record<ErrorCode, string> = {
  VALIDATION_FAILED: 'Some of what was sent is not valid.',
  UNAUTHENTICATED: 'You are not signed in.',
  FORBIDDEN: 'Your role does not allow this.',
  NOT_FOUND: 'That record does not exist or is outside your sites.',
  CONFLICT: 'That change clashes with a record that already exists.',
  PAYLOAD_TOO_LARGE: 'That file is too large to send.',
  UNSUPPORTED_MEDIA_TYPE: 'Kerfline could not read what was sent. Reload the page and try again.',
  RATE_LIMITED: 'Too many attempts. Wait a minute and try again.',
  UNAVAILABLE: 'Kerfline is not available right now. Try again in a moment.',
  INSUFFICIENT_STORAGE: 'The server has no room to store this. Nothing was saved; tell your administrator.',
  INTERNAL: 'Something went wrong on the server. Try again; if it keeps happening, tell your administrator.',
};

/** The code a bare HTTP status stands for, for answers that carry no error body (a proxy's 502 page, say). */
function codeForStatus(status: number): ErrorCode {
  const match = ERROR_CODES.find((code) => HTTP_STATUS_BY_CODE[code] === status);
  if (match) return match;
  return status === 502 || status === 504 ? 'UNAVAILABLE' : 'INTERNAL';
}

type Query = Record<string, string | number | boolean | null | undefined>;

/** Query string from a parsed query: undefined and null values are left out, the rest written as text. */
export function toSearchParams(query: Query): URLSearchParams {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    params.set(key, String(value));
  }
  return params;
}

type RequestOptions = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  query?: Query;
  body?: unknown;
  signal?: AbortSignal;
};

/** How long an answer asked for early waits to be taken before it is thrown away as too old to show. */
const EARLY_ANSWER_MS = 10_000;
const earlyAnswers = new Map<string, { askedAt: number; answer: Promise<Response> }>();

/**
 * Asks for a GET answer now, before the code that reads it has arrived (a route's loader, while the page's code
 * loads); the first `api.get` of the same address within ten seconds takes it instead of asking again. A failure
 * is left for that reader, who handles it as its own.
 */
export function askEarly(path: string, query: Query = {}): void {
  const url = urlOf(path, query);
  const waiting = earlyAnswers.get(url);
  if (waiting && Date.now() - waiting.askedAt < EARLY_ANSWER_MS) return;
  const answer = fetch(url, { headers: { Accept: 'application/json' }, credentials: 'same-origin' });
  answer.catch(() => undefined);
  earlyAnswers.set(url, { askedAt: Date.now(), answer });
}

/** The answer asked for early for `url`, once, if it is recent enough. */
function takeEarly(url: string): Promise<Response> | undefined {
  const waiting = earlyAnswers.get(url);
  earlyAnswers.delete(url);
  return waiting && Date.now() - waiting.askedAt < EARLY_ANSWER_MS ? waiting.answer : undefined;
}

function urlOf(path: string, query: Query | undefined): string {
  const search = query ? toSearchParams(query).toString() : '';
  return `/api${path}${search ? `?${search}` : ''}`;
}

async function readJson(response: Response): Promise<unknown> {
  const text = await response.text();
  if (text.trim() === '') return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

/**
 * Sends one request to `/api{path}` and parses the answer with `schema` (pass `null` for answers without
 * a body, such as 204). Same-origin cookies carry the session.
 */
export async function apiRequest<T>(
  path: string,
  schema: z.ZodType<T> | null,
  options: RequestOptions = {},
): Promise<T> {
  const url = urlOf(path, options.query);
  const headers: Record<string, string> = { Accept: 'application/json' };
  // A form (a file upload) sets its own multipart type and boundary; everything else is JSON.
  const isForm = typeof FormData !== 'undefined' && options.body instanceof FormData;
  if (options.body !== undefined && !isForm) headers['Content-Type'] = 'application/json';

  let response: Response;
  try {
    const early = (options.method ?? 'GET') === 'GET' ? takeEarly(url) : undefined;
    response = await (early ??
      fetch(url, {
        method: options.method ?? 'GET',
        headers,
        credentials: 'same-origin',
        body:
          options.body === undefined ? undefined : isForm ? (options.body as FormData) : JSON.stringify(options.body),
        signal: options.signal,
      }));
  } catch (cause) {
    // An abort is the caller's own doing (a query that is no longer needed): pass it through untouched.
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError({
      code: 'UNAVAILABLE',
      status: 0,
      message: 'Kerfline could not be reached. Check the network connection and try again.',
    });
  }

  const json = await readJson(response);

  if (!response.ok) {
    const parsed = errorBodySchema.safeParse(json);
    if (parsed.success) {
      const { code, message, details, requestId } = parsed.data.error;
      throw new ApiError({ code, status: response.status, message, details, requestId });
    }
    const code = codeForStatus(response.status);
    throw new ApiError({ code, status: response.status, message: MESSAGE_BY_CODE[code] });
  }

  if (schema === null) return undefined as T;
  const parsed = schema.safeParse(json);
  if (!parsed.success) {
    throw new ApiError({
      code: 'INTERNAL',
      status: response.status,
      message:
        'The server answered in a shape this page does not understand. Reload the page; if it keeps happening, tell your administrator.',
      details: detailsFromZodError(parsed.error),
    });
  }
  return parsed.data;
}

export const api = {
  get: <T>(path: string, schema: z.ZodType<T>, options: Omit<RequestOptions, 'method' | 'body'> = {}) =>
    apiRequest(path, schema, { ...options, method: 'GET' }),
  post: <T>(path: string, body: unknown, schema: z.ZodType<T> | null) =>
    apiRequest(path, schema, { method: 'POST', body }),
  /** A multipart form, for sending a file with its fields. */
  postForm: <T>(path: string, form: FormData, schema: z.ZodType<T> | null) =>
    apiRequest(path, schema, { method: 'POST', body: form }),
  patch: <T>(path: string, body: unknown, schema: z.ZodType<T>) => apiRequest(path, schema, { method: 'PATCH', body }),
  put: <T>(path: string, body: unknown, schema: z.ZodType<T>) => apiRequest(path, schema, { method: 'PUT', body }),
  /** A DELETE; a record's removal sends its reason as the body (`{ reason }`). */
  delete: <T>(path: string, schema: z.ZodType<T> | null, body?: unknown) =>
    apiRequest(path, schema, { method: 'DELETE', body }),
};
