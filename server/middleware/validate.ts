import type { NextFunction, Request, RequestHandler, Response } from 'express';
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

/** The parsed type of one part's schema, or undefined when the route gives none. */
type PartOf<S extends RequestSchemas, K extends keyof RequestSchemas> = S[K] extends z.ZodType
  ? z.output<S[K]>
  : undefined;

/** What `handle` gives its handler: each part parsed by its schema, typed from the schema. */
export type Parsed<S extends RequestSchemas> = Validated<
  PartOf<S, 'body'>,
  PartOf<S, 'query'>,
  PartOf<S, 'params'>
>;

/**
 * A route's validation and handler in one: `validate(schemas)`, then `handler` with the parsed
 * parts typed from the schemas themselves (no hand-written generics to drift from them). Spread
 * it into the route: `router.post(path, requireRoles('tuner'), ...handle(schemas, handler))`.
 * The handler's promise is returned, so Express 5 sends a rejection to the error handler.
 */
export function handle<S extends RequestSchemas>(
  schemas: S,
  handler: (valid: Parsed<S>, req: Request, res: Response, next: NextFunction) => unknown,
): [RequestHandler, RequestHandler] {
  const run: RequestHandler = (req, res, next) =>
    handler(res.locals['valid'] as Parsed<S>, req, res, next) as Promise<void>;
  return [validate(schemas), run];
}
