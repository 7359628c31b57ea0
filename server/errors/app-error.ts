import type { ErrorCode } from '../../shared/contracts/errors';

/** An error meant for the client: carries its HTTP status, code and optional details. */
export class AppError extends Error {
  constructor(
    /** HTTP status to answer with. */
    readonly status: number,
    /** Stable machine-readable code. */
    readonly code: ErrorCode,
    message: string,
    /** Extra facts for the client (zod issues, row/column, ids). */
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

/** 404 for a record that does not exist or belongs to another shop (never say which). */
export function notFound(what: string): AppError {
  return new AppError(404, 'not_found', `${what} not found`);
}

/** 409 for a request that conflicts with the stored state. */
export function conflict(message: string, details?: unknown): AppError {
  return new AppError(409, 'conflict', message, details);
}

/** 403 for a signed-in user whose roles do not allow the action. */
export function forbidden(message = 'Your roles do not allow this'): AppError {
  return new AppError(403, 'forbidden', message);
}
