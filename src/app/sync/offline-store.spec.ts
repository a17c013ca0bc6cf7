import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { planPour, remainingByContainer, type NewContainer, type NewPour } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { LocalRecords } from './local-records';
import { LayerRefusedError, OfflineStore, PourPlanError, StockShortError } from './offline-store';
import { insertRecords } from './record-writes';
import { dropDatabase, serverBuild, TEST_DATA_SHEET, until } from './sync-testing';

const WORKSHOP = v7();
const OTHER_WORKSHOP = v7();
/** 100 × 50 mm, 4 mm deep: 20 mL (1 mL = 1000 mm³). */
const POUR = {
  buildId: v7(),
  shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
  depthMm: 4,
  roomTempC: 20,
  startAt: '2025-03-01T10:00:00Z',
} as const;

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
      const id = await store.create('build', WORKSHOP, {
        name: '  Harbour diorama ',
        scaleRatio: 87,
        status: 'planning',
      });

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
        store.create('build', WORKSHOP, { name: ' ', scaleRatio: 87, status: 'planning' }),
      ).toBeRejectedWith(jasmine.objectContaining({ message: jasmine.stringContaining('Name is required') }));

      expect(await db.builds.count()).toBe(0);
      expect(await db.outbox.count()).toBe(0);
    });

    it('should write no record when its change cannot be queued', async () => {
      await store.create('build', WORKSHOP, { name: 'Harbour diorama', scaleRatio: 87, status: 'planning' });
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

      await store.create('build', OTHER_WORKSHOP, { name: 'Canal lock', scaleRatio: 76, status: 'planning' });
      await expectAsync(
        store.create('build', WORKSHOP, { name: '', scaleRatio: 76, status: 'planning' }),
      ).toBeRejected();

      expect(told).toEqual([OTHER_WORKSHOP]);
    });

    it('should store a new container with its purchase, as the first entry in its stock book', async () => {
      const materialId = v7();
      const id = await store.create('container', WORKSHOP, {
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

      await store.patch('build', WORKSHOP, id, { name: 'Harbour at dusk', status: 'building' });

      expect(await db.builds.get(id)).toEqual(
        jasmine.objectContaining({ name: 'Harbour at dusk', status: 'building', changeNumber: 7, pending: true }),
      );
      const [row] = await db.outbox.toArray();
      expect(row?.mutation).toEqual(jasmine.objectContaining({ type: 'build.patch', recordId: id }));
      expect(row?.undo).toEqual([{ table: 'builds', id, restore: { name: 'Harbour diorama', status: 'planning' } }]);
    });

    it('should refuse to change a record this device does not hold, and queue nothing', async () => {
      await expectAsync(store.patch('step', WORKSHOP, v7(), { title: 'Gloss coat' })).toBeRejectedWithError(
        /no such record/,
      );

      expect(await db.outbox.count()).toBe(0);
    });

    it('should mark a deleted build and leave it out of the list', async () => {
      const keep = await store.create('build', WORKSHOP, { name: 'Canal lock', scaleRatio: 76, status: 'planning' });
      const gone = await store.create('build', WORKSHOP, { name: 'Harbour', scaleRatio: 87, status: 'planning' });
      const builds = TestBed.runInInjectionContext(() => TestBed.inject(LocalRecords).builds(signal(WORKSHOP)));
      await until(() => builds().length === 2, 'both builds');

      await store.remove('build', WORKSHOP, gone);

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
      containerId = await store.create('container', WORKSHOP, {
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

    it('should take the stock a pour drew off with the deleted pour', async () => {
      const pourId = v7();
      const at = '2025-03-01T10:00:00Z';
      const pulled = { workshopId: WORKSHOP, createdAt: at, updatedAt: at, deletedAt: null, changeNumber: 9 };
      const use = { ...pulled, id: v7(), containerId, kind: 'pour-use' as const, quantity: -120, costMinor: 288 };
      await db.ledgerEntries.put({ ...use, at, pourId, note: '' });
      const pour = { ...pulled, id: pourId, buildId: v7(), stepId: null, materialId: v7(), startAt: at, note: '' };
      const planned = planPour({
        ...POUR,
        material: TEST_DATA_SHEET,
        startAtMs: Date.parse(at),
        scaleResolutionG: 0.1,
      });
      if (!planned.ok) throw new Error('The spec pour cannot be planned');
      const { request, ...plan } = planned.plan;
      await db.pours.put({ ...pour, request, plan, shortfall: [], layerCount: plan.layers.count });

      await store.remove('pour', WORKSHOP, pourId);

      expect((await db.pours.get(pourId))?.deletedAt).not.toBeNull();
      expect((await db.ledgerEntries.get(use.id))?.deletedAt).not.toBeNull();
      expect((await db.ledgerEntries.get(containerId))?.deletedAt).toBeNull();
    });
  });

  describe('logging a pour', () => {
    let materialId: string;

    const addContainer = (fields: Partial<NewContainer>) =>
      store.create('container', WORKSHOP, {
        materialId,
        part: 'A',
        sizeQty: 500,
        unit: 'g',
        priceMinor: 2500,
        currency: 'EUR',
        boughtOn: '2025-02-10',
        ...fields,
      });
    const logPour = (fields: Partial<NewPour> = {}) => store.logPour(WORKSHOP, { ...POUR, materialId, ...fields });

    async function stock(): Promise<Record<string, number>> {
      const entries = (await db.ledgerEntries.toArray()).filter((entry) => entry.deletedAt === null);
      return remainingByContainer(entries.map((entry) => ({ ...entry, atMs: Date.parse(entry.at) })));
    }

    async function expectNothingWritten(attempt: () => Promise<string>, error: jasmine.Expected<Error>): Promise<void> {
      const before = [await db.pours.count(), await db.ledgerEntries.count(), await db.outbox.count()];
      await expectAsync(attempt()).toBeRejectedWith(error);
      expect([await db.pours.count(), await db.ledgerEntries.count(), await db.outbox.count()]).toEqual(before);
    }

    beforeEach(async () => {
      materialId = await store.create('material', WORKSHOP, {
        name: 'Test resin',
        kind: 'two-part-epoxy',
        dataSheet: TEST_DATA_SHEET,
      });
    });

    // Worked example by hand (see TEST_DATA_SHEET): the pour mixes 9.9 g of each part.
    it('should plan the pour here and draw each part from the shelf, with the pour and its change in one write', async () => {
      const partA = await addContainer({ part: 'A', priceMinor: 2500 });
      const partB = await addContainer({ part: 'B', priceMinor: 2000 });
      const queued = await db.outbox.count();

      const id = await logPour({ startAt: '2025-03-01T11:00:00+01:00' });

      const pour = await db.pours.get(id);
      expect(pour).toEqual(jasmine.objectContaining({ pending: true, changeNumber: 0, shortfall: [], materialId }));
      expect(pour?.request.depthMm).toBe(4);
      expect(pour?.plan.mix.total.partAG).toBe(9.9);
      expect(pour?.plan.mix.total.partBG).toBe(9.9);
      expect(Object.keys(pour?.plan ?? {})).not.toContain('request');
      const uses = await db.ledgerEntries.where({ pourId: id }).toArray();
      // 9.9 g × 2500 / 500 = 49.5 cents; 9.9 g × 2000 / 500 = 39.6 cents, kept exact (shown sums round once).
      expect(uses.map((use) => [use.containerId, use.kind, use.quantity, use.costMinor])).toEqual(
        jasmine.arrayWithExactContents([
          [partA, 'pour-use', -9.9, 49.5],
          [partB, 'pour-use', -9.9, 39.6],
        ]),
      );
      for (const use of uses) {
        expect(use).toEqual(
          jasmine.objectContaining({ at: '2025-03-01T10:00:00.000Z', pending: true, changeNumber: 0 }),
        );
        expect(use.id).not.toBe(use.containerId);
      }
      expect(await stock()).toEqual({ [partA]: 490.1, [partB]: 490.1 });
      expect(pour?.layerCount).toBe(1);
      // Layer 1 goes on at the start, under the pour's own id, to the plan's amounts.
      expect(await db.pourLayers.get(id)).toEqual(
        jasmine.objectContaining({
          pourId: id,
          number: 1,
          pouredAt: '2025-03-01T10:00:00.000Z',
          roomTempC: 20,
          depthMm: 4,
          partAG: 9.9,
          partBG: 9.9,
          weighedAG: null,
          pending: true,
        }),
      );
      const rows = await db.outbox.toArray();
      expect(rows.length).toBe(queued + 1);
      const row = rows.at(-1);
      expect(row?.mutation).toEqual(
        jasmine.objectContaining({ type: 'pour.create', data: jasmine.objectContaining({ id, whenShort: 'refuse' }) }),
      );
      // Discarding the change, were the server to refuse it, takes the pour and its uses away again.
      expect(row?.undo).toEqual(
        jasmine.arrayWithExactContents([
          { table: 'pours', id, restore: null },
          { table: 'pourLayers', id, restore: null },
          ...uses.map((use) => ({ table: 'ledgerEntries', id: use.id, restore: null })),
        ]),
      );
    });

    it('should count the pours already logged here, so a second pour cannot spend the same grams', async () => {
      const partA = await addContainer({ part: 'A', sizeQty: 15 });
      await addContainer({ part: 'B' });
      await logPour();

      await expectNothingWritten(
        () => logPour(),
        jasmine.objectContaining({
          name: 'StockShortError',
          message: jasmine.stringContaining('The shelf holds 5.1 g of part A; this pour needs 9.9 g.'),
        }),
      );
      expect((await stock())[partA]).toBe(5.1);
    });

    it('should refuse a pour the shelf here cannot cover, saying what is short, and save nothing', async () => {
      await addContainer({ part: 'A', sizeQty: 5 });
      await addContainer({ part: 'B' });

      await expectNothingWritten(logPour, jasmine.any(StockShortError));
      const error = (await logPour().catch((caught: unknown) => caught)) as StockShortError;
      expect(error.message).toBe(
        'The shelf holds 5 g of part A; this pour needs 9.9 g. ' +
          'Add a container, or record the rest as taken from a bottle not on the shelf.',
      );
      expect(error.shortfall).toEqual([{ part: 'A', quantityG: 4.9 }]);
    });

    it('should record the shortfall when told the rest came from a bottle not on the shelf', async () => {
      const partA = await addContainer({ part: 'A', sizeQty: 5 });
      await addContainer({ part: 'B' });

      const id = await logPour({ whenShort: 'record-shortfall' });

      expect((await db.pours.get(id))?.shortfall).toEqual([{ part: 'A', quantityG: 4.9 }]);
      expect((await stock())[partA]).toBe(0);
    });

    it('should draw only from the chosen containers, and not from one deleted here', async () => {
      await addContainer({ part: 'A', boughtOn: '2025-01-01' });
      const chosen = await addContainer({ part: 'A', boughtOn: '2025-02-01' });
      const deleted = await addContainer({ part: 'B', boughtOn: '2025-01-01' });
      const partB = await addContainer({ part: 'B', boughtOn: '2025-02-01' });
      await store.remove('container', WORKSHOP, deleted);

      const id = await logPour({ containerIds: [chosen, partB] });

      const uses = await db.ledgerEntries.where({ pourId: id }).toArray();
      expect(uses.map((use) => use.containerId)).toEqual(jasmine.arrayWithExactContents([chosen, partB]));
    });

    it('should turn grams into millilitres for a bottle measured by volume (worked example, V = m / ρ)', async () => {
      const partA = await addContainer({ part: 'A', unit: 'mL', sizeQty: 250 });
      await addContainer({ part: 'B' });

      await logPour();

      // 9.9 g / 1.1 g/mL = 9 mL.
      expect((await stock())[partA]).toBe(241);
    });

    it('should refuse, saving nothing, when the material is not on this device', async () => {
      await expectNothingWritten(
        () => logPour({ materialId: v7() }),
        jasmine.objectContaining({ message: jasmine.stringContaining('material of this pour is not on this device') }),
      );
    });

    it('should refuse, saving nothing, a chosen container this device does not hold', async () => {
      await addContainer({ part: 'A' });

      await expectNothingWritten(
        () => logPour({ containerIds: [v7()] }),
        jasmine.objectContaining({ message: jasmine.stringContaining('container chosen for this pour is not') }),
      );
    });

    it('should refuse, saving nothing, a pour the shared planner cannot plan, with its messages', async () => {
      await addContainer({ part: 'A' });

      await expectNothingWritten(
        () => logPour({ startAt: '1969-12-31T23:00:00Z' }),
        jasmine.objectContaining({
          name: 'PourPlanError',
          message: jasmine.stringContaining('Start time must not be before 1970'),
        }),
      );
      const error = await logPour({ startAt: '1969-12-31T23:00:00Z' }).catch((caught: unknown) => caught);
      expect((error as PourPlanError).fields).toEqual({ startAtMs: 'Start time must not be before 1970' });
    });

    it('should check the input with the shared schemas before anything else', async () => {
      await expectNothingWritten(
        () => logPour({ depthMm: 0 }),
        jasmine.objectContaining({ message: jasmine.stringContaining('Depth must be more than 0 mm') }),
      );
    });

    it('should take a pour logged here and its stock back with it when deleted', async () => {
      const partA = await addContainer({ part: 'A' });
      await addContainer({ part: 'B' });
      const id = await logPour();

      await store.remove('pour', WORKSHOP, id);

      expect((await db.pours.get(id))?.deletedAt).not.toBeNull();
      expect((await db.pourLayers.get(id))?.deletedAt).not.toBeNull();
      expect((await stock())[partA]).toBe(500);
    });

    it('should keep the layer count chosen when the pour was logged', async () => {
      await addContainer({ part: 'A' });
      await addContainer({ part: 'B' });

      const id = await logPour({ layerCount: 2 });

      expect((await db.pours.get(id))?.layerCount).toBe(2);
      // 4 mm in 2 layers: 2 mm, 10 mL, 4.95 g a part, rounded up to the 0.1 g scale (worked by hand).
      expect(await db.pourLayers.get(id)).toEqual(jasmine.objectContaining({ depthMm: 2, partAG: 5 }));
    });
  });

  /**
   * Worked by hand for the layer specs: 100 × 50 × 12 mm in 3 layers of 4 mm, 20 mL each, 9.9 g of each part
   * a layer (see TEST_DATA_SHEET), 29.7 g a part in all. Recoat from 240 min at 20 °C: layer 2 from 14:00.
   */
  describe('following a pour through its layers', () => {
    let partA: string;
    let partB: string;
    let pourId: string;

    const layer2 = (fields: Partial<Parameters<OfflineStore['recordLayer']>[1]> = {}) =>
      store.recordLayer(WORKSHOP, {
        pourId,
        number: 2,
        pouredAt: '2025-03-01T14:30:00.000Z',
        roomTempC: 20,
        ...fields,
      });

    async function stockOf(containerId: string): Promise<number> {
      const entries = (await db.ledgerEntries.toArray()).filter((entry) => entry.deletedAt === null);
      return remainingByContainer(entries.map((entry) => ({ ...entry, atMs: Date.parse(entry.at) })))[containerId] ?? 0;
    }
    async function costOfPour(): Promise<number> {
      const uses = await db.ledgerEntries
        .where({ pourId })
        .filter((entry) => entry.deletedAt === null)
        .toArray();
      return uses.reduce((sum, use) => sum + use.costMinor, 0);
    }
    async function expectRefused(attempt: () => Promise<unknown>, field: string, words: string): Promise<void> {
      const before = [await db.pourLayers.count(), await db.ledgerEntries.count(), await db.outbox.count()];
      const error = await attempt().then(
        () => null,
        (caught: unknown) => caught,
      );
      expect(error).toEqual(jasmine.any(LayerRefusedError));
      expect((error as LayerRefusedError).field).toBe(field);
      expect((error as LayerRefusedError).message).toContain(words);
      expect([await db.pourLayers.count(), await db.ledgerEntries.count(), await db.outbox.count()]).toEqual(before);
    }
    const lastChange = async () => (await db.outbox.toArray()).at(-1)?.mutation;

    beforeEach(async () => {
      const materialId = await store.create('material', WORKSHOP, {
        name: 'Test resin',
        kind: 'two-part-epoxy',
        dataSheet: TEST_DATA_SHEET,
      });
      const container = (part: 'A' | 'B', priceMinor: number) =>
        store.create('container', WORKSHOP, {
          materialId,
          part,
          sizeQty: 500,
          unit: 'g',
          priceMinor,
          currency: 'EUR',
          boughtOn: '2025-02-10',
        });
      partA = await container('A', 2500);
      partB = await container('B', 2000);
      pourId = await store.logPour(WORKSHOP, { ...POUR, materialId, depthMm: 12, layerCount: 3 });
    });

    describe('recording a layer', () => {
      it('should store the layer with the plan for it, draw what was weighed and queue it', async () => {
        const id = await layer2({ weighedAG: 10.2, weighedBG: 10, note: 'Blue tint' });

        expect(await db.pourLayers.get(id)).toEqual(
          jasmine.objectContaining({
            pourId,
            number: 2,
            pouredAt: '2025-03-01T14:30:00.000Z',
            depthMm: 4,
            partAG: 9.9,
            partBG: 9.9,
            weighedAG: 10.2,
            weighedBG: 10,
            note: 'Blue tint',
            pending: true,
          }),
        );
        // Part A: 9.9 + 10.2 + 9.9 = 30.0 g of 500; part B: 9.9 + 10.0 + 9.9 = 29.8 g.
        expect(await stockOf(partA)).toBe(470);
        expect(await stockOf(partB)).toBe(470.2);
        // 30.0 g × 2500 / 500 = 150 cents; 29.8 g × 2000 / 500 = 119.2 cents, kept exact.
        expect(await costOfPour()).toBeCloseTo(269.2, 9);
        expect(await lastChange()).toEqual(
          jasmine.objectContaining({ type: 'pourLayer.create', data: jasmine.objectContaining({ id, number: 2 }) }),
        );
      });

      it('should draw the plan again when nothing was weighed, so the stock stays as logged', async () => {
        await layer2();

        expect(await stockOf(partA)).toBe(470.3);
        expect(
          (await db.ledgerEntries.where({ pourId }).toArray()).filter((use) => use.deletedAt === null).length,
        ).toBe(2);
      });

      it('should put the first draw back when the server refuses the layer', async () => {
        await layer2({ weighedAG: 10.2, weighedBG: 10 });
        const row = (await db.outbox.toArray()).at(-1)!;
        await db.outbox.update(row.seq, { state: 'rejected' });

        await store.discard(row.seq);

        expect(await stockOf(partA)).toBe(470.3);
        expect((await db.pourLayers.where({ pourId }).toArray()).map((layer) => layer.number)).toEqual([1]);
      });

      it('should refuse a layer out of order, saying which comes first', async () => {
        await expectRefused(() => layer2({ number: 3 }), 'number', 'Layer 2 comes before layer 3.');
      });

      it('should refuse a layer already poured', async () => {
        await layer2();

        await expectRefused(() => layer2(), 'number', 'Layer 2 was already recorded as poured');
      });

      it('should refuse a layer before the layer below it', async () => {
        await expectRefused(
          () => layer2({ pouredAt: '2025-03-01T09:00:00.000Z' }),
          'pouredAt',
          'Layer 2 cannot go on before layer 1',
        );
      });

      it('should refuse a time more than an hour ahead of now', async () => {
        const later = new Date(Date.now() + 2 * 3_600_000).toISOString();

        await expectRefused(() => layer2({ pouredAt: later }), 'pouredAt', 'more than an hour from now');
      });

      it('should refuse a weighed amount of 0 g, naming the part', async () => {
        await expectRefused(() => layer2({ weighedAG: 0, weighedBG: 10 }), 'weighedAG', 'part A must be more than 0 g');
      });

      it('should refuse one part weighed without the other', async () => {
        await expectRefused(() => layer2({ weighedAG: 10 }), 'weighedBG', 'both parts, or of neither');
      });
    });

    describe('correcting a layer', () => {
      let id: string;

      beforeEach(async () => {
        id = await layer2({ weighedAG: 10.2, weighedBG: 10 });
      });

      it('should change the amounts weighed, draw again and queue the correction', async () => {
        await store.correctLayer(WORKSHOP, id, { weighedAG: 9.9, weighedBG: 9.9 });

        expect(await db.pourLayers.get(id)).toEqual(jasmine.objectContaining({ weighedAG: 9.9, weighedBG: 9.9 }));
        expect(await stockOf(partA)).toBe(470.3);
        expect(await stockOf(partB)).toBe(470.3);
        expect(await lastChange()).toEqual(
          jasmine.objectContaining({ type: 'pourLayer.patch', recordId: id, data: { weighedAG: 9.9, weighedBG: 9.9 } }),
        );
      });

      it('should move a layer’s time within the layers around it', async () => {
        await store.correctLayer(WORKSHOP, id, { pouredAt: '2025-03-01T15:05:00.000Z', roomTempC: 18 });

        expect(await db.pourLayers.get(id)).toEqual(
          jasmine.objectContaining({ pouredAt: '2025-03-01T15:05:00.000Z', roomTempC: 18 }),
        );
      });

      it('should refuse a time before the layer below', async () => {
        await expectRefused(
          () => store.correctLayer(WORKSHOP, id, { pouredAt: '2025-03-01T09:59:00.000Z' }),
          'pouredAt',
          'Layer 2 cannot go on before layer 1',
        );
      });

      it('should refuse a time after the layer above', async () => {
        await expectRefused(
          () => store.correctLayer(WORKSHOP, pourId, { pouredAt: '2025-03-01T14:31:00.000Z' }),
          'pouredAt',
          'Layer 1 cannot go on after layer 2',
        );
      });

      it('should refuse a weighed amount of 0 g', async () => {
        await expectRefused(
          () => store.correctLayer(WORKSHOP, id, { weighedBG: 0 }),
          'weighedBG',
          'part B must be more than 0 g',
        );
      });
    });

    describe('taking back a layer', () => {
      it('should take back the top layer and the stock it drew', async () => {
        const id = await layer2({ weighedAG: 10.2, weighedBG: 10 });

        await store.takeBackLayer(WORKSHOP, id);

        expect((await db.pourLayers.get(id))?.deletedAt).not.toBeNull();
        expect(await stockOf(partA)).toBe(470.3);
        expect(await lastChange()).toEqual({ type: 'pourLayer.delete', mutationId: jasmine.any(String), recordId: id });
      });

      it('should refuse layer 1, which goes with its pour', async () => {
        await expectRefused(() => store.takeBackLayer(WORKSHOP, pourId), 'number', 'delete the pour');
      });

      it('should refuse a layer with another on top of it', async () => {
        const id = await layer2();
        await store.recordLayer(WORKSHOP, { pourId, number: 3, pouredAt: '2025-03-01T19:00:00.000Z', roomTempC: 20 });

        await expectRefused(() => store.takeBackLayer(WORKSHOP, id), 'number', 'take back layer 3 first');
      });
    });

    describe('re-planning the layers', () => {
      it('should split the depth left again and draw what it now needs', async () => {
        await store.replanPour(WORKSHOP, pourId, 5);

        expect((await db.pours.get(pourId))?.layerCount).toBe(5);
        // 8 mm left in 4 layers of 2 mm: 10 mL, 4.95 g a part, rounded up to the 0.1 g scale = 5.0 g;
        // 9.9 + 4 × 5.0 = 29.9 g of each part.
        expect(await stockOf(partA)).toBe(470.1);
        expect(await lastChange()).toEqual(
          jasmine.objectContaining({ type: 'pour.patch', recordId: pourId, data: { layerCount: 5 } }),
        );
      });

      it('should refuse a count that leaves depth with no layer to pour it', async () => {
        await expectRefused(() => store.replanPour(WORKSHOP, pourId, 1), 'layerCount', 'keep at least one more layer');
      });

      it('should refuse more layers than a pour can have', async () => {
        await expectRefused(() => store.replanPour(WORKSHOP, pourId, 51), 'layerCount', 'at most 50 layers');
      });
    });

    describe('deleting the pour', () => {
      it('should take its layers, its stock and its cost back at once', async () => {
        const id = await layer2({ weighedAG: 10.2, weighedBG: 10 });

        await store.remove('pour', WORKSHOP, pourId);

        expect((await db.pourLayers.get(id))?.deletedAt).not.toBeNull();
        expect((await db.pourLayers.get(pourId))?.deletedAt).not.toBeNull();
        expect(await stockOf(partA)).toBe(500);
        expect(await stockOf(partB)).toBe(500);
        expect(await costOfPour()).toBe(0);
      });
    });
  });
});
