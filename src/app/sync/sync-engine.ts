import { HttpErrorResponse } from '@angular/common/http';
import { DestroyRef, ErrorHandler, inject, Injectable, Injector, computed, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import type { Mutation } from '@benchtide/shared';
import { fromEvent, merge, skip, timer } from 'rxjs';
import { v7 } from 'uuid';
import { AccountSession } from '../core/account-session';
import { apiError } from '../core/api-error';
import { Connectivity } from '../core/connectivity';
import { BenchDb } from './bench-db';
import { fixedMutation, type ChangeFix } from './change-fixes';
import { ChangePull } from './change-pull';
import { liveSignal, liveSignalOf } from './live-signal';
import { OfflineStore } from './offline-store';
import { OutboxPush } from './outbox-push';
import { PhotoUploadQueue } from './photo-upload-queue';
import { PhotoUploader } from './photo-uploader';
import { retryDelayMs } from './retry-delay';
import type { OutboxRow } from './synced-records';

export const SYNC_EVERY_MS = 3 * 60_000;
const SESSION_ENDED = 'You are signed out. Sign in again to send the changes kept on this device.';
const FAILED = 'Syncing stopped on this device. It will try again.';

/**
 * Keeps this device and the server in step: pushes each workshop's outbox, sends its waiting photos, then
 * pulls what changed. Runs
 * on demand, on start, every 3 minutes, when the connection returns, after each change or photo queued here, and
 * after a failure with growing waits (never sooner than a busy server asked). One tab syncs at a time; the
 * others see its writes live.
 */
@Injectable({ providedIn: 'root' })
export class SyncEngine {
  private readonly db = inject(BenchDb);
  private readonly store = inject(OfflineStore);
  private readonly outbox = inject(OutboxPush);
  private readonly changes = inject(ChangePull);
  private readonly photos = inject(PhotoUploadQueue);
  private readonly uploader = inject(PhotoUploader);
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
  /** The longest wait a server asked for in the last sync (503 with retryAfterMinutes). */
  private askedToWaitMs = 0;
  private retryTimer: ReturnType<typeof setTimeout> | undefined;
  private started = false;

  readonly online = this.connectivity.online;
  readonly syncing = this.running.asReadonly();
  /** Why the last sync failed, in plain words; null after one that went through. */
  readonly lastError = this.error.asReadonly();
  /** The server said the session ended; changes stay queued until the modeller signs in again. */
  readonly sessionEnded = this.ended.asReadonly();
  readonly waitingCount = liveSignal(() => this.db.outbox.where('state').equals('waiting').count(), 0);
  /** Changes waiting to be sent, oldest first. */
  readonly waiting = liveSignal<OutboxRow[]>(() => this.db.outbox.where('state').equals('waiting').toArray(), []);
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
    merge(timer(0, SYNC_EVERY_MS), fromEvent(window, 'online'), this.store.changes, this.photos.added, signIns)
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
  retry(seq: number): Promise<void> {
    return this.resend(seq, (row) => row.mutation);
  }

  /** Sends a rejected change again as one of its fixes (fixesFor) has it; throws for a fix it does not offer. */
  retryWith(seq: number, fix: ChangeFix): Promise<void> {
    return this.resend(seq, (row) => fixedMutation(row, fix));
  }

  /** Throws a rejected change away; a record it created goes with it, fields it changed return. */
  discard(seq: number): Promise<void> {
    return this.store.discard(seq);
  }

  /**
   * The server keeps its answer to every mutation id, a refusal included, so a change sent again goes
   * under a new id. It keeps its place in the queue.
   */
  private async resend(seq: number, change: (row: OutboxRow) => Mutation): Promise<void> {
    await this.db.transaction('rw', this.db.outbox, async () => {
      const row = await this.db.outbox.get(seq);
      if (row?.state !== 'rejected') return;
      const mutationId = v7();
      const mutation = { ...change(row), mutationId };
      await this.db.outbox.update(seq, { state: 'waiting', reason: undefined, mutationId, mutation });
    });
    void this.syncNow();
  }

  private async run(): Promise<void> {
    // Offline or signed out, there is nothing to try: coming online or signing in starts the next sync.
    if (!navigator.onLine || !this.session.signedIn()) return;
    clearTimeout(this.retryTimer);
    this.running.set(true);
    this.askedToWaitMs = 0;
    try {
      await this.withLock(() => this.syncAll());
      this.failures = 0;
      this.error.set(null);
    } catch (error) {
      if (!(error instanceof HttpErrorResponse)) this.errorHandler.handleError(error);
      this.error.set(plainWords(error));
      if (isSessionEnd(error)) {
        this.ended.set(true);
        // Asking who is signed in lets the rest of the app learn that the session ended.
        await this.session.refresh();
      } else {
        this.retryLater();
      }
    } finally {
      this.running.set(false);
    }
  }

  /**
   * Every workshop with queued changes or photos, and every workshop of the account; one failing does not
   * stop the rest. A photo that could not be sent does not hold back the pull: it is tried again after it.
   */
  private async syncAll(): Promise<void> {
    const pushTo = (await this.db.outbox.orderBy('workshopId').uniqueKeys()) as string[];
    const uploadTo = (await this.db.photoUploads.orderBy('workshopId').uniqueKeys()) as string[];
    const pullFrom = this.session.workshops().map((workshop) => workshop.id);
    let failure: unknown = null;
    let left = false;
    for (const workshopId of new Set([...pushTo, ...uploadTo, ...pullFrom])) {
      try {
        const pushed = await this.outbox.push(workshopId);
        if (pushed !== 'idle') this.ended.set(false);
        // Its waiting changes are now shown as refused; there is nothing more to send to it or pull from it.
        if (pushed === 'not-a-member') {
          left = true;
          await this.uploader.refuseAll(workshopId);
          continue;
        }
        const unsent = await this.uploader.send(workshopId);
        if (pullFrom.includes(workshopId)) {
          await this.changes.pull(workshopId);
          this.ended.set(false);
        }
        if (unsent !== null) throw unsent;
      } catch (error) {
        if (isSessionEnd(error)) throw error;
        failure ??= error;
        this.askedToWaitMs = Math.max(this.askedToWaitMs, askedToWaitMs(error));
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
    // The account's list of workshops is out of date: ask for it again, so the one it left drops out.
    if (left) await this.session.refresh();
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
    const delayMs = Math.max(retryDelayMs(this.failures), this.askedToWaitMs);
    this.retryTimer = setTimeout(() => void this.syncNow(), delayMs);
  }
}

function isSessionEnd(error: unknown): boolean {
  return error instanceof HttpErrorResponse && error.status === 401;
}

/** How long a busy server asked devices to stay away (503 with retryAfterMinutes), or 0. */
function askedToWaitMs(error: unknown): number {
  return error instanceof HttpErrorResponse ? (apiError(error).retryAfterMinutes ?? 0) * 60_000 : 0;
}

function plainWords(error: unknown): string {
  if (!(error instanceof HttpErrorResponse)) return FAILED;
  return isSessionEnd(error) ? SESSION_ENDED : apiError(error).message;
}
