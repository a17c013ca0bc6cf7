import type { HttpTestingController, TestRequest } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { MaterialDataSheetInput, MutationResult, PullAnswer } from '@benchtide/shared';
import type Dexie from 'dexie';
import type { LocalBuild } from './synced-records';

/**
 * For the sync specs: IndexedDB answers on its own schedule, so a spec waits turn by turn for what it
 * expects. A message-channel turn is not a timer, so jasmine.clock does not hold it back.
 */
export function nextTask(): Promise<void> {
  return new Promise((resolve) => {
    const channel = new MessageChannel();
    channel.port1.onmessage = () => resolve();
    channel.port2.postMessage(null);
  });
}

/** Waits until `check` gives something other than undefined, null or false; fails after 4.5 s, inside the 5 s a spec may take. */
export async function until<T>(check: () => T | undefined | null | false, what: string): Promise<T> {
  const giveUpAt = performance.now() + 4_500;
  while (performance.now() < giveUpAt) {
    const value = check();
    if (value !== undefined && value !== null && value !== false) return value;
    await nextTask();
  }
  throw new Error(`Gave up waiting for ${what}`);
}

/**
 * Invented data sheet for the pour specs, not any maker's figures: 1:1 by weight with part densities 1.1 and
 * 0.9 g/mL, so that 100 × 50 × 4 mm (20 mL) weighs 20 / (0.5/1.1 + 0.5/0.9) = 19.8 g, 9.9 g a part
 * (worked example by hand).
 */
export const TEST_DATA_SHEET: MaterialDataSheetInput = {
  mixRatio: { basis: 'weight', partA: 1, partB: 1 },
  densityAGPerMl: 1.1,
  densityBGPerMl: 0.9,
  potLifeMin: 30,
  recoatMin: 240,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 10,
};

/** A build as the server sends it in a pull. */
export function serverBuild(workshopId: string, id: string, changeNumber: number, more: Partial<LocalBuild> = {}) {
  return {
    id,
    workshopId,
    createdAt: '2025-03-01T09:00:00.000Z',
    updatedAt: '2025-03-01T09:00:00.000Z',
    deletedAt: null,
    changeNumber,
    name: 'Harbour diorama',
    scaleRatio: 87,
    scaleId: null,
    baseWidthMm: null,
    baseDepthMm: null,
    realWidthMm: null,
    realDepthMm: null,
    status: 'planning',
    notes: '',
    createdBy: null,
    ...more,
  } satisfies LocalBuild;
}

/**
 * Deletes a spec's database without being held up: live queries stop with the test module, and an empty
 * read-write transaction over every table ends only after the transactions begun before it.
 */
export async function dropDatabase(db: Dexie): Promise<void> {
  TestBed.resetTestingModule();
  await db.transaction('rw', db.tables, () => undefined);
  await db.delete();
}

export const NOTHING_NEW: PullAnswer = { startOver: false, changes: [], cursor: 0, more: false };

/** The server's side of the two sync routes, answered by hand in a spec. */
export class SyncServer {
  constructor(private readonly http: HttpTestingController) {}

  /** The next push; given a workshop, only a push to it matches. */
  nextPush(workshopId?: string): Promise<TestRequest> {
    const expected = (request: { method: string; url: string; body: unknown }) =>
      request.method === 'POST' &&
      request.url === '/api/sync/push' &&
      (workshopId === undefined || (request.body as { workshopId?: string }).workshopId === workshopId);
    return until(() => this.http.match(expected)[0], `a push${workshopId === undefined ? '' : ' to ' + workshopId}`);
  }

  /** The next pull; given a workshop and cursor, only a pull from there for a page of 1000 matches. */
  nextPull(workshopId?: string, after?: number): Promise<TestRequest> {
    const url = `/api/sync/pull?workshopId=${workshopId}&after=${after}&limit=1000`;
    const expected = (request: { url: string; urlWithParams: string }) =>
      workshopId === undefined ? request.url === '/api/sync/pull' : request.urlWithParams === url;
    return until(() => this.http.match(expected)[0], `a pull after ${after ?? 'any cursor'}`);
  }

  /** Answers a push, each change applied except those at the indexes given, which are refused for `reason`. */
  answer(push: TestRequest, reason?: MutationRejection, rejectedAt: readonly number[] = []): void {
    const mutations = push.request.body.mutations as { mutationId: string }[];
    const results: MutationResult[] = mutations.map(({ mutationId }, index) =>
      reason !== undefined && rejectedAt.includes(index)
        ? { mutationId, status: 'rejected', reason }
        : { mutationId, status: 'applied', changeNumber: index + 1 },
    );
    push.flush({ results });
  }

  /** Applies every change in the next push, then has nothing new for the pull after it. */
  async acceptAll(): Promise<void> {
    this.answer(await this.nextPush());
    (await this.nextPull()).flush(NOTHING_NEW);
  }
}

type MutationRejection = Extract<MutationResult, { status: 'rejected' }>['reason'];
