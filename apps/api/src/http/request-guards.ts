import type { Request, RequestHandler } from 'express';
import { AppError } from '../errors.js';

/**
 * Guards against cross-site request forgery. The session cookie is SameSite=Lax, which still lets a page on a
 * sibling origin of the same site (another host under the same domain) post a form with it. So every
 * state-changing request is refused when the browser says it comes from another origin:
 *
 * - with an `Origin` header, it must equal Kerfline's own origin: the request's own scheme and host (behind
 *   `TRUST_PROXY`, from `X-Forwarded-Proto`/`X-Forwarded-Host`) or the configured `PUBLIC_URL`;
 * - without one, `Sec-Fetch-Site` must be `same-origin` or `none` (typed by the user);
 * - with neither (curl, scripts, server-to-server, supertest) the request passes: no browser sent it, so no
 *   cookie was attached by a browser on someone's behalf.
 *
 * Browsers send `Origin` on every cross-origin POST, PUT, PATCH and DELETE, so a forged form always has one.
 */
export function sameOriginOnly(options: { publicUrl?: string | undefined }): RequestHandler {
  const configured = options.publicUrl ? originOf(options.publicUrl) : null;
  return (req, _res, next) => {
    if (!STATE_CHANGING.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin !== undefined) {
      const own = originOf(`${req.protocol}://${req.host}`);
      const claimed = origin === 'null' ? null : originOf(origin);
      if (claimed !== null && (claimed === own || claimed === configured)) return next();
      return next(foreign(origin));
    }
    const site = req.get('sec-fetch-site');
    if (site === undefined || site === 'same-origin' || site === 'none') return next();
    next(foreign(`a ${site} page`));
  };
}

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function originOf(url: string): string | null {
  try {
    const parsed = new URL(url);
    return parsed.protocol === 'http:' || parsed.protocol === 'https:' ? parsed.origin : null;
  } catch {
    return null;
  }
}

function foreign(from: string): AppError {
  return new AppError(
    'FORBIDDEN',
    `This request came from another web address (${from.slice(0, 100)}), so Kerfline refused it to protect your account. ` +
      'Open Kerfline at its own address and do it from there.',
  );
}

/**
 * The API reads JSON bodies only (`application/json`, UTF-8): a state-changing request with a body of any other
 * type answers 415 before anything reads it, so a plain HTML form (urlencoded, text/plain) never reaches a
 * route. Multipart bodies are accepted only on the upload routes listed in `multipartPaths` (matched on the
 * path under the app), which multer reads; those are protected by the Origin check above.
 */
export function jsonBodiesOnly(options: { multipartPaths: readonly RegExp[] }): RequestHandler {
  return (req, _res, next) => {
    if (!STATE_CHANGING.has(req.method) || !hasBody(req)) return next();
    if (req.is('application/json')) return next();
    if (req.is('multipart/form-data') && options.multipartPaths.some((p) => p.test(req.path))) return next();
    const type = req.get('content-type') ?? 'none';
    next(
      new AppError(
        'UNSUPPORTED_MEDIA_TYPE',
        req.is('multipart/form-data')
          ? 'This route takes JSON, not a form upload; send the body with Content-Type: application/json'
          : `Send the request body as JSON with Content-Type: application/json (it was ${type.slice(0, 80)})`,
      ),
    );
  };
}

/** A body is there when it is chunked or its length is above zero (a bodiless POST sends length 0). */
function hasBody(req: Request): boolean {
  if (req.get('transfer-encoding') !== undefined) return true;
  const length = Number(req.get('content-length') ?? '0');
  return Number.isNaN(length) || length > 0;
}

/**
 * No API answer may be kept by a browser or a proxy cache: they hold one person's view of their sites, which
 * must not reappear after sign-out on a shared plant computer.
 */
export const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store');
  next();
};
