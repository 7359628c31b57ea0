/** Machine-readable error codes of the API's error shape. */
export type ErrorCode =
  | 'invalid_input'
  | 'not_signed_in'
  | 'forbidden'
  | 'csrf'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'unusable_file'
  | 'too_many_requests'
  | 'internal';

/** The body of every error answer: `{ error: { code, message, details? } }`. */
export interface ApiErrorBody {
  /** The error itself. */
  error: {
    /** A stable code a client can branch on. */
    code: ErrorCode;
    /** A sentence for a person. */
    message: string;
    /** Extra facts: zod issues, the row/column of a file error, a conflicting id. */
    details?: unknown;
  };
}

/** A list answer: `{ items, total }`. */
export interface ListResponse<T> {
  /** The items of this page. */
  items: T[];
  /** How many items exist in all. */
  total: number;
}

/** Whether a parsed JSON value has the API's error shape. */
export function isApiErrorBody(value: unknown): value is ApiErrorBody {
  if (typeof value !== 'object' || value === null || !('error' in value)) return false;
  const error = (value as { error: unknown }).error;
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { code?: unknown }).code === 'string' &&
    typeof (error as { message?: unknown }).message === 'string'
  );
}
