import { Injectable, inject } from '@angular/core';
import {
  MatSnackBar,
  type MatSnackBarRef,
  type TextOnlySnackBar,
} from '@angular/material/snack-bar';
import { apiErrorMessage } from '../api/api-error';

/** How long a piece of news stays up, ms: long enough to read a sentence. */
export const NEWS_MS = 6000;
/** How long a failure stays up, ms: longer, as it usually asks the user to act. */
export const FAILURE_MS = 8000;

/**
 * The one way the app tells the user something happened: short news ("Saved") and failures
 * (an API error in words), each with the same action label and duration everywhere.
 */
@Injectable({ providedIn: 'root' })
export class Notifier {
  private readonly snackBar = inject(MatSnackBar);

  /** Shows a piece of news. */
  news(message: string): MatSnackBarRef<TextOnlySnackBar> {
    return this.snackBar.open(message, 'OK', { duration: NEWS_MS });
  }

  /** Shows a failure in words. */
  failure(message: string): MatSnackBarRef<TextOnlySnackBar> {
    return this.snackBar.open(message, 'Dismiss', { duration: FAILURE_MS });
  }

  /** Shows why a request failed: the server's message, else `fallback`. */
  requestFailed(error: unknown, fallback: string): MatSnackBarRef<TextOnlySnackBar> {
    return this.failure(apiErrorMessage(error, fallback));
  }

  /** Shows a failure with one action the user can take (no time limit: it waits for them). */
  failureWithAction(message: string, action: string): MatSnackBarRef<TextOnlySnackBar> {
    return this.snackBar.open(message, action);
  }
}
