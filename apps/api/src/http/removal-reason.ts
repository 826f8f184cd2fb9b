import type { NextFunction, Request, Response } from 'express';
import { detailsFromZodError } from '@kerfline/domain/errors';
import { removeRecordSchema, type RemoveRecordInput } from '@kerfline/domain/removed-records/schema';
import { AppError } from '../errors.js';

/**
 * The reason a `DELETE` of a record must carry (the record is kept with it, and can be put back): from the JSON
 * body `{ "reason": "…" }` or, for clients that send no body with DELETE, the query `?reason=…`.
 */
export function requireRemovalReason() {
  return (req: Request, res: Response, next: NextFunction) => {
    const body = req.body !== null && typeof req.body === 'object' ? (req.body as Record<string, unknown>) : {};
    const result = removeRecordSchema.safeParse({ reason: body.reason ?? req.query.reason });
    if (!result.success)
      throw AppError.validation(
        'Say why this record is being removed: the reason is kept with it',
        detailsFromZodError(result.error),
      );
    res.locals.removal = result.data;
    next();
  };
}

/** The reason `requireRemovalReason` parsed. */
export function removalOf(res: Response): RemoveRecordInput {
  return res.locals.removal as RemoveRecordInput;
}
