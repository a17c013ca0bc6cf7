import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import type { NewPour } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { LocalRecords } from './local-records';
import { OfflineStore } from './offline-store';
import { insertRecords } from './record-writes';
import { dropDatabase, serverBuild, until } from './sync-testing';

const WORKSHOP = v7();
const OTHER_WORKSHOP = v7();

describe('OfflineStore', () => {
  let db: BenchDb;
  let store: OfflineStore;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [{ provide: BENCH_DB_NAME, useValue: `offline-store-spec-${v7()}` }] });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
  });
  afterEach(async () => {
    await dropDatabase(db);
  });

  describe('creating a record', () => {
    it('should store the build and queue its creation together', async () => {
      const id = await store.createBuild(WORKSHOP, { name: '  Harbour diorama ', scaleRatio: 87, status: 'planning' });

      const build = await db.builds.get(id);
      const [row] = await db.outbox.toArray();
      expect(build).toEqual(jasmine.objectContaining({ workshopId: WORKSHOP, name: 'Harbour diorama', notes: '' }));
      expect(build).toEqual(jasmine.objectContaining({ changeNumber: 0, pending: true, deletedAt: null }));
      expect(row?.state).toBe('waiting');
      expect(row?.workshopId).toBe(WORKSHOP);
      expect(row?.mutation).toEqual({
        type: 'build.create',
        mutationId: row?.mutationId ?? '',
        data: { id, name: 'Harbour diorama', scaleRatio: 87, status: 'planning', notes: '' },
      });
    });

    it('should refuse bad input with the shared message and write nothing', async () => {
      await expectAsync(
        store.createBuild(WORKSHOP, { name: ' ', scaleRatio: 87, status: 'planning' }),
      ).toBeRejectedWith(jasmine.objectContaining({ message: jasmine.stringContaining('Name is required') }));

      expect(await db.builds.count()).toBe(0);
      expect(await db.outbox.count()).toBe(0);
    });

    it('should write no record when its change cannot be queued', async () => {
      await store.createBuild(WORKSHOP, { name: 'Harbour diorama', scaleRatio: 87, status: 'planning' });
      const [first] = await db.outbox.toArray();
      const data = { id: v7(), name: 'Canal lock', scaleRatio: 76, status: 'planning' as const, notes: '' };

      const applied = store.apply(
        WORKSHOP,
        { type: 'build.create', mutationId: first?.mutationId ?? '', data },
        (now) => insertRecords(db, WORKSHOP, now, [['builds', data]]),
      );

      await expectAsync(applied).toBeRejected();
      expect(await db.builds.get(data.id)).toBeUndefined();
      expect(await db.outbox.count()).toBe(1);
    });

    it('should tell the sync engine which workshop has a change to send, once it is stored', async () => {
      const told: string[] = [];
      store.changes.subscribe((workshopId) => told.push(workshopId));

      await store.createBuild(OTHER_WORKSHOP, { name: 'Canal lock', scaleRatio: 76, status: 'planning' });
      await expectAsync(store.createBuild(WORKSHOP, { name: '', scaleRatio: 76, status: 'planning' })).toBeRejected();

      expect(told).toEqual([OTHER_WORKSHOP]);
    });

    it('should store a new container with its purchase, as the first entry in its stock book', async () => {
      const materialId = v7();
      const id = await store.createContainer(WORKSHOP, {
        materialId,
        part: 'A',
        sizeQty: 1000,
        unit: 'g',
        priceMinor: 2400,
        currency: 'EUR',
        boughtOn: '2025-02-10',
      });

      expect(await db.containers.get(id)).toEqual(jasmine.objectContaining({ materialId, sizeQty: 1000 }));
      expect(await db.ledgerEntries.get(id)).toEqual(
        jasmine.objectContaining({ containerId: id, kind: 'purchase', quantity: 1000, at: '2025-02-10T12:00:00Z' }),
      );
      expect(await db.outbox.count()).toBe(1);
    });
  });

  describe('changing and deleting', () => {
    it('should change the fields given, queue the patch and remember the values it replaced', async () => {
      await db.builds.put(serverBuild(WORKSHOP, v7(), 7));
      const [build] = await db.builds.toArray();
      const id = build?.id ?? '';

      await store.patchBuild(WORKSHOP, id, { name: 'Harbour at dusk', status: 'building' });

      expect(await db.builds.get(id)).toEqual(
        jasmine.objectContaining({ name: 'Harbour at dusk', status: 'building', changeNumber: 7, pending: true }),
      );
      const [row] = await db.outbox.toArray();
      expect(row?.mutation).toEqual(jasmine.objectContaining({ type: 'build.patch', recordId: id }));
      expect(row?.undo).toEqual([{ table: 'builds', id, restore: { name: 'Harbour diorama', status: 'planning' } }]);
    });

    it('should refuse to change a record this device does not hold, and queue nothing', async () => {
      await expectAsync(store.patchStep(WORKSHOP, v7(), { title: 'Gloss coat' })).toBeRejectedWithError(
        /no such record/,
      );

      expect(await db.outbox.count()).toBe(0);
    });

    it('should mark a deleted build and leave it out of the list', async () => {
      const keep = await store.createBuild(WORKSHOP, { name: 'Canal lock', scaleRatio: 76, status: 'planning' });
      const gone = await store.createBuild(WORKSHOP, { name: 'Harbour', scaleRatio: 87, status: 'planning' });
      const builds = TestBed.runInInjectionContext(() => TestBed.inject(LocalRecords).builds(signal(WORKSHOP)));
      await until(() => builds().length === 2, 'both builds');

      await store.deleteBuild(WORKSHOP, gone);

      await until(() => builds().length === 1, 'the list without the deleted build');
      expect(builds().map((b) => b.id)).toEqual([keep]);
      expect((await db.builds.get(gone))?.deletedAt).not.toBeNull();
      expect((await db.outbox.toArray()).map((row) => row.mutation.type)).toEqual([
        'build.create',
        'build.create',
        'build.delete',
      ]);
    });
  });

  describe('the stock book and pours', () => {
    let containerId: string;

    beforeEach(async () => {
      containerId = await store.createContainer(WORKSHOP, {
        materialId: v7(),
        part: 'single',
        sizeQty: 1000,
        unit: 'g',
        priceMinor: 2400,
        currency: 'EUR',
        boughtOn: '2025-02-10',
      });
    });

    it('should take waste off the stock at once, costed from the container price', async () => {
      const id = await store.recordWaste(WORKSHOP, containerId, { quantity: 12.5, note: 'Skinned over' });

      // 12.5 g of a 1000 g tin bought for 24.00 EUR costs 0.30 EUR.
      expect(await db.ledgerEntries.get(id)).toEqual(
        jasmine.objectContaining({
          kind: 'waste',
          quantity: -12.5,
          costMinor: 30,
          note: 'Skinned over',
          pending: true,
        }),
      );
      const rows = await db.outbox.toArray();
      expect(rows[1]?.mutation).toEqual(
        jasmine.objectContaining({
          type: 'container.waste',
          recordId: containerId,
          data: { id, quantity: 12.5, note: 'Skinned over' },
        }),
      );
    });

    it('should record a stocktake as the difference from what this device counts', async () => {
      await store.recordWaste(WORKSHOP, containerId, { quantity: 12.5 });

      const id = await store.recordStocktake(WORKSHOP, containerId, { countedQty: 950 });

      expect((await db.ledgerEntries.get(id))?.quantity).toBe(-37.5);
    });

    it('should store only the pour, waiting for the server to plan it and draw the stock', async () => {
      const pour: Omit<NewPour, 'id'> = {
        buildId: v7(),
        materialId: v7(),
        shape: { kind: 'rectangle', lengthMm: 200, widthMm: 100 },
        depthMm: 6,
        roomTempC: 21,
        startAt: '2025-03-01T10:00:00Z',
      };

      const id = await store.logPour(WORKSHOP, pour);

      expect(await db.pours.get(id)).toEqual(
        jasmine.objectContaining({ pending: true, request: null, plan: null, stepId: null, note: '' }),
      );
      expect((await db.pours.get(id))?.logged).toEqual(jasmine.objectContaining({ depthMm: 6, whenShort: 'refuse' }));
      expect(await db.ledgerEntries.count()).toBe(1);
    });

    it('should take the stock a pour drew off with the deleted pour', async () => {
      const pourId = v7();
      const at = '2025-03-01T10:00:00Z';
      const pulled = { workshopId: WORKSHOP, createdAt: at, updatedAt: at, deletedAt: null, changeNumber: 9 };
      const use = { ...pulled, id: v7(), containerId, kind: 'pour-use' as const, quantity: -120, costMinor: 288 };
      await db.ledgerEntries.put({ ...use, at, pourId, note: '' });
      const pour = { ...pulled, id: pourId, buildId: v7(), stepId: null, materialId: v7(), startAt: at, note: '' };
      await db.pours.put({ ...pour, request: null, plan: null, shortfall: [] });

      await store.deletePour(WORKSHOP, pourId);

      expect((await db.pours.get(pourId))?.deletedAt).not.toBeNull();
      expect((await db.ledgerEntries.get(use.id))?.deletedAt).not.toBeNull();
      expect((await db.ledgerEntries.get(containerId))?.deletedAt).toBeNull();
    });
  });
});
