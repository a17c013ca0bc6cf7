import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { format, formatDistanceToNow } from 'date-fns';
import { AccountSession } from '../core/account-session';
import { InstallOffer } from '../core/install-offer';
import { PhotoUploadList } from '../photos/photo-upload-list';
import { StorageHealth } from '../sync/storage-health';
import { fixesFor, type ChangeFix } from '../sync/change-fixes';
import { SyncEngine } from '../sync/sync-engine';
import type { OutboxRow } from '../sync/synced-records';
import { describeChange } from './change-words';
import { DeviceSettings } from './device-settings';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

/** How many waiting changes are listed one by one; the rest are counted. */
const LISTED = 30;

/**
 * What this device holds that the server has not yet got, and how safe it is: the changes waiting to be
 * sent, the ones the server refused (each with its reason and a way to fix or discard it), the photos not
 * sent yet, the space used,
 * whether the browser promised to keep it, and the offer to install the app.
 */
@Component({
  selector: 'bt-device-page',
  providers: [ROOMY_FORM_FIELDS],
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, DeviceSettings, PhotoUploadList],
  templateUrl: './device-page.html',
  styleUrl: './device-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DevicePage {
  private readonly engine = inject(SyncEngine);
  private readonly storage = inject(StorageHealth);
  private readonly session = inject(AccountSession);
  protected readonly install = inject(InstallOffer);

  protected readonly online = this.engine.online;
  protected readonly syncing = this.engine.syncing;
  protected readonly lastError = this.engine.lastError;
  protected readonly sessionEnded = this.engine.sessionEnded;
  protected readonly signedIn = this.session.signedIn;
  protected readonly rejected = this.engine.rejected;
  protected readonly waiting = computed(() => this.engine.waiting().slice(0, LISTED));
  protected readonly notListed = computed(() => Math.max(0, this.engine.waiting().length - LISTED));
  protected readonly waitingCount = this.engine.waitingCount;
  protected readonly persisted = this.storage.persisted;
  /** The change whose discard waits for a second tap. */
  protected readonly confirmingDiscard = signal<number | null>(null);
  protected readonly busy = signal<number | null>(null);

  protected readonly lastSynced = computed(() => {
    const at = this.engine.lastSyncedAt();
    return at === null ? null : `${format(at, 'HH:mm, d MMM')} (${formatDistanceToNow(at, { addSuffix: true })})`;
  });
  protected readonly summary = computed(() => {
    const waiting = this.waitingCount();
    const changes = waiting === 1 ? '1 change waits' : `${waiting} changes wait`;
    if (this.sessionEnded() || !this.signedIn()) {
      return waiting > 0
        ? `You are signed out: ${changes} on this device until you sign in again.`
        : 'You are signed out.';
    }
    if (!this.online()) {
      return waiting > 0
        ? `Offline: ${changes} here and will be sent when the connection returns.`
        : 'Offline: everything you change is kept here and sent when the connection returns.';
    }
    if (waiting > 0) return `${changes} to be sent.`;
    return 'Everything changed on this device has reached the server.';
  });
  protected readonly space = computed(() => {
    const usage = this.storage.usage();
    const quota = this.storage.quota();
    if (usage === null) return null;
    return quota === null
      ? `Benchtide uses ${bytes(usage)} here.`
      : `Benchtide uses ${bytes(usage)} of the ${bytes(quota)} this browser offers.`;
  });

  constructor() {
    void this.storage.measure();
  }

  protected describe(row: OutboxRow): string {
    return describeChange(row.mutation);
  }

  protected queuedAt(row: OutboxRow): string {
    return format(row.queuedAt, 'HH:mm, d MMM');
  }

  protected fields(row: OutboxRow): string[] {
    return Object.values(row.reason?.fields ?? {});
  }

  protected fixes(row: OutboxRow): ChangeFix[] {
    return fixesFor(row);
  }

  protected syncNow(): void {
    void this.engine.syncNow();
  }

  protected async applyFix(row: OutboxRow, fix: ChangeFix): Promise<void> {
    await this.while(row, () => this.engine.retryWith(row.seq, fix));
  }

  protected async retry(row: OutboxRow): Promise<void> {
    await this.while(row, () => this.engine.retry(row.seq));
  }

  protected async discard(row: OutboxRow): Promise<void> {
    if (this.confirmingDiscard() !== row.seq) {
      this.confirmingDiscard.set(row.seq);
      return;
    }
    this.confirmingDiscard.set(null);
    await this.while(row, () => this.engine.discard(row.seq));
  }

  protected keepDiscarded(): void {
    this.confirmingDiscard.set(null);
  }

  protected keepData(): void {
    void this.storage.keep();
  }

  protected installApp(): void {
    void this.install.install();
  }

  private async while(row: OutboxRow, work: () => Promise<void>): Promise<void> {
    this.busy.set(row.seq);
    try {
      await work();
    } finally {
      this.busy.set(null);
    }
  }
}

function bytes(count: number): string {
  const units = ['bytes', 'kB', 'MB', 'GB', 'TB'];
  let value = count;
  let unit = 0;
  while (value >= 1000 && unit < units.length - 1) {
    value /= 1000;
    unit += 1;
  }
  return `${unit === 0 ? value : value.toFixed(value < 10 ? 1 : 0)} ${units[unit]}`;
}
