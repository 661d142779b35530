import { ErrorHandler, Injectable, inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { ApiError } from './api-error';

/**
 * The last resort for errors no component handled: logs them for developers and tells the user
 * in one calm sentence, never with a stack trace.
 */
@Injectable()
export class AppErrorHandler implements ErrorHandler {
  private readonly snackBar = inject(MatSnackBar);

  handleError(error: unknown): void {
    console.error(error);
    const message =
      error instanceof ApiError
        ? error.message
        : 'Something unexpected went wrong. Reload the page if it persists.';
    this.snackBar.open(message, 'Dismiss', { duration: 8000 });
  }
}
