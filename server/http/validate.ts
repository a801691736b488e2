import type { Request, RequestHandler } from 'express';
import type { z } from 'zod';
import { badRequest, fieldsFromZod } from './errors';

type Part = 'body' | 'query' | 'params';

/**
 * Validates one part of the request and keeps the parsed value in req.valid[part]
 * (Express 5 makes req.query read-only, so parsed values do not overwrite it).
 */
export function validate<S extends z.ZodType>(part: Part, schema: S): RequestHandler {
  return (req, _res, next) => {
    const result = schema.safeParse(req[part] ?? {});
    if (!result.success) {
      const where = part === 'body' ? 'fields' : part === 'query' ? 'query parameters' : 'path parameters';
      return next(badRequest(`Some ${where} are not valid.`, fieldsFromZod(result.error)));
    }
    req.valid = { ...req.valid, [part]: result.data };
    next();
  };
}

/** The parsed value that validate() stored; the schema type keeps handlers honest. */
export function valid<S extends z.ZodType>(req: Request, part: Part, _schema: S): z.infer<S> {
  return req.valid?.[part] as z.infer<S>;
}
