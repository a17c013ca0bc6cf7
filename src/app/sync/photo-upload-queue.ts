import { computed, inject, Injectable } from '@angular/core';
import { Subject } from 'rxjs';
import { BenchDb } from './bench-db';
import { liveSignal } from './live-signal';
import type { LocalPhoto, PhotoUploadRow } from './synced-records';
import { writeChecks } from './write-checks';

/** A photo chosen and checked on this device, its id made already, not yet stored. */
export interface PickedPhoto {
  readonly id: string;
  readonly file: File;
  readonly takenAt: string | null;
}

/** What a photo belongs to: a build, and one of its steps or pours at most. */
export interface PhotoTarget {
  readonly buildId: string;
  readonly stepId?: string | null;
  readonly pourId?: string | null;
}

/** A waiting or refused upload with the name of the build it is for, for the list of what this device holds. */
export interface QueuedUpload {
  readonly upload: PhotoUploadRow;
  readonly buildName: string;
}

/**
 * The photos waiting on this device to go to the server: queued with a record of each, sent again after a
 * refusal, or thrown away before they went. `PhotoUploader` sends them after each push.
 */
@Injectable({ providedIn: 'root' })
export class PhotoUploadQueue {
  private readonly db = inject(BenchDb);
  private readonly queued = new Subject<string>();

  /** The workshop of each photo just queued or sent again, for the sync engine to send. */
  readonly added = this.queued.asObservable();
  /** Every upload not yet done, oldest first. */
  readonly uploads = liveSignal<QueuedUpload[]>(() => this.queuedUploads(), []);
  readonly waitingCount = computed(() => this.uploads().filter(({ upload }) => upload.state !== 'refused').length);
  readonly refusedCount = computed(() => this.uploads().filter(({ upload }) => upload.state === 'refused').length);

  /**
   * Stores the photos and queues their upload, with a record of each so the log shows them at once, in one
   * transaction; `alongside` (a step being logged with them) joins it. Throws, storing nothing, when the
   * target is not a build, step or pour id, or the device has no room.
   */
  async add(
    workshopId: string,
    target: PhotoTarget,
    photos: readonly PickedPhoto[],
    alongside?: () => Promise<unknown>,
  ): Promise<void> {
    // Loaded before the transaction, which a step logged `alongside` also writes in.
    const { photoUploadFieldsSchema } = await writeChecks();
    const fields = photoUploadFieldsSchema.parse({ ...target, caption: '' });
    const createdAt = new Date().toISOString();
    const uploads: PhotoUploadRow[] = photos.map(({ id, file, takenAt }) => ({
      ...{
        id,
        workshopId,
        blob: file,
        fileName: file.name || 'photo',
        fields: { ...fields, takenAt },
        state: 'waiting',
      },
      ...{ attempts: 0, lastError: null, bytesSent: 0, bytesTotal: file.size, createdAt },
    }));
    const records: LocalPhoto[] = photos.map(({ id, takenAt }) => ({
      ...{ id, workshopId, buildId: fields.buildId, stepId: fields.stepId, pourId: fields.pourId, caption: '' },
      ...{ takenAt, width: null, height: null, contentHash: null, uploadedBy: null },
      ...{ createdAt, updatedAt: createdAt, deletedAt: null, changeNumber: 0, pending: true },
    }));
    const { db } = this;
    await db.transaction('rw', [...db.syncedTables, db.outbox, db.photoUploads], async () => {
      await alongside?.();
      await db.photoUploads.bulkAdd(uploads);
      await db.photos.bulkAdd(records);
    });
    this.queued.next(workshopId);
  }

  /** Queues a refused upload again, as it is, for when what stood in its way has changed. */
  async sendAgain(photoId: string): Promise<void> {
    const upload = await this.db.photoUploads.get(photoId);
    if (upload?.state !== 'refused') return;
    await this.db.photoUploads.update(photoId, { state: 'waiting', lastError: null, bytesSent: 0 });
    this.queued.next(upload.workshopId);
  }

  /** Throws away a photo that was never sent, with its upload. One being sent now is left to finish. */
  async discard(photoId: string): Promise<void> {
    const { db } = this;
    await db.transaction('rw', db.photos, db.photoUploads, async () => {
      const upload = await db.photoUploads.get(photoId);
      if (upload === undefined || upload.state === 'sending') return;
      await db.photoUploads.delete(photoId);
      await db.photos.delete(photoId);
    });
  }

  private async queuedUploads(): Promise<QueuedUpload[]> {
    const uploads = await this.db.photoUploads.orderBy('createdAt').toArray();
    const builds = await this.db.builds.bulkGet([...new Set(uploads.map((upload) => upload.fields.buildId))]);
    const names = new Map(builds.filter((build) => build !== undefined).map((build) => [build.id, build.name]));
    return uploads.map((upload) => ({
      upload,
      buildName: names.get(upload.fields.buildId) ?? 'a build not on this device',
    }));
  }
}
