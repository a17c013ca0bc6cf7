import { HttpBackend, HttpEventType, HttpXhrBackend, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting, type TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import type { PickedPhoto } from '../sync/photo-upload-queue';
import { PHOTO_UPLOAD_BACKEND, PhotoUploader, UPLOAD_STALL_MS } from '../sync/photo-uploader';
import type { PhotoUploadRow } from '../sync/synced-records';
import { dropDatabase, nextTask, until } from '../sync/sync-testing';
import { BuildPhotos } from './build-photos';
import { picked, pictureFile, serverPhoto } from './photos-testing';

const WORKSHOP = v7();

function refusal(code: string, message: string) {
  return { error: { code, message } };
}

describe('PhotoUploader', () => {
  let http: HttpTestingController;
  let db: BenchDb;
  let photos: BuildPhotos;
  let uploader: PhotoUploader;
  let buildId: string;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        // The testing backend in place of XMLHttpRequest: it reports upload progress the same way.
        { provide: PHOTO_UPLOAD_BACKEND, useExisting: HttpBackend },
        { provide: BENCH_DB_NAME, useValue: `photo-uploader-spec-${v7()}` },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    db = TestBed.inject(BenchDb);
    photos = TestBed.inject(BuildPhotos);
    uploader = TestBed.inject(PhotoUploader);
    buildId = await TestBed.inject(OfflineStore).create('build', WORKSHOP, {
      name: 'Harbour',
      scaleRatio: 87.1,
      status: 'building',
    });
    await db.outbox.clear();
  });
  afterEach(async () => {
    http.verify();
    await dropDatabase(db);
  });

  async function queue(
    name: string,
    more: { stepId?: string; pourId?: string } = {},
    takenAt: string | null = null,
  ): Promise<PickedPhoto> {
    const photo = picked(await pictureFile(name), takenAt);
    await photos.add(WORKSHOP, { buildId, ...more }, [photo]);
    return photo;
  }

  function nextUpload(photoId?: string): Promise<TestRequest> {
    const url = (id: string) => `/api/workshops/${WORKSHOP}/photos/${id}`;
    return until(
      () =>
        http.match((request) => request.method === 'PUT' && (photoId === undefined || request.url === url(photoId)))[0],
      `an upload${photoId === undefined ? '' : ' of ' + photoId}`,
    );
  }

  /** The upload row once `test` holds for it: the progress is written as the bytes go, not awaited. */
  async function rowWhen(id: string, test: (row: PhotoUploadRow) => boolean): Promise<PhotoUploadRow> {
    const giveUpAt = performance.now() + 4_500;
    for (;;) {
      const row = await db.photoUploads.get(id);
      if (row !== undefined && test(row)) return row;
      if (performance.now() > giveUpAt) throw new Error(`Gave up waiting on the upload of ${id}`);
      await nextTask();
    }
  }

  describe('when the server takes the photo', () => {
    it('should send its bytes and fields under its own id, with credentials, and drop the upload', async () => {
      const pourId = v7();
      const photo = await queue('riverbed.jpg', { pourId }, '2025-03-01T09:30:00.000Z');

      const sent = uploader.send(WORKSHOP);
      const upload = await nextUpload(photo.id);
      const body = upload.request.body as FormData;
      const file = body.get('photo') as File;

      expect(upload.request.method).toBe('PUT');
      expect(upload.request.withCredentials).toBeTrue();
      expect(upload.request.reportProgress).toBeTrue();
      expect(file.name).toBe('riverbed.jpg');
      expect(new Uint8Array(await file.arrayBuffer())).toEqual(new Uint8Array(await photo.file.arrayBuffer()));
      expect(['buildId', 'stepId', 'pourId', 'caption', 'takenAt'].map((field) => body.get(field))).toEqual([
        buildId,
        '',
        pourId,
        '',
        '2025-03-01T09:30:00.000Z',
      ]);
      upload.flush(serverPhoto(WORKSHOP, photo.id, buildId, 7, { pourId }), { status: 201, statusText: 'Created' });

      expect(await sent).toBeNull();
      expect(await db.photoUploads.get(photo.id)).toBeUndefined();
      // Shown from the server's copies from now on; its record comes with the next pull.
      expect((await db.photos.get(photo.id))?.pending).toBeTrue();
      expect(await db.outbox.count()).toBe(0);
    });

    it('should take a 200, the same photo already held, as done', async () => {
      const photo = await queue('again.jpg');

      const sent = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).flush(serverPhoto(WORKSHOP, photo.id, buildId, 7), {
        status: 200,
        statusText: 'OK',
      });

      expect(await sent).toBeNull();
      expect(await db.photoUploads.count()).toBe(0);
    });

    it('should keep how much has gone as it goes', async () => {
      const photo = await queue('progress.jpg');

      const sent = uploader.send(WORKSHOP);
      const upload = await nextUpload(photo.id);
      expect(await db.photoUploads.get(photo.id)).toEqual(
        jasmine.objectContaining({ state: 'sending', attempts: 1, bytesSent: 0 }),
      );
      upload.event({ type: HttpEventType.UploadProgress, loaded: 500, total: 2000 });
      const row = await rowWhen(photo.id, (upload) => upload.bytesSent === 500);
      upload.flush(serverPhoto(WORKSHOP, photo.id, buildId, 7), { status: 201, statusText: 'Created' });
      await sent;

      expect(row).toEqual(jasmine.objectContaining({ state: 'sending', bytesSent: 500, bytesTotal: 2000 }));
    });

    it('should send one at a time, those tried least first', async () => {
      const tried = await queue('tried.jpg');
      const fresh = await queue('fresh.jpg');
      await db.photoUploads.update(tried.id, { attempts: 2 });

      const sent = uploader.send(WORKSHOP);
      const first = await nextUpload();
      expect(first.request.url).toContain(fresh.id);
      expect(http.match((request) => request.method === 'PUT').length).toBe(0);
      first.flush(serverPhoto(WORKSHOP, fresh.id, buildId, 7), { status: 201, statusText: 'Created' });
      (await nextUpload(tried.id)).flush(serverPhoto(WORKSHOP, tried.id, buildId, 8), {
        status: 201,
        statusText: 'Created',
      });

      expect(await sent).toBeNull();
      expect(await db.photoUploads.count()).toBe(0);
    });

    it('should follow with a caption change made while the photo was on its way', async () => {
      const photo = await queue('caption.jpg');

      const sent = uploader.send(WORKSHOP);
      const upload = await nextUpload(photo.id);
      await photos.setCaption(WORKSHOP, photo.id, 'Mud flats at low tide');
      upload.flush(serverPhoto(WORKSHOP, photo.id, buildId, 7), { status: 201, statusText: 'Created' });
      await sent;

      const mutations = (await db.outbox.toArray()).map((row) => row.mutation);
      expect(mutations).toEqual([
        jasmine.objectContaining({
          type: 'photo.patch',
          recordId: photo.id,
          data: { caption: 'Mud flats at low tide' },
        }),
      ]);
    });

    it('should follow with a deletion when the photo was removed while on its way', async () => {
      const photo = await queue('removed.jpg');

      const sent = uploader.send(WORKSHOP);
      const upload = await nextUpload(photo.id);
      await photos.remove(WORKSHOP, { id: buildId, coverPhotoId: null }, photo.id);
      upload.flush(serverPhoto(WORKSHOP, photo.id, buildId, 7), { status: 201, statusText: 'Created' });
      await sent;

      const mutations = (await db.outbox.toArray()).map((row) => row.mutation);
      expect(mutations).toEqual([jasmine.objectContaining({ type: 'photo.delete', recordId: photo.id })]);
      expect(await db.photos.get(photo.id)).toBeUndefined();
    });
  });

  describe('when the server refuses the photo', () => {
    const refusals = [
      [413, 'photo_too_large', 'This photo is 31 MB; photos can be at most 25 MB.'],
      [415, 'not_a_photo', 'HEIC photos cannot be read yet. Choose a JPEG copy.'],
      [422, 'photo_unreadable', 'This photo could not be read.'],
      [422, 'build_missing', 'The build of this photo is not in the workshop.'],
      [409, 'photo_conflict', 'Another photo is stored under this id.'],
      [400, 'invalid', 'A photo belongs to a step or to a pour, not both.'],
      [403, 'forbidden', 'Viewers cannot add photos.'],
      [404, 'workshop_unknown', 'There is no such workshop.'],
    ] as const;
    for (const [status, code, message] of refusals) {
      it(`should keep it as refused after a ${status} ${code}, with the server's words, and not send it again`, async () => {
        const photo = await queue(`${code}.jpg`);
        const next = await queue('next.jpg');

        const sent = uploader.send(WORKSHOP);
        (await nextUpload(photo.id)).flush(refusal(code, message), { status, statusText: 'Refused' });
        // A refusal does not hold back the photos after it.
        (await nextUpload(next.id)).flush(serverPhoto(WORKSHOP, next.id, buildId, 7), {
          status: 201,
          statusText: 'Created',
        });

        expect(await sent).toBeNull();
        expect(await db.photoUploads.get(photo.id)).toEqual(
          jasmine.objectContaining({ state: 'refused', attempts: 1, lastError: { code, message, status } }),
        );
        expect(await db.photos.get(photo.id)).toBeDefined();
        expect(await uploader.send(WORKSHOP)).toBeNull();
        http.expectNone((request) => request.method === 'PUT');
      });
    }

    it('should say why in its own words when the refusal carries none (from a proxy in front of the server)', async () => {
      const photo = await queue('proxy.jpg');

      const sent = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).flush('<html>413 Request Entity Too Large</html>', {
        status: 413,
        statusText: 'Request Entity Too Large',
      });
      await sent;

      expect((await db.photoUploads.get(photo.id))?.lastError).toEqual({
        code: 'unexpected',
        message: 'This photo is larger than the server takes.',
        status: 413,
      });
    });

    it('should refuse every photo waiting for a workshop the account is no longer in', async () => {
      const photo = await queue('left.jpg');

      await uploader.refuseAll(WORKSHOP);

      expect(await db.photoUploads.get(photo.id)).toEqual(
        jasmine.objectContaining({ state: 'refused', lastError: jasmine.objectContaining({ status: 404 }) }),
      );
    });
  });

  describe('when the photo could not go', () => {
    it('should keep it waiting after a 503, give back what stopped it, and send it again under the same id', async () => {
      const photo = await queue('busy.jpg');
      const busy = refusal('unavailable', 'The server is busy. Try again in a moment.');

      const sent = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).flush(busy, { status: 503, statusText: 'Service Unavailable' });
      const failure = await sent;

      expect(failure).toEqual(jasmine.objectContaining({ status: 503 }));
      expect(await db.photoUploads.get(photo.id)).toEqual(
        jasmine.objectContaining({
          state: 'waiting',
          attempts: 1,
          lastError: { code: 'unavailable', message: busy.error.message, status: 503 },
        }),
      );

      const again = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).flush(serverPhoto(WORKSHOP, photo.id, buildId, 7), {
        status: 200,
        statusText: 'OK',
      });
      expect(await again).toBeNull();
    });

    it('should keep it waiting when the connection drops, and stop there', async () => {
      const photo = await queue('offline.jpg');
      await queue('after.jpg');

      const sent = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).error(new ProgressEvent('error'));

      expect(await sent).toEqual(jasmine.objectContaining({ status: 0 }));
      expect((await db.photoUploads.toArray()).map((row) => row.state)).toEqual(['waiting', 'waiting']);
      expect((await db.photoUploads.get(photo.id))?.lastError?.message).toBe(
        'No connection, so nothing was sent. Try again when you are online.',
      );
    });

    it('should throw when the session ended, keeping the photo waiting', async () => {
      const photo = await queue('signed-out.jpg');

      const sent = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).flush(refusal('signed_out', 'You are signed out.'), {
        status: 401,
        statusText: 'Unauthorized',
      });

      await expectAsync(sent).toBeRejectedWith(jasmine.objectContaining({ status: 401 }));
      expect((await db.photoUploads.get(photo.id))?.state).toBe('waiting');
    });

    it('should put back a photo left as being sent by a tab that closed', async () => {
      const photo = await queue('left-sending.jpg');
      await db.photoUploads.update(photo.id, { state: 'sending', attempts: 1 });

      const sent = uploader.send(WORKSHOP);
      (await nextUpload(photo.id)).flush(serverPhoto(WORKSHOP, photo.id, buildId, 7), {
        status: 201,
        statusText: 'Created',
      });

      expect(await sent).toBeNull();
    });

    describe('when an upload stalls', () => {
      beforeEach(() => jasmine.clock().install());
      afterEach(() => jasmine.clock().uninstall());

      it('should give it up after a minute without progress and keep it waiting', async () => {
        const photo = await queue('stalled.jpg');

        const sent = uploader.send(WORKSHOP);
        const upload = await nextUpload(photo.id);
        jasmine.clock().tick(UPLOAD_STALL_MS - 1_000);
        upload.event({ type: HttpEventType.UploadProgress, loaded: 10, total: 2000 });
        jasmine.clock().tick(UPLOAD_STALL_MS - 1_000);
        expect(upload.cancelled).toBeFalse();
        jasmine.clock().tick(1_000);

        expect(await sent).toEqual(jasmine.objectContaining({ status: 0 }));
        expect(upload.cancelled).toBeTrue();
        expect((await db.photoUploads.get(photo.id))?.state).toBe('waiting');
      });
    });
  });

  it('should send through XMLHttpRequest unless told otherwise, for its progress events', () => {
    TestBed.resetTestingModule();
    TestBed.configureTestingModule({ providers: [provideHttpClient()] });

    expect(TestBed.inject(PHOTO_UPLOAD_BACKEND)).toBeInstanceOf(HttpXhrBackend);
  });
});
