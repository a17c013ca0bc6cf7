import { Injectable, signal } from '@angular/core';

/**
 * Whether the browser keeps this device's records when space runs short, and how much space they take.
 * Without persistent storage a browser may clear the database, and with it changes not yet synced.
 */
@Injectable({ providedIn: 'root' })
export class StorageHealth {
  private readonly isPersisted = signal<boolean | null>(null);
  private readonly usageBytes = signal<number | null>(null);
  private readonly quotaBytes = signal<number | null>(null);
  private asked: Promise<void> | null = null;

  /** True once the browser promised to keep the data; null where the browser cannot say. */
  readonly persisted = this.isPersisted.asReadonly();
  readonly usage = this.usageBytes.asReadonly();
  readonly quota = this.quotaBytes.asReadonly();

  /** Asks for persistent storage once per visit (the browser may prompt), then measures. */
  check(): Promise<void> {
    this.asked ??= this.askToPersist().then(() => this.measure());
    return this.asked;
  }

  /** Asks again, from the modeller's own tap (some browsers only ask then); resolves whether the data is kept. */
  async keep(): Promise<boolean> {
    await this.askToPersist();
    await this.measure();
    return this.isPersisted() === true;
  }

  /** Reads how much space is used and offered; call again after a large sync. */
  async measure(): Promise<void> {
    const storage = storageManager();
    if (typeof storage?.estimate !== 'function') return;
    try {
      const { usage, quota } = await storage.estimate();
      this.usageBytes.set(usage ?? null);
      this.quotaBytes.set(quota ?? null);
    } catch {
      // Some browsers refuse in private windows: the amounts stay unknown (null).
    }
  }

  private async askToPersist(): Promise<void> {
    const storage = storageManager();
    if (typeof storage?.persisted !== 'function' || typeof storage.persist !== 'function') return;
    try {
      // Asking again when already granted would only prompt for nothing in some browsers.
      this.isPersisted.set((await storage.persisted()) || (await storage.persist()));
    } catch {
      // Refused outright (private windows in some browsers): whether data is kept stays unknown (null).
    }
  }
}

function storageManager(): Partial<StorageManager> | undefined {
  return 'storage' in navigator ? navigator.storage : undefined;
}
