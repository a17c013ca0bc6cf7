import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { v7 } from 'uuid';
import type { PickedPhoto } from '../sync/photo-upload-queue';
import { checkPhoto } from './photo-checks';
import { PhotoIcons } from './photo-icons';
import { readTakenTimes } from './taken-time';

/**
 * The way photos come in: the camera, or the phone's library. Each file is checked on the device first and
 * its taken time read; a file that cannot go is named with the reason, and the rest go on.
 */
@Component({
  selector: 'bt-photo-picker',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './photo-picker.html',
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 8px;
    }
    .refusals {
      display: flex;
      flex-direction: column;
      gap: 8px;
      margin: 0;
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
    .refusals button {
      --mat-button-text-label-text-color: var(--mat-sys-on-error-container);
    }
    .refusals ul {
      margin: 0;
      padding-left: 20px;
    }
    .reading {
      margin: 0;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoPicker {
  /** Added to the buttons' names where several pickers share a screen ("for the pour of 3 Mar"). */
  readonly subject = input('');
  readonly disabled = input(false);
  readonly picked = output<PickedPhoto[]>();

  protected readonly reading = signal<{ readonly done: number; readonly total: number } | null>(null);
  protected readonly refusals = signal<readonly string[]>([]);
  protected readonly readingText = computed(() => {
    const reading = this.reading();
    if (reading === null) return '';
    const at = Math.min(reading.done + 1, reading.total);
    return reading.total === 1 ? 'Reading the photo…' : `Reading photo ${at} of ${reading.total}…`;
  });
  protected readonly suffix = computed(() => (this.subject() === '' ? '' : ` ${this.subject()}`));

  constructor() {
    inject(PhotoIcons);
  }

  protected async choose(field: HTMLInputElement): Promise<void> {
    const files = Array.from(field.files ?? []);
    // Cleared, so choosing the same file again is a change too.
    field.value = '';
    if (files.length === 0) return;
    this.refusals.set([]);
    this.reading.set({ done: 0, total: files.length });
    try {
      const checks = await Promise.all(files.map((file) => checkPhoto(file)));
      const accepted = files.filter((_, index) => checks[index]?.ok);
      this.refusals.set(checks.flatMap((check) => (check.ok ? [] : [check.message])));
      if (accepted.length === 0) return;
      const times = await readTakenTimes(accepted, (done) => this.reading.set({ done, total: accepted.length }));
      this.picked.emit(accepted.map((file, index) => ({ id: v7(), file, takenAt: times[index] ?? null })));
    } finally {
      this.reading.set(null);
    }
  }
}
