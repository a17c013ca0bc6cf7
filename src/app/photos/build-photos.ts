import { inject, Injectable, type Injector, type Signal } from '@angular/core';
import { BenchDb } from '../sync/bench-db';
import { liveSignalOf } from '../sync/live-signal';
import { OfflineStore } from '../sync/offline-store';
import { PhotoUploadQueue, type PhotoTarget, type PickedPhoto } from '../sync/photo-upload-queue';
import type { LocalBuild, LocalPhoto, PhotoUploadRow } from '../sync/synced-records';
import { writeChecks } from '../sync/write-checks';

/** A photo as the screens show it: its record, and its upload while the server does not hold it yet. */
export interface BuildPhoto {
  readonly photo: LocalPhoto;
  readonly upload: PhotoUploadRow | null;
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
  private readonly queue = inject(PhotoUploadQueue);

  readonly added = this.queue.added;
  readonly uploads = this.queue.uploads;
  readonly waitingCount = this.queue.waitingCount;
  readonly refusedCount = this.queue.refusedCount;

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

  /** Stores the photos and queues their upload; see `PhotoUploadQueue.add`. */
  add(
    workshopId: string,
    target: PhotoTarget,
    photos: readonly PickedPhoto[],
    alongside?: () => Promise<unknown>,
  ): Promise<void> {
    return this.queue.add(workshopId, target, photos, alongside);
  }

  async setCaption(workshopId: string, photoId: string, caption: string): Promise<void> {
    const { photoPatchSchema } = await writeChecks();
    const text = photoPatchSchema.parse({ caption }).caption ?? '';
    const { db } = this;
    await db.transaction('rw', [...db.syncedTables, db.outbox, db.photoUploads], async () => {
      const upload = await db.photoUploads.get(photoId);
      if (upload === undefined) return this.store.patch('photo', workshopId, photoId, { caption: text });
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
      if (build.coverPhotoId === photoId) await this.store.patch('build', workshopId, build.id, { coverPhotoId: null });
      if ((await db.photoUploads.get(photoId)) === undefined) return this.store.remove('photo', workshopId, photoId);
      // The server never had it; if it is arriving there now, the uploader deletes it once it has.
      await db.photoUploads.delete(photoId);
      await db.photos.delete(photoId);
    });
  }

  /** Puts the photo on the build's card, or takes the card's photo off with null. */
  async useAsCover(workshopId: string, buildId: string, photoId: string | null): Promise<void> {
    await this.store.patch('build', workshopId, buildId, { coverPhotoId: photoId });
  }

  /** Queues a refused upload again, as it is, for when what stood in its way has changed. */
  sendAgain(photoId: string): Promise<void> {
    return this.queue.sendAgain(photoId);
  }

  /** Throws away a photo that was never sent, with its upload. One being sent now is left to finish. */
  discard(photoId: string): Promise<void> {
    return this.queue.discard(photoId);
  }
}

/** When a photo was taken, or else added: what "newest first" goes by. */
export function shownAt(photo: Pick<LocalPhoto, 'takenAt' | 'createdAt'>): string {
  return photo.takenAt ?? photo.createdAt;
}
