import { computed, inject, Injectable, type Injector, type Signal } from '@angular/core';
import { Subject } from 'rxjs';
import { BenchDb } from '../sync/bench-db';
import { liveSignal, liveSignalOf } from '../sync/live-signal';
import { OfflineStore } from '../sync/offline-store';
import type { LocalBuild, LocalPhoto, PhotoUploadRow } from '../sync/synced-records';
import { writeChecks } from '../sync/write-checks';

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

/** A photo as the screens show it: its record, and its upload while the server does not hold it yet. */
export interface BuildPhoto {
  readonly photo: LocalPhoto;
  readonly upload: PhotoUploadRow | null;
}

/** A waiting or refused upload with the name of the build it is for, for the list of what this device holds. */
export interface QueuedUpload {
  readonly upload: PhotoUploadRow;
  readonly buildName: string;
}

/**
 * The bench photos on this device: read live, added to the upload queue, captioned and deleted. A photo the
 * server does not hold yet is changed with its upload, without a change for the server; one it holds is
 * changed through the offline store like any record.
 */
@Injectable({ providedIn: 'root' })
export class BuildPhotos {
  private readonly db = inject(BenchDb);
  private readonly store = inject(OfflineStore);
  private readonly queued = new Subject<string>();

  /** The workshop of each photo just queued or sent again, for the sync engine to send. */
  readonly added = this.queued.asObservable();
  /** Every upload not yet done, oldest first. */
  readonly uploads = liveSignal<QueuedUpload[]>(() => this.queuedUploads(), []);
  readonly waitingCount = computed(() => this.uploads().filter(({ upload }) => upload.state !== 'refused').length);
  readonly refusedCount = computed(() => this.uploads().filter(({ upload }) => upload.state === 'refused').length);

  /** A build's photos, newest first, each with its upload while it has one. */
  ofBuild(buildId: Signal<string | null>, injector?: Injector): Signal<BuildPhoto[]> {
    // One query over both tables, so a photo never shows before its upload (it would ask the server for it).
    return liveSignalOf(
      buildId,
      async (id): Promise<BuildPhoto[]> => {
        if (id === null) return [];
        const photos = await this.db.photos.where('buildId').equals(id).toArray();
        const live = photos.filter((photo) => photo.deletedAt === null);
        const uploads = await this.db.photoUploads.bulkGet(live.map((photo) => photo.id));
        return live
          .map((photo, index) => ({ photo, upload: uploads[index] ?? null }))
          .sort((a, b) => shownAt(b.photo).localeCompare(shownAt(a.photo)));
      },
      [],
      injector,
    );
  }

  /** One photo with its upload; undefined until read, null once it is not on this device (or deleted). */
  one(photoId: Signal<string | null>, injector?: Injector): Signal<BuildPhoto | null | undefined> {
    return liveSignalOf(
      photoId,
      async (id): Promise<BuildPhoto | null> => {
        const photo = id === null ? undefined : await this.db.photos.get(id);
        if (photo === undefined || photo.deletedAt !== null) return null;
        return { photo, upload: (await this.db.photoUploads.get(photo.id)) ?? null };
      },
      undefined,
      injector,
    );
  }

  /** The photos of these ids that are on this device, by id. */
  byId(ids: Signal<readonly string[]>, injector?: Injector): Signal<ReadonlyMap<string, LocalPhoto>> {
    return liveSignalOf(
      ids,
      async (wanted) => {
        const found = await this.db.photos.bulkGet([...wanted]);
        return new Map(found.filter((photo) => photo !== undefined).map((photo) => [photo.id, photo]));
      },
      new Map<string, LocalPhoto>(),
      injector,
    );
  }

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

  async setCaption(workshopId: string, photoId: string, caption: string): Promise<void> {
    const { photoPatchSchema } = await writeChecks();
    const text = photoPatchSchema.parse({ caption }).caption ?? '';
    const { db } = this;
    await db.transaction('rw', [...db.syncedTables, db.outbox, db.photoUploads], async () => {
      const upload = await db.photoUploads.get(photoId);
      if (upload === undefined) return this.store.patchPhoto(workshopId, photoId, { caption: text });
      // Sent with the upload; one already under way is followed by a change once it is done.
      await db.photoUploads.update(photoId, { fields: { ...upload.fields, caption: text } });
      await db.photos.update(photoId, { caption: text, updatedAt: new Date().toISOString() });
    });
  }

  /** Takes the photo out of the build, and off its cover if it was on it. */
  async remove(workshopId: string, build: Pick<LocalBuild, 'id' | 'coverPhotoId'>, photoId: string): Promise<void> {
    const { db } = this;
    await this.store.ready();
    await db.transaction('rw', [...db.syncedTables, db.outbox, db.photoUploads], async () => {
      if (build.coverPhotoId === photoId) await this.store.patchBuild(workshopId, build.id, { coverPhotoId: null });
      if ((await db.photoUploads.get(photoId)) === undefined) return this.store.deletePhoto(workshopId, photoId);
      // The server never had it; if it is arriving there now, the uploader deletes it once it has.
      await db.photoUploads.delete(photoId);
      await db.photos.delete(photoId);
    });
  }

  /** Puts the photo on the build's card, or takes the card's photo off with null. */
  async useAsCover(workshopId: string, buildId: string, photoId: string | null): Promise<void> {
    await this.store.patchBuild(workshopId, buildId, { coverPhotoId: photoId });
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

/** When a photo was taken, or else added: what "newest first" goes by. */
export function shownAt(photo: Pick<LocalPhoto, 'takenAt' | 'createdAt'>): string {
  return photo.takenAt ?? photo.createdAt;
}
