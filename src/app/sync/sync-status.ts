import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { format } from 'date-fns';
import { PhotoUploadQueue } from './photo-upload-queue';
import { SyncEngine } from './sync-engine';

interface Status {
  readonly icon: 'done' | 'timer' | 'offline' | 'caution';
  readonly label: string;
  readonly attention: boolean;
}

let nextId = 0;

/** Where this device stands with the server, in an icon and words; it opens the list of this device's changes. */
@Component({
  selector: 'bt-sync-status',
  imports: [MatIconModule, RouterLink],
  template: `
    <a
      class="chip"
      routerLink="/device"
      [class.attention]="status().attention"
      [attr.aria-busy]="syncing()"
      [attr.aria-describedby]="hintId"
    >
      <mat-icon [svgIcon]="status().icon" aria-hidden="true" />
      <span class="label" aria-live="polite">{{ status().label }}</span>
    </a>
    <span class="hint" [id]="hintId">{{ hint() }}</span>
  `,
  styles: `
    :host {
      display: inline-flex;
    }
    .chip {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      min-width: 48px;
      min-height: 48px;
      padding: 0 14px;
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 24px;
      background: var(--mat-sys-surface-container);
      color: var(--mat-sys-on-surface);
      font: var(--mat-sys-label-large);
      white-space: nowrap;
      text-decoration: none;
    }
    .chip.attention {
      border-color: transparent;
      background: var(--bt-caution-bg);
      color: var(--bt-caution-fg);
    }
    .chip:focus-visible {
      outline: 3px solid var(--mat-sys-primary);
      outline-offset: 2px;
    }
    .hint {
      position: absolute;
      width: 1px;
      height: 1px;
      overflow: hidden;
      clip-path: inset(50%);
      white-space: nowrap;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SyncStatus {
  private readonly engine = inject(SyncEngine);
  private readonly photos = inject(PhotoUploadQueue);

  protected readonly syncing = this.engine.syncing;
  protected readonly hintId = `bt-sync-status-hint-${nextId++}`;
  protected readonly status = computed<Status>(() => {
    const waiting = this.engine.waitingCount() + this.photos.waitingCount();
    if (this.engine.rejected().length > 0 || this.photos.refusedCount() > 0 || this.engine.sessionEnded()) {
      return { icon: 'caution', label: 'Needs attention', attention: true };
    }
    if (!this.engine.online()) {
      return { icon: 'offline', label: waiting > 0 ? `Offline · ${waiting} waiting` : 'Offline', attention: false };
    }
    if (waiting > 0) return { icon: 'timer', label: `${waiting} waiting`, attention: false };
    return { icon: 'done', label: 'Synced', attention: false };
  });
  /** For screen readers: what needs doing, and when this device last heard from the server. */
  protected readonly hint = computed(() => {
    const rejected = this.engine.rejected().length;
    const refusedPhotos = this.photos.refusedCount();
    const syncedAt = this.engine.lastSyncedAt();
    return [
      this.engine.sessionEnded() ? 'Sign in again to send the changes waiting on this device.' : '',
      rejected === 1 ? '1 change could not be saved.' : rejected > 1 ? `${rejected} changes could not be saved.` : '',
      refusedPhotos === 1
        ? '1 photo could not be sent.'
        : refusedPhotos > 1
          ? `${refusedPhotos} photos could not be sent.`
          : '',
      syncedAt === null ? 'Not synced yet on this device.' : `Last synced at ${format(syncedAt, 'HH:mm, d MMM')}.`,
      'Opens the changes kept on this device.',
    ]
      .filter((part) => part !== '')
      .join(' ');
  });
}
