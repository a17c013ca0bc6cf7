import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { SwUpdate } from '@angular/service-worker';
import { filter, interval } from 'rxjs';

const CHECK_EVERY_MS = 30 * 60_000;

/**
 * Tells the modeller when a new version of the app has been fetched (it takes over on reload,
 * never in the middle of a pour), and when the cached copy is broken beyond the worker's repair.
 */
@Injectable({ providedIn: 'root' })
export class AppUpdates {
  private readonly updates = inject(SwUpdate);
  private readonly destroyRef = inject(DestroyRef);

  readonly ready = signal(false);
  readonly broken = signal(false);

  constructor() {
    if (!this.updates.isEnabled) return;
    this.updates.versionUpdates
      .pipe(
        filter((event) => event.type === 'VERSION_READY'),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe(() => this.ready.set(true));
    this.updates.unrecoverable.pipe(takeUntilDestroyed(this.destroyRef)).subscribe(() => this.broken.set(true));
    interval(CHECK_EVERY_MS)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => void this.updates.checkForUpdate().catch(() => undefined));
  }

  reload(): void {
    document.location.reload();
  }
}
