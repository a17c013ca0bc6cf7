import { ErrorHandler, Injectable, Injector, inject, type Provider } from '@angular/core';

export const ERROR_NOTICE = 'Something went wrong. What you saved is kept; reload the page if it keeps happening.';
/** Errors closer together than this share one notice. */
export const NOTICE_QUIET_MS = 10_000;

/**
 * Where every error nothing else caught ends up: it goes to the console, and the modeller gets one short
 * notice, not one per error. An error already noticed once is not noticed again: the sync engine reports
 * the same failure on every retry while its own status already says syncing stopped.
 */
@Injectable()
export class AppErrorHandler extends ErrorHandler {
  private readonly injector = inject(Injector);
  private readonly noticed = new Set<string>();
  private lastNoticeAt = Number.NEGATIVE_INFINITY;

  override handleError(error: unknown): void {
    super.handleError(error);
    const key = errorKey(error);
    const now = Date.now();
    if (this.noticed.has(key) || now - this.lastNoticeAt < NOTICE_QUIET_MS) return;
    this.noticed.add(key);
    this.lastNoticeAt = now;
    void this.showNotice();
  }

  private async showNotice(): Promise<void> {
    try {
      // Loaded on the first error only, so the snack bar stays out of the first download.
      const { MatSnackBar } = await import('@angular/material/snack-bar');
      this.injector.get(MatSnackBar).open(ERROR_NOTICE, undefined, { duration: NOTICE_QUIET_MS });
    } catch (failure) {
      // Not reported again: a notice that cannot be shown must not report itself in a loop.
      console.error('could not show the error notice', failure);
    }
  }
}

export function provideAppErrorHandler(): Provider {
  return { provide: ErrorHandler, useClass: AppErrorHandler };
}

function errorKey(error: unknown): string {
  return error instanceof Error ? `${error.name}: ${error.message}` : String(error);
}
