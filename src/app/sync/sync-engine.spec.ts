import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { SessionView } from '@benchtide/shared';
import { v7 } from 'uuid';
import { AccountSession } from '../account/account-session';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { OfflineStore } from './offline-store';
import { retryDelayMs } from './retry-delay';
import { SYNC_EVERY_MS, SyncEngine } from './sync-engine';
import { dropDatabase, NOTHING_NEW, serverBuild, SyncServer, until } from './sync-testing';

const WORKSHOP = v7();
const SESSION: SessionView = {
  account: { id: v7(), email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
  workshops: [{ id: WORKSHOP, name: 'River Club', personal: false, role: 'owner', memberCount: 2 }],
};
const BUSY = { error: { code: 'unavailable', message: 'The server is busy. Try again in a moment.' } };
const SIGNED_OUT = { error: { code: 'signed_out', message: 'You are signed out.' } };
const REFUSED = { code: 'forbidden', message: 'Viewers cannot add builds.' };

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
    TestBed.inject(OfflineStore).createBuild(WORKSHOP, { name: 'Harbour', scaleRatio: 87, status: 'planning' });

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

    it('should keep the outbox on a 401, ask the modeller to sign in, and not retry until asked', async () => {
      await createBuild();

      const synced = engine.syncNow();
      (await server.nextPush()).flush(SIGNED_OUT, { status: 401, statusText: 'Unauthorized' });
      await synced;

      expect(engine.sessionEnded()).toBeTrue();
      expect(engine.lastError()).toContain('Sign in again');
      expect(await db.outbox.count()).toBe(1);
      jasmine.clock().tick(5 * 60_000);
      expect(engine.syncing()).toBeFalse();

      const again = engine.syncNow();
      server.answer(await server.nextPush());
      expect(await until(() => !engine.sessionEnded(), 'the session to count as back')).toBeTrue();
      (await server.nextPull()).flush(NOTHING_NEW);
      await again;
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

  describe('rejected changes', () => {
    async function rejectFirst(): Promise<number> {
      const synced = engine.syncNow();
      server.answer(await server.nextPush(), REFUSED, [0]);
      (await server.nextPull()).flush(NOTHING_NEW);
      await synced;
      const rejected = await until(() => engine.rejected()[0], 'the rejected change');
      expect(rejected.reason).toEqual(REFUSED);
      return rejected.seq;
    }

    it('should send a rejected change again when retried', async () => {
      await createBuild();
      const seq = await rejectFirst();

      await engine.retry(seq);

      await server.acceptAll();
      await until(() => engine.rejected().length === 0 && engine.waitingCount() === 0, 'the retried change to go');
    });

    it('should remove a discarded creation and its record', async () => {
      const id = await createBuild();
      const seq = await rejectFirst();

      await engine.discard(seq);

      expect(await db.builds.get(id)).toBeUndefined();
      await until(() => engine.rejected().length === 0, 'the discarded change to go');
    });
  });
});
