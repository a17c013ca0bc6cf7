import { HttpErrorResponse, provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { OfflineStore } from './offline-store';
import { NOT_A_MEMBER, OutboxPush } from './outbox-push';
import { dropDatabase, SyncServer } from './sync-testing';

const WORKSHOP = v7();
const OTHER_WORKSHOP = v7();
const REASON = { code: 'conflict', message: 'This build was deleted on another device.' };

describe('OutboxPush', () => {
  let http: HttpTestingController;
  let server: SyncServer;
  let db: BenchDb;
  let store: OfflineStore;
  let outbox: OutboxPush;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: BENCH_DB_NAME, useValue: `outbox-push-spec-${v7()}` },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    server = new SyncServer(http);
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
    outbox = TestBed.inject(OutboxPush);
  });
  afterEach(async () => {
    http.verify();
    await dropDatabase(db);
  });

  async function createBuilds(names: readonly string[], workshopId = WORKSHOP): Promise<string[]> {
    const ids: string[] = [];
    for (const name of names)
      ids.push(await store.create('build', workshopId, { name, scaleRatio: 87, status: 'planning' }));
    return ids;
  }

  it("should send the workshop's waiting changes oldest first, and drop each one the server applied", async () => {
    await createBuilds(['Harbour', 'Canal lock']);
    await createBuilds(['Quarry'], OTHER_WORKSHOP);
    const rows = await db.outbox.where({ workshopId: WORKSHOP }).toArray();

    const pushed = outbox.push(WORKSHOP);
    const request = await server.nextPush();
    expect(request.request.body).toEqual({ workshopId: WORKSHOP, mutations: rows.map((row) => row.mutation) });
    server.answer(request);

    expect(await pushed).toBe('sent');
    expect(await db.outbox.where({ workshopId: WORKSHOP }).count()).toBe(0);
    expect(await db.outbox.where({ workshopId: OTHER_WORKSHOP }).count()).toBe(1);
  });

  it('should keep a rejected change with its reason and its record, and still apply the ones after it', async () => {
    const [, refused] = await createBuilds(['Harbour', 'Canal lock', 'Quarry']);
    const rows = await db.outbox.toArray();

    const pushed = outbox.push(WORKSHOP);
    server.answer(await server.nextPush(), REASON, [1]);
    await pushed;

    const left = await db.outbox.toArray();
    expect(left.length).toBe(1);
    expect(left[0]).toEqual(jasmine.objectContaining({ seq: rows[1]?.seq, state: 'rejected', reason: REASON }));
    expect(await db.builds.get(refused ?? '')).toEqual(jasmine.objectContaining({ name: 'Canal lock', pending: true }));
  });

  it('should not send a rejected change again until it is retried', async () => {
    await createBuilds(['Harbour']);
    const [row] = await db.outbox.toArray();
    await db.outbox.update(row?.seq ?? 0, { state: 'rejected', reason: REASON });

    expect(await outbox.push(WORKSHOP)).toBe('idle');

    http.expectNone('/api/sync/push');
  });

  it('should send at most 200 changes at a time, until none are waiting', async () => {
    const queuedAt = new Date().toISOString();
    await db.outbox.bulkAdd(
      Array.from({ length: 201 }, () => {
        const mutationId = v7();
        const mutation = { type: 'build.delete' as const, mutationId, recordId: v7() };
        return {
          mutationId,
          workshopId: WORKSHOP,
          mutation,
          queuedAt,
          attempts: 0,
          state: 'waiting' as const,
          undo: [],
        };
      }),
    );
    const rows = await db.outbox.toArray();

    const pushed = outbox.push(WORKSHOP);
    const first = await server.nextPush();
    expect(first.request.body.mutations.length).toBe(200);
    server.answer(first);
    const second = await server.nextPush();
    expect(second.request.body.mutations).toEqual([rows[200]?.mutation]);
    server.answer(second);
    await pushed;

    expect(await db.outbox.count()).toBe(0);
  });

  it('should keep every change, counted as tried once, when the server is unavailable', async () => {
    await createBuilds(['Harbour', 'Canal lock']);

    const pushed = outbox.push(WORKSHOP);
    const busy = { error: { code: 'unavailable', message: 'The server is busy. Try again in a moment.' } };
    (await server.nextPush()).flush(busy, { status: 503, statusText: 'Service Unavailable' });

    await expectAsync(pushed).toBeRejectedWith(jasmine.any(HttpErrorResponse));
    const rows = await db.outbox.toArray();
    expect(rows.map((row) => [row.state, row.attempts])).toEqual([
      ['waiting', 1],
      ['waiting', 1],
    ]);
  });

  it('should fail, keeping the change waiting, when the answer leaves a change out', async () => {
    await createBuilds(['Harbour', 'Canal lock']);
    const rows = await db.outbox.toArray();

    const pushed = outbox.push(WORKSHOP);
    const request = await server.nextPush();
    const [mutation] = request.request.body.mutations as { mutationId: string }[];
    request.flush({ results: [{ mutationId: mutation?.mutationId, status: 'applied', changeNumber: 1 }] });

    await expectAsync(pushed).toBeRejectedWithError(/did not answer for every change/);
    expect((await db.outbox.toArray()).map((row) => row.seq)).toEqual([rows[1]?.seq ?? 0]);
  });

  describe('when the account is no longer a member of the workshop', () => {
    const unknown = { error: { code: 'workshop_unknown', message: 'You are not a member of this workshop.' } };

    it("should mark every waiting change of that workshop refused with the reason, and leave others' alone", async () => {
      await createBuilds(['Harbour', 'Canal lock']);
      await createBuilds(['Quarry'], OTHER_WORKSHOP);
      const [, second] = await db.outbox.where({ workshopId: WORKSHOP }).toArray();
      await db.outbox.update(second?.seq ?? 0, { state: 'rejected', reason: REASON });

      const pushed = outbox.push(WORKSHOP);
      (await server.nextPush(WORKSHOP)).flush(unknown, { status: 404, statusText: 'Not Found' });

      expect(await pushed).toBe('not-a-member');
      const rows = await db.outbox.toArray();
      expect(rows.map((row) => [row.workshopId, row.state, row.reason])).toEqual([
        [WORKSHOP, 'rejected', NOT_A_MEMBER],
        [WORKSHOP, 'rejected', REASON],
        [OTHER_WORKSHOP, 'waiting', undefined],
      ]);
      expect(NOT_A_MEMBER.message).toBe(
        'You are no longer a member of this workshop, so this change cannot be saved there.',
      );
    });

    it('should treat any other 404 as a failed request, keeping the changes waiting', async () => {
      await createBuilds(['Harbour']);

      const pushed = outbox.push(WORKSHOP);
      const missing = { error: { code: 'not_found', message: 'There is no API route POST /api/sync/push.' } };
      (await server.nextPush()).flush(missing, { status: 404, statusText: 'Not Found' });

      await expectAsync(pushed).toBeRejectedWith(jasmine.any(HttpErrorResponse));
      expect((await db.outbox.toArray()).map((row) => row.state)).toEqual(['waiting']);
    });
  });
});
