import type { NextFunction, Request, Response } from 'express';
import type { z } from 'zod';
import { detailsFromZodError } from '@kerfline/domain/errors';
import { AppError } from '../errors.js';

type Part = 'body' | 'query' | 'params';

/**
 * Parses one part of the request with a domain schema and keeps the parsed value (defaults applied) on
 * `res.locals[part]`; Express 5's `req.query` is read-only, and handlers should never see unparsed input.
 */
export function validate<S extends z.ZodType>(part: Part, schema: S) {
  return (req: Request, res: Response, next: NextFunction) => {
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) {
      const where = part === 'body' ? 'request body' : part === 'query' ? 'query string' : 'address';
      throw AppError.validation(`Some fields in the ${where} need fixing`, detailsFromZodError(result.error));
    }
    res.locals[part] = result.data;
    next();
  };
}

/** The parsed value that `validate(part, schema)` stored. */
export function parsed<S extends z.ZodType>(res: Response, part: Part, _schema: S): z.output<S> {
  return res.locals[part] as z.output<S>;
}
