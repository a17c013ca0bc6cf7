import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { BenchIcons } from '../core/bench-icons';
import { PhotoUploadQueue } from './photo-upload-queue';
import { SyncEngine } from './sync-engine';
import { SyncStatus } from './sync-status';
import { SyncStatusHarness } from './sync-status-testing';
import type { OutboxRow } from './synced-records';

/** The engine's signals, set by each spec. */
class EngineSignals {
  readonly online = signal(true);
  readonly syncing = signal(false);
  readonly waitingCount = signal(0);
  readonly rejected = signal<OutboxRow[]>([]);
  readonly sessionEnded = signal(false);
  readonly lastSyncedAt = signal<string | null>(null);
}

/** The photo uploads' counts, set by each spec. */
class PhotoCounts {
  readonly waitingCount = signal(0);
  readonly refusedCount = signal(0);
}

const REJECTED = { seq: 4, state: 'rejected', reason: { code: 'forbidden', message: 'Viewers cannot add builds.' } };

describe('SyncStatus', () => {
  let engine: EngineSignals;
  let photos: PhotoCounts;
  let chip: SyncStatusHarness;

  beforeEach(async () => {
    engine = new EngineSignals();
    photos = new PhotoCounts();
    TestBed.configureTestingModule({
      imports: [SyncStatus],
      providers: [
        provideHttpClient(),
        provideRouter([]),
        { provide: SyncEngine, useValue: engine },
        { provide: PhotoUploadQueue, useValue: photos },
      ],
    });
    TestBed.inject(BenchIcons).register();
    chip = await TestbedHarnessEnvironment.harnessForFixture(TestBed.createComponent(SyncStatus), SyncStatusHarness);
  });

  async function shown(): Promise<{ label: string; icon: string | null; attention: boolean }> {
    return { label: await chip.getLabel(), icon: await chip.getIconName(), attention: await chip.needsAttention() };
  }

  describe('what it says', () => {
    it('should say Synced, with a tick, when nothing is waiting', async () => {
      expect(await shown()).toEqual({ label: 'Synced', icon: 'done', attention: false });
    });

    it('should count the changes waiting to be sent', async () => {
      engine.waitingCount.set(3);

      expect(await shown()).toEqual({ label: '3 waiting', icon: 'timer', attention: false });
    });

    it('should say it is offline, and how much is waiting', async () => {
      engine.online.set(false);
      engine.waitingCount.set(2);

      expect(await shown()).toEqual({ label: 'Offline · 2 waiting', icon: 'offline', attention: false });

      engine.waitingCount.set(0);
      expect((await shown()).label).toBe('Offline');
    });

    it('should ask for attention when the server refused a change, even offline', async () => {
      engine.online.set(false);
      engine.waitingCount.set(1);
      engine.rejected.set([REJECTED as OutboxRow]);

      expect(await shown()).toEqual({ label: 'Needs attention', icon: 'caution', attention: true });
    });

    it('should count the photos waiting to be sent with the changes', async () => {
      engine.waitingCount.set(1);
      photos.waitingCount.set(2);

      expect(await shown()).toEqual({ label: '3 waiting', icon: 'timer', attention: false });
    });

    it('should ask for attention when the server refused a photo', async () => {
      photos.refusedCount.set(1);

      expect(await shown()).toEqual({ label: 'Needs attention', icon: 'caution', attention: true });
    });

    it('should ask for attention when the session has ended', async () => {
      engine.sessionEnded.set(true);

      expect(await shown()).toEqual({ label: 'Needs attention', icon: 'caution', attention: true });
    });
  });

  describe('for screen readers', () => {
    it('should announce a change of status politely', async () => {
      expect(await chip.getLabelLiveness()).toBe('polite');
    });

    it('should tell when it last synced, and why it needs attention', async () => {
      engine.lastSyncedAt.set(new Date(2025, 2, 1, 14, 5).toISOString());
      engine.sessionEnded.set(true);
      engine.rejected.set([REJECTED as OutboxRow, { ...REJECTED, seq: 5 } as OutboxRow]);

      expect(await chip.getDescription()).toBe(
        'Sign in again to send the changes waiting on this device. 2 changes could not be saved. ' +
          'Last synced at 14:05, 1 Mar. Opens the changes kept on this device.',
      );
    });

    it('should say how many photos could not be sent', async () => {
      photos.refusedCount.set(2);

      expect(await chip.getDescription()).toBe(
        '2 photos could not be sent. Not synced yet on this device. Opens the changes kept on this device.',
      );
    });

    it('should say when this device has not synced yet', async () => {
      expect(await chip.getDescription()).toBe('Not synced yet on this device. Opens the changes kept on this device.');
    });
  });

  it('should be at least 48 px high, to be easy to tap', async () => {
    const size = await chip.getSize();

    expect(size.height).toBeGreaterThanOrEqual(48);
    expect(size.width).toBeGreaterThanOrEqual(48);
  });

  it('should open the list of changes on this device', async () => {
    expect(await chip.getLink()).toBe('/device');
  });
});
