import { TestBed } from '@angular/core/testing';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { OfflineStore } from './offline-store';
import { dropDatabase, serverBuild } from './sync-testing';

const WORKSHOP = v7();
const REASON = { code: 'forbidden', message: 'Viewers cannot change builds.' };

describe('discarding a rejected change', () => {
  let db: BenchDb;
  let store: OfflineStore;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [{ provide: BENCH_DB_NAME, useValue: `discard-change-spec-${v7()}` }],
    });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
  });
  afterEach(async () => {
    await dropDatabase(db);
  });

  /** Marks the latest change to the record as refused by the server. */
  async function reject(recordId: string): Promise<number> {
    const rows = await db.outbox.toArray();
    const seq = rows.reverse().find((row) => row.undo.some((undo) => undo.id === recordId))?.seq;
    if (seq === undefined) throw new Error(`Nothing queued for ${recordId}`);
    await db.outbox.update(seq, { state: 'rejected', reason: REASON });
    return seq;
  }

  it('should remove a record whose creation was rejected', async () => {
    const id = await store.create('build', WORKSHOP, { name: 'Harbour', scaleRatio: 87, status: 'planning' });
    const seq = await reject(id);

    await store.discard(seq);

    expect(await db.builds.get(id)).toBeUndefined();
    expect(await db.outbox.count()).toBe(0);
  });

  it('should put back the fields a rejected change set, but not those a later change set', async () => {
    const id = v7();
    await db.builds.put(serverBuild(WORKSHOP, id, 7));
    await store.patch('build', WORKSHOP, id, { name: 'Harbour at dusk', notes: 'Gloss varnish' });
    await store.patch('build', WORKSHOP, id, { notes: 'Satin varnish' });
    const [first] = await db.outbox.toArray();
    await db.outbox.update(first?.seq ?? 0, { state: 'rejected', reason: REASON });

    await store.discard(first?.seq ?? 0);

    expect(await db.builds.get(id)).toEqual(
      jasmine.objectContaining({ name: 'Harbour diorama', notes: 'Satin varnish', pending: true }),
    );
    expect(await db.outbox.count()).toBe(1);
  });

  it('should bring back a record whose deletion was rejected', async () => {
    const id = v7();
    await db.builds.put(serverBuild(WORKSHOP, id, 7));
    await store.remove('build', WORKSHOP, id);

    await store.discard(await reject(id));

    expect(await db.builds.get(id)).toEqual(jasmine.objectContaining({ deletedAt: null, pending: false }));
  });

  it("should leave the server's copy as it is when it arrived after the change", async () => {
    const id = v7();
    await db.builds.put(serverBuild(WORKSHOP, id, 7));
    await store.patch('build', WORKSHOP, id, { name: 'Harbour at dusk' });
    const seq = await reject(id);
    await db.builds.put(serverBuild(WORKSHOP, id, 8, { name: 'Harbour by night' }));

    await store.discard(seq);

    expect((await db.builds.get(id))?.name).toBe('Harbour by night');
  });

  it('should not discard a change that is still waiting to be sent', async () => {
    const id = await store.create('build', WORKSHOP, { name: 'Harbour', scaleRatio: 87, status: 'planning' });
    const [row] = await db.outbox.toArray();

    await store.discard(row?.seq ?? 0);

    expect(await db.builds.get(id)).toBeDefined();
    expect(await db.outbox.count()).toBe(1);
  });
});
