import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { materialDataSheetSchema, remainingByContainer, type PullAnswer, type PulledChange } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { ChangePull } from './change-pull';
import { OfflineStore } from './offline-store';
import { PhotoUploadQueue } from './photo-upload-queue';
import type { LocalContainer, LocalLedgerEntry, LocalMaterial, LocalPour } from './synced-records';
import { dropDatabase, serverBuild, SyncServer, TEST_DATA_SHEET } from './sync-testing';
import { picked, pictureFile, serverPhoto } from '../photos/photos-testing';

const WORKSHOP = v7();
const OTHER_WORKSHOP = v7();

function buildChange(id: string, changeNumber: number, more: Parameters<typeof serverBuild>[3] = {}): PulledChange {
  return { entity: 'build', changeNumber, record: serverBuild(WORKSHOP, id, changeNumber, more) };
}

/** The fields every record the server sends has. */
function synced(id: string, changeNumber: number) {
  const at = '2025-03-01T09:00:00.000Z';
  return { id, workshopId: WORKSHOP, createdAt: at, updatedAt: at, deletedAt: null, changeNumber };
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
    await store.patch('build', WORKSHOP, edited, { name: 'Harbour at dusk' });
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
      await TestBed.inject(OfflineStore).create('build', WORKSHOP, {
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

  describe('pours logged on this device', () => {
    const materialId = v7();
    const [partA, partB] = [v7(), v7()];

    async function stock(): Promise<Record<string, number>> {
      const entries = (await db.ledgerEntries.toArray()).filter((entry) => entry.deletedAt === null);
      return remainingByContainer(entries.map((entry) => ({ ...entry, atMs: Date.parse(entry.at) })));
    }

    /** The server's copy of a pour logged here, and its own stock uses of it, as a pull brings them. */
    async function serverCopy(pourId: string, changeNumber: number, deletedAt: string | null = null) {
      const { pending: _pending, ...local } = (await db.pours.get(pourId)) as LocalPour;
      const pour: LocalPour = { ...local, changeNumber, deletedAt };
      const use = (containerId: string, costMinor: number): LocalLedgerEntry => ({
        ...synced(v7(), changeNumber),
        containerId,
        kind: 'pour-use',
        quantity: -9.9,
        costMinor,
        at: pour.startAt,
        pourId,
        note: '',
        deletedAt,
      });
      const uses = [use(partA, 50), use(partB, 40)];
      const changes: PulledChange[] = [
        { entity: 'pour', changeNumber, record: { ...pour } },
        ...uses.map((record) => ({ entity: 'ledgerEntry' as const, changeNumber, record: { ...record } })),
      ];
      return { uses, changes };
    }

    const logPour = () =>
      TestBed.inject(OfflineStore).logPour(WORKSHOP, {
        buildId: v7(),
        materialId,
        shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
        depthMm: 4,
        roomTempC: 20,
        startAt: '2025-03-01T10:00:00Z',
      });

    beforeEach(async () => {
      const material: LocalMaterial = {
        ...synced(materialId, 1),
        name: 'Test resin',
        kind: 'two-part-epoxy',
        dataSheet: materialDataSheetSchema.parse(TEST_DATA_SHEET),
        measure: null,
        shelfLifeOpenedDays: null,
        safetySheet: '',
      };
      const container = (id: string, part: 'A' | 'B'): LocalContainer => ({
        ...synced(id, 2),
        materialId,
        part,
        sizeQty: 500,
        unit: 'g',
        priceMinor: 2500,
        currency: 'EUR',
        boughtOn: '2025-02-10',
        openedOn: null,
        useBy: null,
        lowStockQty: null,
        lot: null,
      });
      const purchase = (containerId: string): LocalLedgerEntry => ({
        ...synced(containerId, 2),
        containerId,
        kind: 'purchase',
        quantity: 500,
        costMinor: 0,
        at: '2025-02-10T12:00:00.000Z',
        pourId: null,
        note: '',
      });
      await db.materials.put(material);
      await db.containers.bulkPut([container(partA, 'A'), container(partB, 'B')]);
      await db.ledgerEntries.bulkPut([purchase(partA), purchase(partB)]);
      await db.syncState.put({ workshopId: WORKSHOP, cursor: 2, lastSyncedAt: null });
    });

    it("should replace the stock uses drawn here with the server's, so the stock here is the server's sum", async () => {
      const pourId = await logPour();
      expect(await stock()).toEqual({ [partA]: 490.1, [partB]: 490.1 });
      const { uses, changes } = await serverCopy(pourId, 3);

      const pulled = pull.pull(WORKSHOP);
      (await server.nextPull(WORKSHOP, 2)).flush(page(changes, 3));
      await pulled;

      expect(await db.ledgerEntries.where({ pourId }).toArray()).toEqual(jasmine.arrayWithExactContents(uses));
      expect(await stock()).toEqual({ [partA]: 490.1, [partB]: 490.1 });
      expect((await db.pours.get(pourId))?.pending).toBeUndefined();
    });

    it('should drop the uses drawn here when the pour arrives deleted, and keep those of pours not in the page', async () => {
      const [deleted, waiting] = [await logPour(), await logPour()];
      const { changes } = await serverCopy(deleted, 3, '2025-03-01T12:00:00.000Z');

      const pulled = pull.pull(WORKSHOP);
      (await server.nextPull(WORKSHOP, 2)).flush(page(changes, 3));
      await pulled;

      expect(await db.pours.get(deleted)).toBeUndefined();
      expect(await db.ledgerEntries.where({ pourId: deleted }).count()).toBe(0);
      expect(await db.ledgerEntries.where({ pourId: waiting }).count()).toBe(2);
      expect(await stock()).toEqual({ [partA]: 490.1, [partB]: 490.1 });
    });
  });

  describe('photos', () => {
    const photoChange = (record: ReturnType<typeof serverPhoto>): PulledChange => ({
      entity: 'photo',
      changeNumber: record.changeNumber,
      record: { ...record },
    });

    it('should store the photos pulled and remove those the server deleted', async () => {
      const [buildId, kept, deleted] = [v7(), v7(), v7()];
      await db.photos.put({ ...serverPhoto(WORKSHOP, deleted, buildId, 2), caption: 'Soon gone' });

      const pulled = pull.pull(WORKSHOP);
      const changes = [
        photoChange(serverPhoto(WORKSHOP, kept, buildId, 3, { caption: 'First layer' })),
        photoChange(serverPhoto(WORKSHOP, deleted, buildId, 4, { deletedAt: '2025-03-02T09:00:00.000Z' })),
      ];
      (await server.nextPull(WORKSHOP, 0)).flush(page(changes, 4));
      await pulled;

      expect(await db.photos.get(kept)).toEqual(serverPhoto(WORKSHOP, kept, buildId, 3, { caption: 'First layer' }));
      expect(await db.photos.get(deleted)).toBeUndefined();
    });

    it("should drop the bytes kept for an upload once the server's record of the photo arrives", async () => {
      const buildId = v7();
      const [sent, waiting, deletedElsewhere] = [
        picked(await pictureFile('sent.jpg')),
        picked(await pictureFile('waiting.jpg')),
        picked(await pictureFile('deleted.jpg')),
      ];
      await TestBed.inject(PhotoUploadQueue).add(WORKSHOP, { buildId }, [sent, waiting, deletedElsewhere]);

      const pulled = pull.pull(WORKSHOP);
      const changes = [
        photoChange(serverPhoto(WORKSHOP, sent.id, buildId, 5)),
        photoChange(serverPhoto(WORKSHOP, deletedElsewhere.id, buildId, 6, { deletedAt: '2025-03-02T09:00:00.000Z' })),
      ];
      (await server.nextPull(WORKSHOP, 0)).flush(page(changes, 6));
      await pulled;

      expect((await db.photoUploads.toArray()).map((upload) => upload.id)).toEqual([waiting.id]);
      expect((await db.photos.get(sent.id))?.pending).toBeUndefined();
      expect(await db.photos.get(deletedElsewhere.id)).toBeUndefined();
      expect((await db.photos.get(waiting.id))?.pending).toBeTrue();
    });

    it('should keep photos not yet sent when the server asks to start over', async () => {
      const waiting = picked(await pictureFile('waiting.jpg'));
      await TestBed.inject(PhotoUploadQueue).add(WORKSHOP, { buildId: v7() }, [waiting]);
      await db.photos.put(serverPhoto(WORKSHOP, v7(), v7(), 2));

      const pulled = pull.pull(WORKSHOP);
      (await server.nextPull(WORKSHOP, 0)).flush({ startOver: true, reason: 'cursor_unknown' });
      (await server.nextPull(WORKSHOP, 0)).flush(page([], 0));
      await pulled;

      expect((await db.photos.toArray()).map((photo) => photo.id)).toEqual([waiting.id]);
      expect(await db.photoUploads.count()).toBe(1);
    });
  });
});
