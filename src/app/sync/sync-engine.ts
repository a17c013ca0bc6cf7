import { HttpErrorResponse } from '@angular/common/http';
import { DestroyRef, ErrorHandler, inject, Injectable, Injector, computed, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { fromEvent, merge, skip, timer } from 'rxjs';
import { AccountSession } from '../account/account-session';
import { apiError } from '../core/api-error';
import { Connectivity } from '../core/connectivity';
import { BenchDb } from './bench-db';
import { ChangePull } from './change-pull';
import { liveSignal, liveSignalOf } from './live-signal';
import { OfflineStore } from './offline-store';
import { OutboxPush } from './outbox-push';
import { retryDelayMs } from './retry-delay';
import type { OutboxRow } from './synced-records';

export const SYNC_EVERY_MS = 3 * 60_000;
const SESSION_ENDED = 'You are signed out. Sign in again to send the changes kept on this device.';
const FAILED = 'Syncing stopped on this device. It will try again.';

/**
 * Keeps this device and the server in step: pushes each workshop's outbox, then pulls what changed. Runs
 * on demand, on start, every 3 minutes, when the connection returns, after each change queued here, and
 * after a failure with growing waits. One tab syncs at a time; the others see its writes live.
 */
@Injectable({ providedIn: 'root' })
export class SyncEngine {
  private readonly db = inject(BenchDb);
  private readonly store = inject(OfflineStore);
  private readonly outbox = inject(OutboxPush);
  private readonly changes = inject(ChangePull);
  private readonly session = inject(AccountSession);
  private readonly connectivity = inject(Connectivity);
  private readonly errorHandler = inject(ErrorHandler);
  private readonly injector = inject(Injector);
  private readonly destroyRef = inject(DestroyRef);

  private readonly running = signal(false);
  private readonly error = signal<string | null>(null);
  private readonly ended = signal(false);
  private readonly currentState = liveSignalOf(
    this.session.currentWorkshopId,
    (workshopId) => (workshopId === null ? undefined : this.db.syncState.get(workshopId)),
    undefined,
  );
  private current: Promise<void> | null = null;
  private followUp: Promise<void> | null = null;
  private failures = 0;
  private retryTimer: ReturnType<typeof setTimeout> | undefined;
  private started = false;

  readonly online = this.connectivity.online;
  readonly syncing = this.running.asReadonly();
  /** Why the last sync failed, in plain words; null after one that went through. */
  readonly lastError = this.error.asReadonly();
  /** The server said the session ended; changes stay queued until the modeller signs in again. */
  readonly sessionEnded = this.ended.asReadonly();
  readonly waitingCount = liveSignal(() => this.db.outbox.where('state').equals('waiting').count(), 0);
  /** Changes the server refused, oldest first, each with its reason: they wait for retry or discard. */
  readonly rejected = liveSignal<OutboxRow[]>(() => this.db.outbox.where('state').equals('rejected').toArray(), []);
  /** When the current workshop last pulled, as an ISO time; null before its first sync on this device. */
  readonly lastSyncedAt = computed(() => this.currentState()?.lastSyncedAt ?? null);

  constructor() {
    this.destroyRef.onDestroy(() => clearTimeout(this.retryTimer));
  }

  /** Starts syncing on its own: now, every 3 minutes, when back online, after each change and each sign-in. */
  start(): void {
    if (this.started) return;
    this.started = true;
    const signIns = toObservable(this.session.session, { injector: this.injector }).pipe(skip(1));
    merge(timer(0, SYNC_EVERY_MS), fromEvent(window, 'online'), this.store.changes, signIns)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe(() => void this.syncNow());
  }

  /** Pushes and pulls now. During a sync, runs once more after it, so a change queued meanwhile goes too. */
  syncNow(): Promise<void> {
    if (this.current === null) {
      this.current = this.run().finally(() => (this.current = null));
      return this.current;
    }
    this.followUp ??= this.current.then(() => {
      this.followUp = null;
      return this.syncNow();
    });
    return this.followUp;
  }

  /** Sends a rejected change again, after the modeller fixed what stood in its way. */
  async retry(seq: number): Promise<void> {
    await this.db.transaction('rw', this.db.outbox, async () => {
      const row = await this.db.outbox.get(seq);
      if (row?.state === 'rejected') await this.db.outbox.update(seq, { state: 'waiting', reason: undefined });
    });
    void this.syncNow();
  }

  /** Throws a rejected change away; a record it created goes with it, fields it changed return. */
  discard(seq: number): Promise<void> {
    return this.store.discard(seq);
  }

  private async run(): Promise<void> {
    // Offline, there is nothing to try: the online event starts the next sync.
    if (!navigator.onLine) return;
    clearTimeout(this.retryTimer);
    this.running.set(true);
    try {
      await this.withLock(() => this.syncAll());
      this.failures = 0;
      this.error.set(null);
    } catch (error) {
      if (!(error instanceof HttpErrorResponse)) this.errorHandler.handleError(error);
      this.error.set(plainWords(error));
      if (isSessionEnd(error)) this.ended.set(true);
      else this.retryLater();
    } finally {
      this.running.set(false);
    }
  }

  /** Every workshop with queued changes, and every workshop of the account; one failing does not stop the rest. */
  private async syncAll(): Promise<void> {
    const pushTo = (await this.db.outbox.orderBy('workshopId').uniqueKeys()) as string[];
    const pullFrom = this.session.workshops().map((workshop) => workshop.id);
    let failure: unknown = null;
    for (const workshopId of new Set([...pushTo, ...pullFrom])) {
      try {
        if (await this.outbox.push(workshopId)) this.ended.set(false);
        if (!pullFrom.includes(workshopId)) continue;
        await this.changes.pull(workshopId);
        this.ended.set(false);
      } catch (error) {
        if (isSessionEnd(error)) throw error;
        failure ??= error;
        const state = await this.db.syncState.get(workshopId);
        await this.db.syncState.put({
          cursor: 0,
          lastSyncedAt: null,
          ...state,
          workshopId,
          lastError: plainWords(error),
        });
      }
    }
    if (failure !== null) throw failure;
  }

  private async withLock(work: () => Promise<void>): Promise<void> {
    const locks = 'locks' in navigator ? navigator.locks : undefined;
    // Without Web Locks (older browsers), tabs may sync side by side: harmless, as pushes are idempotent.
    await (locks ? locks.request('benchtide-sync', work) : work());
  }

  private retryLater(): void {
    this.failures += 1;
    clearTimeout(this.retryTimer);
    this.retryTimer = setTimeout(() => void this.syncNow(), retryDelayMs(this.failures));
  }
}

function isSessionEnd(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 401;
}

function plainWords(error: unknown): string {
  if (!(error instanceof HttpErrorResponse)) return FAILED;
  return isSessionEnd(error) ? SESSION_ENDED : apiError(error).message;
}
