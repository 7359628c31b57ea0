import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '../../shared/contracts/errors';
import { AppError } from '../errors/app-error';

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  expose?: boolean;
}

/** Maps any thrown value to an `AppError`; unknown errors become a 500 with no internals. */
export function toAppError(err: unknown): AppError {
  if (err instanceof AppError) return err;
  const e = (typeof err === 'object' && err !== null ? err : {}) as HttpishError;
  if (e.type === 'entity.parse.failed') {
    return new AppError(400, 'invalid_input', 'The request body is not valid JSON');
  }
  if (e.type === 'entity.too.large') {
    return new AppError(413, 'too_large', 'The request body is too large');
  }
  const status = e.status ?? e.statusCode;
  if (status && status >= 400 && status < 500 && e.expose) {
    return new AppError(status, 'invalid_input', 'The request could not be read');
  }
  return new AppError(500, 'internal', 'Something went wrong on our side; it has been logged');
}

/** The one error middleware: logs server faults and answers with the API's error shape. */
export const errorHandler: ErrorRequestHandler = (err, req, res, next) => {
  if (res.headersSent) {
    next(err);
    return;
  }
  const appError = toAppError(err);
  if (appError.status >= 500) {
    console.error(`[cellsmith] ${req.method} ${req.originalUrl} failed:`, err);
  }
  const body: ApiErrorBody = { error: { code: appError.code, message: appError.message } };
  if (appError.details !== undefined) body.error.details = appError.details;
  res.status(appError.status).json(body);
};

/** 404 for any `/api` path no route answered. */
export const apiNotFound: RequestHandler = (req) => {
  throw new AppError(404, 'not_found', `No API route ${req.method} ${req.path}`);
};
