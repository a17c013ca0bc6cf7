import { signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { v7 } from 'uuid';
import { BENCH_DB_NAME, BenchDb } from './bench-db';
import { LocalRecords } from './local-records';
import { OfflineStore } from './offline-store';
import { dropDatabase, until } from './sync-testing';

const WORKSHOP = v7();
const OTHER_WORKSHOP = v7();

describe('LocalRecords', () => {
  let db: BenchDb;
  let records: LocalRecords;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [{ provide: BENCH_DB_NAME, useValue: `local-records-spec-${v7()}` }] });
    db = TestBed.inject(BenchDb);
    records = TestBed.inject(LocalRecords);
  });
  afterEach(async () => {
    await dropDatabase(db);
  });

  it('should follow the workshop it is given', async () => {
    await TestBed.inject(OfflineStore).create('build', WORKSHOP, {
      name: 'Harbour',
      scaleRatio: 87,
      status: 'planning',
    });
    await TestBed.inject(OfflineStore).create('build', OTHER_WORKSHOP, {
      name: 'Canal lock',
      scaleRatio: 76,
      status: 'planning',
    });
    const workshopId = signal<string | null>(WORKSHOP);
    const builds = TestBed.runInInjectionContext(() => records.builds(workshopId));
    await until(() => builds().length === 1, 'the first workshop');
    expect(builds()[0]?.name).toBe('Harbour');

    workshopId.set(OTHER_WORKSHOP);

    await until(() => builds()[0]?.name === 'Canal lock', 'the other workshop');
    workshopId.set(null);
    await until(() => builds().length === 0, 'no workshop');
  });

  it("should list a build's steps oldest first, leaving out deleted ones and other builds'", async () => {
    const buildId = v7();
    const step = (title: string, createdAt: string, deletedAt: string | null = null) => ({
      ...{ id: v7(), workshopId: WORKSHOP, buildId, kind: 'painting' as const, title, notes: '' },
      ...{ happenedAt: createdAt, createdAt, updatedAt: createdAt, deletedAt, changeNumber: 1 },
    });
    await db.steps.bulkPut([
      step('Gloss coat', '2025-03-03T10:00:00.000Z'),
      step('Base coat', '2025-03-01T10:00:00.000Z'),
      step('Wrong photo', '2025-03-02T10:00:00.000Z', '2025-03-02T11:00:00.000Z'),
      { ...step('Sanding', '2025-03-01T09:00:00.000Z'), buildId: v7() },
    ]);

    const steps = TestBed.runInInjectionContext(() => records.steps(signal(buildId)));

    await until(() => steps().length > 0, 'the steps');
    expect(steps().map((s) => s.title)).toEqual(['Base coat', 'Gloss coat']);
  });
});
