import { HttpErrorResponse } from '@angular/common/http';
import { isApiErrorBody } from '@shared/contracts/errors';

/** Whether `error` is an HTTP error answer with the given status. */
export function isHttpStatus(error: unknown, status: number): error is HttpErrorResponse {
  return error instanceof HttpErrorResponse && error.status === status;
}

/**
 * A sentence for a person about a failed request: the server's own message when the answer
 * has the API's error shape, else a plain description of what went wrong.
 */
export function apiErrorMessage(error: unknown, fallback = 'The request failed.'): string {
  if (!(error instanceof HttpErrorResponse)) return fallback;
  if (isApiErrorBody(error.error)) return error.error.error.message;
  // Status 0 means the request never got an answer (offline, server down, blocked).
  if (error.status === 0) return 'Cannot reach the server. Check the connection and try again.';
  return `${fallback} (HTTP ${error.status})`;
}

/**
 * Whole minutes (at least 1) a client should wait, from a 429 answer's `Retry-After` header in
 * seconds; null when the header is missing or not a number of seconds.
 */
export function retryAfterMinutes(error: HttpErrorResponse): number | null {
  const header = error.headers.get('Retry-After');
  if (header === null || header.trim() === '') return null;
  const seconds = Number(header);
  if (!Number.isFinite(seconds) || seconds < 0) return null;
  return Math.max(1, Math.ceil(seconds / 60));
}
