import Dexie from 'dexie';
import { v7 } from 'uuid';
import { planPour } from '@benchtide/shared';
import { BenchDb, SCHEMA_V1, SCHEMA_V2, SCHEMA_V3 } from './bench-db';
import type { LocalBuild, OutboxRow } from './synced-records';
import { dropDatabase } from './sync-testing';

const WORKSHOP = v7();

const NOW = '2025-03-01T09:00:00.000Z';

function build(id: string): LocalBuild {
  const now = NOW;
  return {
    id,
    workshopId: WORKSHOP,
    createdAt: now,
    updatedAt: now,
    deletedAt: null,
    changeNumber: 0,
    pending: true,
    name: 'Harbour diorama',
    scaleRatio: 87,
    status: 'planning',
    notes: '',
  };
}

function queued(recordId: string): Omit<OutboxRow, 'seq'> {
  return {
    mutationId: v7(),
    workshopId: WORKSHOP,
    mutation: { type: 'build.delete', mutationId: v7(), recordId },
    queuedAt: NOW,
    attempts: 0,
    state: 'waiting',
    undo: [],
  };
}

describe('BenchDb', () => {
  let name: string;
  let db: BenchDb;

  beforeEach(() => {
    name = `bench-db-spec-${v7()}`;
    db = new BenchDb(name);
  });
  afterEach(async () => {
    await dropDatabase(db);
  });

  describe('transactions', () => {
    it('should keep neither the record nor its outbox row when the transaction fails after writing both', async () => {
      const id = v7();

      const written = db.transaction('rw', [db.builds, db.outbox], async () => {
        await db.builds.add(build(id));
        await db.outbox.add(queued(id));
        throw new Error('The device ran out of space');
      });

      await expectAsync(written).toBeRejectedWithError('The device ran out of space');
      expect(await db.builds.get(id)).toBeUndefined();
      expect(await db.outbox.count()).toBe(0);
    });

    it('should keep both when the transaction completes', async () => {
      const id = v7();

      await db.transaction('rw', [db.builds, db.outbox], async () => {
        await db.builds.add(build(id));
        await db.outbox.add(queued(id));
      });

      expect(await db.builds.get(id)).toEqual(build(id));
      expect(await db.outbox.count()).toBe(1);
    });

    it('should refuse to queue the same mutation id twice', async () => {
      const row = queued(v7());
      await db.outbox.add(row);

      await expectAsync(db.outbox.add({ ...row })).toBeRejectedWith(
        jasmine.objectContaining({ name: 'ConstraintError' }),
      );
      expect(await db.outbox.count()).toBe(1);
    });
  });

  describe('upgrading from version 1', () => {
    it('should mark outbox rows written by version 1 as waiting, with nothing to undo', async () => {
      const old = new Dexie(name);
      old.version(1).stores(SCHEMA_V1);
      const { state: _state, undo: _undo, ...v1Row } = queued(v7());
      const seq = await old.table('outbox').add(v1Row);
      old.close();

      const upgraded = await db.outbox.get(seq as number);

      expect(db.verno).toBe(4);
      expect(upgraded).toEqual({ ...v1Row, seq: seq as number, state: 'waiting', undo: [] });
      expect(await db.outbox.where('[workshopId+state]').equals([WORKSHOP, 'waiting']).count()).toBe(1);
    });

    it('should keep the records version 1 stored', async () => {
      const old = new Dexie(name);
      old.version(1).stores(SCHEMA_V1);
      const id = v7();
      await old.table('builds').add(build(id));
      old.close();

      expect(await db.builds.get(id)).toEqual(build(id));
    });
  });

  describe('upgrading from version 2', () => {
    it('should keep the records and the outbox, and add the photo tables, which keep a photo’s bytes', async () => {
      const old = new Dexie(name);
      old.version(2).stores(SCHEMA_V2);
      const id = v7();
      await old.table('builds').add(build(id));
      const seq = (await old.table('outbox').add(queued(id))) as number;
      old.close();

      const bytes = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3]);
      await db.photoUploads.add({
        id: v7(),
        workshopId: WORKSHOP,
        blob: new Blob([bytes], { type: 'image/jpeg' }),
        fileName: 'riverbed.jpg',
        fields: { buildId: id, stepId: null, pourId: null, caption: '' },
        state: 'waiting',
        attempts: 0,
        lastError: null,
        bytesSent: 0,
        bytesTotal: bytes.length,
        createdAt: NOW,
      });

      expect(db.verno).toBe(4);
      expect(await db.builds.get(id)).toEqual(build(id));
      expect((await db.outbox.get(seq))?.state).toBe('waiting');
      const [upload] = await db.photoUploads.where('[workshopId+state]').equals([WORKSHOP, 'waiting']).toArray();
      expect(new Uint8Array(await upload!.blob.arrayBuffer())).toEqual(bytes);
      expect(await db.photos.where('buildId').equals(id).count()).toBe(0);
    });
  });

  describe('upgrading from version 3', () => {
    // An invented data sheet: 1:1 by weight, 1 g/mL, at most 2 mm a layer. 100 × 50 × 4 mm is 20 mL in two
    // layers of 2 mm, 10 mL a layer: 5 g of each part (worked by hand, 1 mL = 1000 mm³).
    it('should give each pour held its layer 1, under the pour’s id, and its planned layer count', async () => {
      const planned = planPour({
        shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
        depthMm: 4,
        roomTempC: 18,
        startAtMs: Date.parse(NOW),
        scaleResolutionG: 0.1,
        material: {
          mixRatio: { basis: 'weight', partA: 1, partB: 1 },
          densityAGPerMl: 1,
          densityBGPerMl: 1,
          potLifeMin: 30,
          recoatMin: 240,
          demouldMin: 720,
          fullCureMin: 1440,
          referenceTempC: 20,
          minCureTempC: 15,
          maxLayerMm: 2,
        },
      });
      if (!planned.ok) throw new Error('The spec pour must plan');
      const { request, ...plan } = planned.plan;
      const old = new Dexie(name);
      old.version(3).stores(SCHEMA_V3);
      const pourId = v7();
      const {
        pending: _pending,
        name: _name,
        scaleRatio: _ratio,
        status: _status,
        notes: _notes,
        ...fields
      } = build(pourId);
      await old.table('pours').add({
        ...fields,
        buildId: v7(),
        stepId: null,
        materialId: v7(),
        startAt: NOW,
        request,
        plan,
        shortfall: [],
        note: 'Mill pond',
      });
      const waiting = v7();
      await old.table('pours').add({ ...fields, id: waiting, request: null, plan: null, startAt: NOW, note: '' });
      old.close();

      const [layer] = await db.pourLayers.where('pourId').equals(pourId).toArray();
      expect(layer).toEqual(
        jasmine.objectContaining({
          id: pourId,
          number: 1,
          pouredAt: NOW,
          roomTempC: 18,
          depthMm: 2,
          partAG: 5,
          partBG: 5,
        }),
      );
      expect((await db.pours.get(pourId))?.layerCount).toBe(2);
      expect((await db.pours.get(pourId))?.note).toBe('Mill pond');
      // One still waiting for its plan gets its layer 1 from the server with the plan.
      expect(await db.pourLayers.where('pourId').equals(waiting).count()).toBe(0);
      expect(await db.pours.get(waiting)).toBeDefined();
    });
  });
});
