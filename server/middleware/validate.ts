import type { Request, RequestHandler } from 'express';
import type { z } from 'zod';
import { badRequest, fromZod } from '../errors.ts';

export interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

/**
 * The path of the first string (value or key) holding U+0000, or null. SQLite ends a statement at a
 * NUL byte, and no text field of ours has a use for one, so it is refused before any schema runs.
 */
export function findNul(value: unknown, path: (string | number)[] = [], depth = 0): (string | number)[] | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path : null;
  // Deeper than any schema of ours reaches; the schema itself rejects such a body.
  if (typeof value !== 'object' || value === null || depth > 64) return null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i += 1) {
      const found = findNul(value[i], [...path, i], depth + 1);
      if (found) return found;
    }
    return null;
  }
  for (const [key, item] of Object.entries(value)) {
    if (key.includes('\u0000')) return [...path, key.replace(/\u0000/g, '\\0')];
    const found = findNul(item, [...path, key], depth + 1);
    if (found) return found;
  }
  return null;
}

/** No request body of ours nests deeper; past it the canonical formatter and schemas would recurse that far. */
export const MAX_BODY_DEPTH = 64;

/** True when the value nests objects or arrays deeper than `limit` (iterative, so a hostile depth cannot overflow the stack). */
export function nestsDeeperThan(value: unknown, limit: number): boolean {
  const stack: { value: unknown; depth: number }[] = [{ value, depth: 0 }];
  while (stack.length > 0) {
    const { value: current, depth } = stack.pop()!;
    if (typeof current !== 'object' || current === null) continue;
    if (depth >= limit) return true;
    for (const item of Array.isArray(current) ? current : Object.values(current)) stack.push({ value: item, depth: depth + 1 });
  }
  return false;
}

/** Body, query and params parsed with their zod schemas, or the 400 their first failure answers. */
export function validateInput(schemas: Schemas, req: Pick<Request, 'body' | 'query' | 'params'>): { valid: { body: unknown; query: unknown; params: unknown } } | { error: Error } {
  const valid = { body: undefined as unknown, query: undefined as unknown, params: undefined as unknown };
  for (const location of ['params', 'query', 'body'] as const) {
    const schema = schemas[location];
    if (!schema) continue;
    if (location === 'body' && nestsDeeperThan(req.body, MAX_BODY_DEPTH)) {
      return { error: badRequest(`body: nested deeper than ${MAX_BODY_DEPTH} levels`, 'input.invalid', [{ path: 'body', message: `nested deeper than ${MAX_BODY_DEPTH} levels` }]) };
    }
    const nulAt = findNul(req[location]);
    if (nulAt) {
      const field = nulAt.length > 0 ? nulAt.join('.') : location;
      return { error: badRequest(`${field}: must not contain NUL characters (\\u0000)`, 'input.invalid', [{ path: field, message: 'must not contain NUL characters' }]) };
    }
    const result = schema.safeParse(req[location]);
    if (!result.success) return { error: fromZod(result.error, location) };
    valid[location] = result.data;
  }
  return { valid };
}

/**
 * Parses body, query and params with their zod schemas; the parsed values land in
 * `res.locals.valid` (Express 5's `req.query` is read-only). A failure is a 400 "field: message".
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    const outcome = validateInput(schemas, req);
    if ('error' in outcome) {
      next(outcome.error);
      return;
    }
    res.locals.valid = outcome.valid;
    next();
  };
}
