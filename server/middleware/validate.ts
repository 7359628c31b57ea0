import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { AppError } from '../errors/app-error';

/** Schemas for the parts of a request a route reads. */
export interface RequestSchemas {
  /** Schema of the JSON body. */
  body?: z.ZodType;
  /** Schema of the query string. */
  query?: z.ZodType;
  /** Schema of the path parameters. */
  params?: z.ZodType;
}

/** What `validate` leaves on `res.locals` for the handler: the parsed parts. */
export interface Validated<B = unknown, Q = unknown, P = unknown> {
  /** The parsed body. */
  body: B;
  /** The parsed query. */
  query: Q;
  /** The parsed params. */
  params: P;
}

/**
 * Parses body, query and params with zod; on failure answers 400 with the issues (path and
 * message each). Parsed values go to `res.locals.valid` (Express 5's `req.query` is read-only).
 */
export function validate(schemas: RequestSchemas): RequestHandler {
  return (req, res, next) => {
    const valid: Validated = { body: undefined, query: undefined, params: undefined };
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(part === 'body' ? (req.body ?? {}) : req[part]);
      if (!result.success) {
        const issues = result.error.issues.map((issue) => ({
          path: [part, ...issue.path.map(String)].join('.'),
          message: issue.message,
        }));
        const first = issues[0];
        throw new AppError(
          400,
          'invalid_input',
          first ? `Invalid ${first.path}: ${first.message}` : `Invalid ${part}`,
          { issues },
        );
      }
      valid[part] = result.data;
    }
    res.locals['valid'] = valid;
    next();
  };
}

/** Reads what `validate` parsed, typed by the caller. */
export function validated<B = unknown, Q = unknown, P = unknown>(res: {
  locals: Record<string, unknown>;
}): Validated<B, Q, P> {
  return res.locals['valid'] as Validated<B, Q, P>;
}
