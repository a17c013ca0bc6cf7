import { HttpBackend, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Mutation, SessionView } from '@benchtide/shared';
import { v7 } from 'uuid';
import { AccountSession } from '../core/account-session';
import { picked, pictureFile, serverPhoto } from '../photos/photos-testing';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { fixesFor } from './change-fixes';
import { OfflineStore } from './offline-store';
import { NOT_A_MEMBER } from './outbox-push';
import { PhotoUploadQueue } from './photo-upload-queue';
import { PHOTO_UPLOAD_BACKEND } from './photo-uploader';
import { retryDelayMs } from './retry-delay';
import { SYNC_EVERY_MS, SyncEngine } from './sync-engine';
import { dropDatabase, NOTHING_NEW, serverBuild, SyncServer, until } from './sync-testing';

const WORKSHOP = v7();
// Made after WORKSHOP, so its id sorts after it and it syncs second.
const OTHER_WORKSHOP = v7();
const SESSION: SessionView = {
  account: { id: v7(), email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [{ id: WORKSHOP, name: 'River Club', personal: false, role: 'owner', memberCount: 2 }],
};
const BUSY = { error: { code: 'unavailable', message: 'The server is busy. Try again in a moment.' } };
const SIGNED_OUT = { error: { code: 'signed_out', message: 'You are signed out.' } };
const REFUSED = { code: 'forbidden', message: 'Viewers cannot add builds.' };
const STOCK_SHORT = { code: 'stock_short', message: 'The shelf holds 5 g of part A; this pour needs 9.9 g.' };

describe('SyncEngine', () => {
  let http: HttpTestingController;
  let server: SyncServer;
  let db: BenchDb;
  let engine: SyncEngine;

  beforeEach(() => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: BENCH_DB_NAME, useValue: `sync-engine-spec-${v7()}` },
        { provide: PHOTO_UPLOAD_BACKEND, useExisting: HttpBackend },
      ],
    });
    TestBed.inject(AccountSession).keep(SESSION);
    http = TestBed.inject(HttpTestingController);
    server = new SyncServer(http);
    db = TestBed.inject(BenchDb);
    engine = TestBed.inject(SyncEngine);
  });
  afterEach(async () => {
    await until(() => !engine.syncing(), 'the last sync to end');
    http.verify();
    await dropDatabase(db);
    localStorage.clear();
  });

  const createBuild = () =>
    TestBed.inject(OfflineStore).create('build', WORKSHOP, { name: 'Harbour', scaleRatio: 87, status: 'planning' });

  it('should push the outbox, then pull, and show when it last synced', async () => {
    const id = await createBuild();
    await until(() => engine.waitingCount() === 1, 'the change to count as waiting');

    const synced = engine.syncNow();
    server.answer(await server.nextPush());
    const changes = [{ entity: 'build', changeNumber: 1, record: serverBuild(WORKSHOP, id, 1) }];
    (await server.nextPull(WORKSHOP, 0)).flush({ startOver: false, changes, cursor: 1, more: false });
    await synced;

    expect(await db.outbox.count()).toBe(0);
    expect((await db.builds.get(id))?.pending).toBeUndefined();
    expect(engine.lastError()).toBeNull();
    await until(() => engine.waitingCount() === 0, 'nothing waiting');
    await until(() => engine.lastSyncedAt(), 'the time of the sync');
    expect(engine.lastSyncedAt()).toBe((await db.syncState.get(WORKSHOP))?.lastSyncedAt ?? 'missing');
  });

  it('should run once more after the sync under way, for a change made meanwhile', async () => {
    const synced = engine.syncNow();
    const pull = await server.nextPull();
    await createBuild();
    const again = engine.syncNow();
    pull.flush(NOTHING_NEW);
    await synced;

    await server.acceptAll();
    await again;

    expect(await db.outbox.count()).toBe(0);
  });

  describe('when a sync fails', () => {
    beforeEach(() => jasmine.clock().install());
    afterEach(() => jasmine.clock().uninstall());

    it('should keep the outbox after a 503, say why, and try again on its own a little later', async () => {
      await createBuild();

      const synced = engine.syncNow();
      (await server.nextPush()).flush(BUSY, { status: 503, statusText: 'Service Unavailable' });
      await synced;

      expect(engine.lastError()).toBe(BUSY.error.message);
      expect((await db.syncState.get(WORKSHOP))?.lastError).toBe(BUSY.error.message);
      expect((await db.outbox.toArray()).map((row) => row.state)).toEqual(['waiting']);
      http.expectNone((request) => request.url === '/api/sync/pull');
      jasmine.clock().tick(retryDelayMs(1, () => 0) - 1);
      expect(engine.syncing()).toBeFalse();
      jasmine.clock().tick(retryDelayMs(1, () => 1) - retryDelayMs(1, () => 0) + 1);
      expect(engine.syncing()).toBeTrue();
      await server.acceptAll();
      await until(() => engine.lastError() === null, 'the retry to go through');
      expect(await db.outbox.count()).toBe(0);
    });

    it('should treat a dropped connection like a busy server', async () => {
      await createBuild();

      const synced = engine.syncNow();
      (await server.nextPush()).error(new ProgressEvent('error'));
      await synced;

      expect(engine.lastError()).toContain('No connection');
      expect(await db.outbox.count()).toBe(1);
      jasmine.clock().tick(retryDelayMs(1, () => 1));
      await server.acceptAll();
      await until(() => engine.lastError() === null, 'the retry to go through');
    });

    it('should wait at least as long as a busy server asks before trying again', async () => {
      await createBuild();

      const synced = engine.syncNow();
      const busy = { error: { ...BUSY.error, retryAfterMinutes: 1 } };
      (await server.nextPush()).flush(busy, { status: 503, statusText: 'Service Unavailable' });
      await synced;

      // The growing wait after a first failure is at most 5 s; the server asked for a minute.
      jasmine.clock().tick(retryDelayMs(1, () => 1));
      expect(engine.syncing()).toBeFalse();
      jasmine.clock().tick(60_000 - retryDelayMs(1, () => 1) - 1);
      expect(engine.syncing()).toBeFalse();
      jasmine.clock().tick(1);
      expect(engine.syncing()).toBeTrue();
      await server.acceptAll();
      await until(() => engine.lastError() === null, 'the retry to go through');
    });

    it('should keep the outbox on a 401, tell the app the session ended, and not retry until signed in again', async () => {
      await createBuild();
      const session = TestBed.inject(AccountSession);

      const synced = engine.syncNow();
      (await server.nextPush()).flush(SIGNED_OUT, { status: 401, statusText: 'Unauthorized' });
      const asked = await until(() => http.match('/api/account')[0], 'the app to ask who is signed in');
      asked.flush(SIGNED_OUT, { status: 401, statusText: 'Unauthorized' });
      await synced;

      expect(session.signedIn()).toBeFalse();
      expect(engine.sessionEnded()).toBeTrue();
      expect(engine.lastError()).toContain('Sign in again');
      expect(await db.outbox.count()).toBe(1);
      jasmine.clock().tick(5 * 60_000);
      expect(engine.syncing()).toBeFalse();
      await engine.syncNow();
      http.expectNone('/api/sync/push');

      session.keep(SESSION);
      const again = engine.syncNow();
      server.answer(await server.nextPush());
      expect(await until(() => !engine.sessionEnded(), 'the session to count as back')).toBeTrue();
      (await server.nextPull()).flush(NOTHING_NEW);
      await again;
      expect(await db.outbox.count()).toBe(0);
    });
  });

  describe('when the account is no longer a member of a workshop', () => {
    const BOTH: SessionView = {
      ...SESSION,
      workshops: [...SESSION.workshops, { ...SESSION.workshops[0]!, id: OTHER_WORKSHOP, name: 'Quarry Club' }],
    };
    const UNKNOWN = { error: { code: 'workshop_unknown', message: 'You are not a member of this workshop.' } };

    beforeEach(() => jasmine.clock().install());
    afterEach(() => jasmine.clock().uninstall());

    it('should show its waiting changes as refused, still sync the others, and not keep trying', async () => {
      const session = TestBed.inject(AccountSession);
      session.keep(BOTH);
      const store = TestBed.inject(OfflineStore);
      await createBuild();
      await createBuild();
      await store.create('build', OTHER_WORKSHOP, { name: 'Quarry', scaleRatio: 35, status: 'planning' });

      const synced = engine.syncNow();
      (await server.nextPush(WORKSHOP)).flush(UNKNOWN, { status: 404, statusText: 'Not Found' });
      server.answer(await server.nextPush(OTHER_WORKSHOP));
      (await server.nextPull(OTHER_WORKSHOP, 0)).flush(NOTHING_NEW);
      // The account's workshops are asked for again, so the one it left drops out of the list.
      (await until(() => http.match('/api/account')[0], 'the workshops to be asked for')).flush({
        ...SESSION,
        workshops: [BOTH.workshops[1]],
      });
      await synced;

      expect(engine.lastError()).toBeNull();
      expect(session.workshops().map((workshop) => workshop.id)).toEqual([OTHER_WORKSHOP]);
      const rejected = await db.outbox.where('state').equals('rejected').toArray();
      expect(rejected.map((row) => [row.workshopId, row.reason])).toEqual([
        [WORKSHOP, NOT_A_MEMBER],
        [WORKSHOP, NOT_A_MEMBER],
      ]);
      jasmine.clock().tick(5 * 60_000 - 1);
      expect(engine.syncing()).toBeFalse();
    });
  });

  describe('syncing on its own', () => {
    beforeEach(async () => {
      jasmine.clock().install();
      engine.start();
      jasmine.clock().tick(0);
      (await server.nextPull()).flush(NOTHING_NEW);
      await until(() => !engine.syncing(), 'the first sync to end');
    });
    afterEach(() => jasmine.clock().uninstall());

    it('should sync on start and again every three minutes', async () => {
      jasmine.clock().tick(SYNC_EVERY_MS - 1);
      expect(engine.syncing()).toBeFalse();
      jasmine.clock().tick(1);
      expect(engine.syncing()).toBeTrue();

      (await server.nextPull()).flush(NOTHING_NEW);
    });

    it('should sync when the connection comes back', async () => {
      window.dispatchEvent(new Event('online'));

      expect(engine.syncing()).toBeTrue();
      (await server.nextPull()).flush(NOTHING_NEW);
    });

    it('should push a change as soon as it is made', async () => {
      await createBuild();

      await server.acceptAll();
      await until(() => engine.waitingCount() === 0, 'the change to be sent');
    });
  });

  describe('one tab at a time', () => {
    it('should sync holding the Web Lock', async () => {
      const request = spyOn(navigator.locks, 'request').and.callThrough();

      const synced = engine.syncNow();
      (await server.nextPull()).flush(NOTHING_NEW);
      await synced;

      expect(request).toHaveBeenCalledTimes(1);
      expect(request.calls.first().args[0]).toBe('benchtide-sync');
    });

    it('should still sync in a browser without Web Locks', async () => {
      spyOnProperty(navigator, 'locks', 'get').and.returnValue(undefined as unknown as LockManager);

      const synced = engine.syncNow();
      (await server.nextPull()).flush(NOTHING_NEW);
      await synced;

      expect(engine.lastError()).toBeNull();
    });
  });

  it('should list the changes waiting to be sent, oldest first, without the refused ones', async () => {
    const ids = [await createBuild(), await createBuild(), await createBuild()];
    await until(() => engine.waiting().length === 3, 'three waiting changes');
    const rows = engine.waiting();
    expect(rows.map((row) => (row.mutation as { data: { id: string } }).data.id)).toEqual(ids);

    await db.outbox.update(rows[1]!.seq, { state: 'rejected', reason: REFUSED });

    await until(() => engine.waiting().length === 2, 'the refused change to leave the list');
    expect(engine.waiting().map((row) => row.seq)).toEqual([rows[0]!.seq, rows[2]!.seq]);
    expect(engine.rejected().map((row) => row.seq)).toEqual([rows[1]!.seq]);
  });

  describe('rejected changes', () => {
    async function rejectFirst(): Promise<number> {
      const synced = engine.syncNow();
      server.answer(await server.nextPush(), REFUSED, [0]);
      (await server.nextPull()).flush(NOTHING_NEW);
      await synced;
      const rejected = await until(() => engine.rejected()[0], 'the rejected change');
      expect(rejected.reason).toEqual(REFUSED);
      await until(
        () => !engine.waiting().some((row) => row.seq === rejected.seq),
        'the refused change to stop waiting',
      );
      return rejected.seq;
    }

    it('should send a rejected change again when retried, under a new id as the server keeps its refusal', async () => {
      await createBuild();
      const seq = await rejectFirst();
      const refused = await db.outbox.get(seq);

      await engine.retry(seq);

      const retried = await db.outbox.get(seq);
      expect(retried?.state).toBe('waiting');
      expect(retried?.reason).toBeUndefined();
      expect(retried?.mutationId).not.toBe(refused?.mutationId ?? '');
      expect(retried?.mutation).toEqual({ ...refused!.mutation, mutationId: retried!.mutationId });
      const push = await server.nextPush();
      expect(push.request.body.mutations).toEqual([retried?.mutation]);
      server.answer(push);
      (await server.nextPull()).flush(NOTHING_NEW);
      await until(() => engine.rejected().length === 0 && engine.waitingCount() === 0, 'the retried change to go');
    });

    it('should send a pour refused for short stock again noting the shortfall, when the modeller picks that fix', async () => {
      const mutation: Mutation = {
        type: 'pour.create',
        mutationId: v7(),
        data: {
          id: v7(),
          buildId: v7(),
          materialId: v7(),
          shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
          depthMm: 4,
          roomTempC: 20,
          startAt: '2025-03-01T10:00:00Z',
          whenShort: 'refuse',
        },
      };
      const queuedAt = new Date().toISOString();
      const row = { mutationId: mutation.mutationId, workshopId: WORKSHOP, mutation, queuedAt, attempts: 1, undo: [] };
      const seq = await db.outbox.add({ ...row, state: 'rejected', reason: STOCK_SHORT });
      const refused = await until(() => engine.rejected()[0], 'the refused pour');
      const [fix] = fixesFor(refused);

      await engine.retryWith(seq, fix!);

      const push = await server.nextPush();
      const [sent] = push.request.body.mutations as Mutation[];
      expect(sent?.mutationId).not.toBe(mutation.mutationId);
      expect(sent).toEqual({
        ...mutation,
        mutationId: sent!.mutationId,
        data: { ...mutation.data, whenShort: 'record-shortfall' },
      });
      server.answer(push);
      (await server.nextPull()).flush(NOTHING_NEW);
      await until(() => engine.rejected().length === 0 && engine.waitingCount() === 0, 'the fixed pour to go');
    });

    it('should refuse a fix the rejected change does not offer, leaving it as it was', async () => {
      await createBuild();
      const seq = await rejectFirst();
      const fix = { kind: 'record-shortfall', label: 'Log it anyway' } as const;

      await expectAsync(engine.retryWith(seq, fix)).toBeRejectedWithError(/does not apply to this change/);

      expect((await db.outbox.get(seq))?.state).toBe('rejected');
    });

    it('should remove a discarded creation and its record', async () => {
      const id = await createBuild();
      const seq = await rejectFirst();

      await engine.discard(seq);

      expect(await db.builds.get(id)).toBeUndefined();
      await until(() => engine.rejected().length === 0, 'the discarded change to go');
    });
  });

  describe('photos', () => {
    const isUpload = (request: { method: string }) => request.method === 'PUT';

    async function addPhoto(buildId: string) {
      const photo = picked(await pictureFile('bench.jpg'));
      await TestBed.inject(PhotoUploadQueue).add(WORKSHOP, { buildId }, [photo]);
      return photo;
    }

    it('should send waiting photos after the push, so their build is on the server first, and pull after them', async () => {
      const buildId = await createBuild();
      const photo = await addPhoto(buildId);

      const synced = engine.syncNow();
      const push = await server.nextPush();
      expect(http.match(isUpload)).toEqual([]);
      server.answer(push);
      const upload = await until(() => http.match(isUpload)[0], 'the upload');
      expect(upload.request.url).toBe(`/api/workshops/${WORKSHOP}/photos/${photo.id}`);
      expect(http.match((request) => request.url === '/api/sync/pull')).toEqual([]);
      upload.flush(serverPhoto(WORKSHOP, photo.id, buildId, 2), { status: 201, statusText: 'Created' });
      const changes = [{ entity: 'photo', changeNumber: 2, record: serverPhoto(WORKSHOP, photo.id, buildId, 2) }];
      (await server.nextPull(WORKSHOP, 0)).flush({ startOver: false, changes, cursor: 2, more: false });
      await synced;

      expect(await db.photoUploads.count()).toBe(0);
      expect((await db.photos.get(photo.id))?.changeNumber).toBe(2);
      expect(engine.lastError()).toBeNull();
    });

    describe('when a photo could not go', () => {
      beforeEach(() => jasmine.clock().install());
      afterEach(() => jasmine.clock().uninstall());

      it('should still pull, say why, and send the photo again a little later', async () => {
        const photo = await addPhoto(v7());

        const synced = engine.syncNow();
        (await until(() => http.match(isUpload)[0], 'the upload')).flush(BUSY, {
          status: 503,
          statusText: 'Service Unavailable',
        });
        (await server.nextPull(WORKSHOP, 0)).flush(NOTHING_NEW);
        await synced;

        expect(engine.lastError()).toBe(BUSY.error.message);
        expect((await db.photoUploads.get(photo.id))?.state).toBe('waiting');
        jasmine.clock().tick(retryDelayMs(1, () => 1));
        (await until(() => http.match(isUpload)[0], 'the upload sent again')).flush(
          serverPhoto(WORKSHOP, photo.id, v7(), 3),
          { status: 201, statusText: 'Created' },
        );
        (await server.nextPull(WORKSHOP, 0)).flush(NOTHING_NEW);
        await until(() => engine.lastError() === null, 'the retry to go through');
        expect(await db.photoUploads.count()).toBe(0);
      });

      it('should treat a 401 on an upload as the end of the session', async () => {
        await addPhoto(v7());

        const synced = engine.syncNow();
        (await until(() => http.match(isUpload)[0], 'the upload')).flush(SIGNED_OUT, {
          status: 401,
          statusText: 'Unauthorized',
        });
        (await until(() => http.match('/api/account')[0], 'the app to ask who is signed in')).flush(SIGNED_OUT, {
          status: 401,
          statusText: 'Unauthorized',
        });
        await synced;

        expect(engine.sessionEnded()).toBeTrue();
        expect((await db.photoUploads.toArray()).map((row) => row.state)).toEqual(['waiting']);
      });
    });

    it('should refuse the waiting photos of a workshop the account left, without sending them', async () => {
      await createBuild();
      const photo = await addPhoto(v7());

      const synced = engine.syncNow();
      (await server.nextPush(WORKSHOP)).flush(
        { error: { code: 'workshop_unknown', message: 'You are not a member of this workshop.' } },
        { status: 404, statusText: 'Not Found' },
      );
      (await until(() => http.match('/api/account')[0], 'the workshops to be asked for')).flush({
        ...SESSION,
        workshops: [],
      });
      await synced;

      http.expectNone(isUpload);
      expect((await db.photoUploads.get(photo.id))?.state).toBe('refused');
    });

    it('should send a photo as soon as it is added, once syncing runs on its own', async () => {
      jasmine.clock().install();
      try {
        engine.start();
        jasmine.clock().tick(0);
        (await server.nextPull()).flush(NOTHING_NEW);
        await until(() => !engine.syncing(), 'the first sync to end');

        const photo = await addPhoto(v7());

        (await until(() => http.match(isUpload)[0], 'the upload')).flush(serverPhoto(WORKSHOP, photo.id, v7(), 2), {
          status: 201,
          statusText: 'Created',
        });
        (await server.nextPull()).flush(NOTHING_NEW);
        await until(() => !engine.syncing(), 'the sync to end');
        expect(await db.photoUploads.count()).toBe(0);
      } finally {
        jasmine.clock().uninstall();
      }
    });
  });
});
