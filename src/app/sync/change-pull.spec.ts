import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { PullAnswer, PulledChange } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { ChangePull } from './change-pull';
import { OfflineStore } from './offline-store';
import { dropDatabase, serverBuild, SyncServer } from './sync-testing';

const WORKSHOP = v7();
const OTHER_WORKSHOP = v7();

function buildChange(id: string, changeNumber: number, more: Parameters<typeof serverBuild>[3] = {}): PulledChange {
  return { entity: 'build', changeNumber, record: serverBuild(WORKSHOP, id, changeNumber, more) };
}

function page(changes: PulledChange[], cursor: number, more = false): PullAnswer {
  return { startOver: false, changes, cursor, more };
}

describe('ChangePull', () => {
  let http: HttpTestingController;
  let server: SyncServer;
  let db: BenchDb;
  let pull: ChangePull;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: BENCH_DB_NAME, useValue: `change-pull-spec-${v7()}` },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    server = new SyncServer(http);
    db = TestBed.inject(BenchDb);
    pull = TestBed.inject(ChangePull);
  });
  afterEach(async () => {
    http.verify();
    await dropDatabase(db);
  });

  it('should pull from where the last pull stopped, and store the records and the new cursor', async () => {
    await db.syncState.put({ workshopId: WORKSHOP, cursor: 12, lastSyncedAt: null });
    const id = v7();

    const pulled = pull.pull(WORKSHOP);
    (await server.nextPull(WORKSHOP, 12)).flush(page([buildChange(id, 13)], 13));
    await pulled;

    expect(await db.builds.get(id)).toEqual(serverBuild(WORKSHOP, id, 13));
    const state = await db.syncState.get(WORKSHOP);
    expect(state?.cursor).toBe(13);
    expect(state?.lastSyncedAt).toEqual(jasmine.any(String));
  });

  it('should ask for page after page until the server has no more', async () => {
    const [first, second] = [v7(), v7()];

    const pulled = pull.pull(WORKSHOP);
    (await server.nextPull(WORKSHOP, 0)).flush(page([buildChange(first, 3)], 3, true));
    (await server.nextPull(WORKSHOP, 3)).flush(page([buildChange(second, 8)], 8));
    await pulled;

    expect(await db.builds.count()).toBe(2);
    expect((await db.syncState.get(WORKSHOP))?.cursor).toBe(8);
  });

  it("should put the server's copy over this device's, and remove records the server deleted", async () => {
    const [edited, deleted, shortLived] = [v7(), v7(), v7()];
    const store = TestBed.inject(OfflineStore);
    await db.builds.bulkPut([serverBuild(WORKSHOP, edited, 4), serverBuild(WORKSHOP, deleted, 5)]);
    await store.patchBuild(WORKSHOP, edited, { name: 'Harbour at dusk' });
    const tombstone = { deletedAt: '2025-03-02T09:00:00.000Z' };

    const pulled = pull.pull(WORKSHOP);
    (await server.nextPull(WORKSHOP, 0)).flush(
      page(
        [
          buildChange(edited, 6, { name: 'Harbour by night' }),
          buildChange(deleted, 7, tombstone),
          buildChange(shortLived, 8),
          buildChange(shortLived, 9, tombstone),
        ],
        9,
      ),
    );
    await pulled;

    expect(await db.builds.get(edited)).toEqual(serverBuild(WORKSHOP, edited, 6, { name: 'Harbour by night' }));
    expect(await db.builds.get(deleted)).toBeUndefined();
    expect(await db.builds.get(shortLived)).toBeUndefined();
    expect(await db.outbox.count()).toBe(1);
  });

  it('should never move the cursor back, short of starting over', async () => {
    await db.syncState.put({ workshopId: WORKSHOP, cursor: 12, lastSyncedAt: null });

    const pulled = pull.pull(WORKSHOP);
    (await server.nextPull(WORKSHOP, 12)).flush(page([], 0));
    await pulled;

    expect((await db.syncState.get(WORKSHOP))?.cursor).toBe(12);
  });

  it('should store nothing of a page whose cursor the server did not move on', async () => {
    const pulled = pull.pull(WORKSHOP);
    (await server.nextPull(WORKSHOP, 0)).flush(page([buildChange(v7(), 1)], 0, true));

    await expectAsync(pulled).toBeRejectedWithError(/without moving on/);
    expect(await db.builds.count()).toBe(0);
    expect(await db.syncState.get(WORKSHOP)).toBeUndefined();
  });

  describe('when the server asks to start over', () => {
    it("should drop this workshop's records and cursor, keep changes not yet confirmed, and pull from 0", async () => {
      const [old, fresh, unconfirmed] = [v7(), v7(), v7()];
      const otherWorkshop = serverBuild(OTHER_WORKSHOP, v7(), 2);
      await db.builds.bulkPut([serverBuild(WORKSHOP, old, 39), otherWorkshop]);
      await TestBed.inject(OfflineStore).createBuild(WORKSHOP, {
        id: unconfirmed,
        name: 'Quarry',
        scaleRatio: 35,
        status: 'planning',
      });
      await db.syncState.put({ workshopId: WORKSHOP, cursor: 40, lastSyncedAt: '2025-03-01T09:00:00.000Z' });

      const pulled = pull.pull(WORKSHOP);
      (await server.nextPull(WORKSHOP, 40)).flush({
        startOver: true,
        reason: 'The workshop was restored from a backup.',
      });
      (await server.nextPull(WORKSHOP, 0)).flush(page([buildChange(fresh, 3)], 3));
      await pulled;

      expect(await db.builds.get(old)).toBeUndefined();
      expect(await db.builds.get(fresh)).toBeDefined();
      expect(await db.builds.get(unconfirmed)).toEqual(jasmine.objectContaining({ pending: true }));
      expect(await db.builds.get(otherWorkshop.id)).toEqual(otherWorkshop);
      expect((await db.syncState.get(WORKSHOP))?.cursor).toBe(3);
      expect(await db.outbox.count()).toBe(1);
    });

    it('should give up rather than start over again and again', async () => {
      const startOver = { startOver: true, reason: 'The workshop was restored from a backup.' };

      const pulled = pull.pull(WORKSHOP);
      (await server.nextPull(WORKSHOP, 0)).flush(startOver);
      (await server.nextPull(WORKSHOP, 0)).flush(startOver);

      await expectAsync(pulled).toBeRejectedWithError(/twice to start over/);
    });
  });
});
