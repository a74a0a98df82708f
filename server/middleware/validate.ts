import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { fromZod } from '../errors.ts';

export interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

/**
 * Parses body, query and params with their zod schemas; the parsed values land in
 * `res.locals.valid` (Express 5's `req.query` is read-only). A failure is a 400 "field: message".
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const valid = { body: undefined as unknown, query: undefined as unknown, params: undefined as unknown };
    for (const location of ['params', 'query', 'body'] as const) {
      const schema = schemas[location];
      if (!schema) continue;
      const result = schema.safeParse(req[location]);
      if (!result.success) {
        next(fromZod(result.error, location));
        return;
      }
      valid[location] = result.data;
    }
    res.locals.valid = valid;
    next();
  };
}
