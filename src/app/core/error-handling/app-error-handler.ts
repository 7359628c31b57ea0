import { ErrorHandler, Injectable, inject } from '@angular/core';
import { apiErrorMessage } from '../api/api-error';
import { HttpErrorResponse } from '@angular/common/http';
import { Notifier } from '../notify/notifier';

/** Messages browsers use when a lazily loaded chunk cannot be fetched (e.g. after a deploy). */
const CHUNK_FAILURE_PATTERNS = [
  /Failed to fetch dynamically imported module/i,
  /error loading dynamically imported module/i,
  /Importing a module script failed/i,
  /Loading chunk [\w-]+ failed/i,
];

/** Whether `error` says a lazily loaded part of the app could not be fetched. */
export function isChunkLoadFailure(error: unknown): boolean {
  const message = error instanceof Error ? error.message : String(error);
  return CHUNK_FAILURE_PATTERNS.some((pattern) => pattern.test(message));
}

/**
 * The app's one place for uncaught errors: logs every error, and tells the user in a snackbar.
 * A failed chunk load usually means a new version was deployed, so it offers a reload.
 */
@Injectable()
export class AppErrorHandler implements ErrorHandler {
  private readonly notifier = inject(Notifier);

  /** Logs `error` and shows a short message about it. */
  handleError(error: unknown): void {
    console.error(error);
    if (isChunkLoadFailure(error)) {
      this.notifier
        .failureWithAction(
          'Part of Cellsmith failed to load; a newer version may be out.',
          'Reload',
        )
        .onAction()
        .subscribe(() => location.reload());
      return;
    }
    const message =
      error instanceof HttpErrorResponse
        ? apiErrorMessage(error, 'A request failed.')
        : 'Something went wrong. The details are in the browser console.';
    this.notifier.failure(message);
  }
}
