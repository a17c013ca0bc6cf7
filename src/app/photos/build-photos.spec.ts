import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildPhotos } from './build-photos';
import { picked, pictureFile } from './photos-testing';

const WORKSHOP = v7();

describe('BuildPhotos', () => {
  let db: BenchDb;
  let photos: BuildPhotos;
  let store: OfflineStore;
  let buildId: string;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [{ provide: BENCH_DB_NAME, useValue: `build-photos-spec-${v7()}` }] });
    db = TestBed.inject(BenchDb);
    photos = TestBed.inject(BuildPhotos);
    store = TestBed.inject(OfflineStore);
    buildId = await store.create('build', WORKSHOP, { name: 'Harbour', scaleRatio: 87.1, status: 'building' });
    await db.outbox.clear();
  });
  afterEach(async () => {
    await dropDatabase(db);
  });

  /** As if the server held the photo: its record pulled, no upload left. */
  async function sentPhoto(caption = ''): Promise<string> {
    const photo = picked(await pictureFile('sent.jpg'));
    await photos.add(WORKSHOP, { buildId }, [photo]);
    await db.photoUploads.delete(photo.id);
    await db.photos.update(photo.id, { caption, changeNumber: 4, pending: undefined });
    return photo.id;
  }

  describe('adding photos', () => {
    it('should store each photo’s bytes and upload with a record of it, so the log shows it at once', async () => {
      const file = await pictureFile('riverbed.jpg');
      const photo = picked(file, '2025-03-01T09:30:00.000Z');
      const stepId = v7();
      const queued: string[] = [];
      photos.added.subscribe((workshopId) => queued.push(workshopId));

      await photos.add(WORKSHOP, { buildId, stepId }, [photo]);

      const upload = await db.photoUploads.get(photo.id);
      expect(upload).toEqual(
        jasmine.objectContaining({
          id: photo.id,
          workshopId: WORKSHOP,
          fileName: 'riverbed.jpg',
          fields: { buildId, stepId, pourId: null, caption: '', takenAt: '2025-03-01T09:30:00.000Z' },
          state: 'waiting',
          attempts: 0,
          lastError: null,
          bytesSent: 0,
          bytesTotal: file.size,
        }),
      );
      expect(new Uint8Array(await upload!.blob.arrayBuffer())).toEqual(new Uint8Array(await file.arrayBuffer()));
      expect(await db.photos.get(photo.id)).toEqual(
        jasmine.objectContaining({
          workshopId: WORKSHOP,
          buildId,
          stepId,
          pourId: null,
          caption: '',
          takenAt: '2025-03-01T09:30:00.000Z',
          deletedAt: null,
          changeNumber: 0,
          pending: true,
        }),
      );
      expect(await db.outbox.count()).toBe(0);
      expect(queued).toEqual([WORKSHOP]);
    });

    it('should store neither the uploads nor the records when one write of the transaction fails', async () => {
      // A photo the server already holds: its record stays, its upload is gone.
      const taken = await sentPhoto();
      const first = picked(await pictureFile('first.jpg'));
      const clash = picked(await pictureFile('second.jpg'), null, taken);

      await expectAsync(photos.add(WORKSHOP, { buildId }, [first, clash])).toBeRejected();

      expect(await db.photoUploads.count()).toBe(0);
      expect(await db.photos.get(first.id)).toBeUndefined();
      expect((await db.photos.get(taken))?.changeNumber).toBe(4);
    });

    it('should store the step logged with the photos in the same transaction, and neither if that fails', async () => {
      const photo = picked(await pictureFile('gloss.jpg'));
      const stepId = v7();
      const logStep = () =>
        store.create('step', WORKSHOP, {
          id: stepId,
          buildId,
          kind: 'painting',
          title: 'Gloss',
          happenedAt: new Date().toISOString(),
        });

      await expectAsync(
        photos.add(WORKSHOP, { buildId, stepId }, [photo], async () => {
          await logStep();
          throw new Error('The device ran out of space');
        }),
      ).toBeRejectedWithError('The device ran out of space');
      expect(await db.steps.get(stepId)).toBeUndefined();
      expect(await db.outbox.count()).toBe(0);
      expect(await db.photoUploads.count()).toBe(0);

      await photos.add(WORKSHOP, { buildId, stepId }, [photo], logStep);

      expect((await db.steps.get(stepId))?.title).toBe('Gloss');
      expect((await db.photos.get(photo.id))?.stepId).toBe(stepId);
    });

    it('should refuse a photo for both a step and a pour, storing nothing', async () => {
      const photo = picked(await pictureFile('both.jpg'));

      await expectAsync(photos.add(WORKSHOP, { buildId, stepId: v7(), pourId: v7() }, [photo])).toBeRejected();

      expect(await db.photoUploads.count()).toBe(0);
    });
  });

  describe('a build’s photos', () => {
    it('should list them newest first by when they were taken, each with its upload while it has one', async () => {
      const older = picked(await pictureFile('older.jpg'), '2025-03-01T09:00:00.000Z');
      const newer = picked(await pictureFile('newer.jpg'), '2025-03-02T09:00:00.000Z');
      await photos.add(WORKSHOP, { buildId }, [older, newer]);
      const sent = await sentPhoto();
      await db.photos.update(sent, { takenAt: '2025-02-01T09:00:00.000Z' });
      await photos.add(WORKSHOP, { buildId: v7() }, [picked(await pictureFile('elsewhere.jpg'))]);

      const list = TestBed.runInInjectionContext(() => photos.ofBuild(signal(buildId)));

      await until(() => list().length === 3, 'the three photos');
      expect(list().map(({ photo }) => photo.id)).toEqual([newer.id, older.id, sent]);
      expect(list()[0]?.upload?.fileName).toBe('newer.jpg');
    });
  });

  describe('captions', () => {
    it('should send the caption of a photo not sent yet with its upload, queueing no change', async () => {
      const photo = picked(await pictureFile('jetty.jpg'));
      await photos.add(WORKSHOP, { buildId }, [photo]);

      await photos.setCaption(WORKSHOP, photo.id, '  Jetty before weathering ');

      expect((await db.photoUploads.get(photo.id))?.fields.caption).toBe('Jetty before weathering');
      expect((await db.photos.get(photo.id))?.caption).toBe('Jetty before weathering');
      expect(await db.outbox.count()).toBe(0);
    });

    it('should change the caption of a photo the server holds through a queued change', async () => {
      const id = await sentPhoto('Old words');

      await photos.setCaption(WORKSHOP, id, 'Second layer, still tacky');

      const [row] = await db.outbox.toArray();
      expect(row?.mutation).toEqual({
        type: 'photo.patch',
        mutationId: row!.mutationId,
        recordId: id,
        data: { caption: 'Second layer, still tacky' },
      });
      expect(row?.undo).toEqual([{ table: 'photos', id, restore: { caption: 'Old words' } }]);
      expect((await db.photos.get(id))?.caption).toBe('Second layer, still tacky');
    });

    it('should refuse a caption over 500 characters, changing nothing', async () => {
      const id = await sentPhoto('Kept');

      await expectAsync(photos.setCaption(WORKSHOP, id, 'x'.repeat(501))).toBeRejected();

      expect((await db.photos.get(id))?.caption).toBe('Kept');
      expect(await db.outbox.count()).toBe(0);
    });
  });

  describe('removing photos', () => {
    it('should drop a photo never sent with its upload, with nothing for the server', async () => {
      const photo = picked(await pictureFile('blurred.jpg'));
      await photos.add(WORKSHOP, { buildId }, [photo]);

      await photos.remove(WORKSHOP, { id: buildId, coverPhotoId: null }, photo.id);

      expect(await db.photos.get(photo.id)).toBeUndefined();
      expect(await db.photoUploads.get(photo.id)).toBeUndefined();
      expect(await db.outbox.count()).toBe(0);
    });

    it('should delete a photo the server holds through a queued change, and take it off the cover', async () => {
      const id = await sentPhoto();
      await photos.useAsCover(WORKSHOP, buildId, id);
      expect((await db.builds.get(buildId))?.coverPhotoId).toBe(id);

      await photos.remove(WORKSHOP, { id: buildId, coverPhotoId: id }, id);

      const types = (await db.outbox.toArray()).map((row) => row.mutation.type);
      expect(types).toEqual(['build.patch', 'build.patch', 'photo.delete']);
      expect((await db.builds.get(buildId))?.coverPhotoId).toBeNull();
      expect((await db.photos.get(id))?.deletedAt).toEqual(jasmine.any(String));
    });
  });

  describe('uploads the server refused', () => {
    async function refusedPhoto(): Promise<string> {
      const photo = picked(await pictureFile('refused.jpg'));
      await photos.add(WORKSHOP, { buildId }, [photo]);
      const lastError = { code: 'forbidden', message: 'Viewers cannot add photos.', status: 403 };
      await db.photoUploads.update(photo.id, { state: 'refused', lastError, attempts: 1 });
      return photo.id;
    }

    it('should queue one again as it is when sent again, and say so to the engine', async () => {
      const id = await refusedPhoto();
      const queued: string[] = [];
      photos.added.subscribe((workshopId) => queued.push(workshopId));

      await photos.sendAgain(id);

      expect(await db.photoUploads.get(id)).toEqual(
        jasmine.objectContaining({ id, state: 'waiting', lastError: null, attempts: 1 }),
      );
      expect(queued).toEqual([WORKSHOP]);
    });

    it('should discard one with its record, but leave a photo being sent to finish', async () => {
      const id = await refusedPhoto();
      const sending = picked(await pictureFile('sending.jpg'));
      await photos.add(WORKSHOP, { buildId }, [sending]);
      await db.photoUploads.update(sending.id, { state: 'sending' });

      await photos.discard(id);
      await photos.discard(sending.id);

      expect(await db.photoUploads.get(id)).toBeUndefined();
      expect(await db.photos.get(id)).toBeUndefined();
      expect(await db.photoUploads.get(sending.id)).toBeDefined();
    });

    it('should count what waits and what was refused', async () => {
      await refusedPhoto();
      await photos.add(WORKSHOP, { buildId }, [picked(await pictureFile('a.jpg')), picked(await pictureFile('b.jpg'))]);

      await until(() => photos.uploads().length === 3, 'the three uploads');

      expect(photos.waitingCount()).toBe(2);
      expect(photos.refusedCount()).toBe(1);
      expect(photos.uploads().map(({ buildName }) => buildName)).toEqual(['Harbour', 'Harbour', 'Harbour']);
    });
  });
});
