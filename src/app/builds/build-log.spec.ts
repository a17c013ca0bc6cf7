import { TestBed } from '@angular/core/testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildLog, type BuildCard } from './build-log';
import {
  WORKSHOP_ID,
  buildsTestProviders,
  putContainer,
  putMaterial,
  putPour,
  putPourUse,
  signIn,
} from './builds-testing';

describe('BuildLog', () => {
  let db: BenchDb;
  let store: OfflineStore;

  function configure(role: Parameters<typeof signIn>[0]): BuildLog {
    signIn(role);
    TestBed.configureTestingModule({ providers: [BuildLog, ...buildsTestProviders('build-log-spec')] });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
    return TestBed.inject(BuildLog);
  }

  function settle<T>(what: string, check: () => T | undefined | null | false): Promise<T> {
    return until(() => {
      TestBed.tick();
      return check();
    }, what);
  }

  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  it('should say when it has read the records, even when there are none', async () => {
    const log = configure('builder');
    expect(log.loaded()).toBeFalse();

    await settle('the first answer', () => log.loaded());

    expect(log.builds()).toEqual([]);
  });

  it('should not count a pour planned for later as activity', async () => {
    const log = configure('builder');
    const buildId = await store.create('build', WORKSHOP_ID, { name: 'Harbour', scaleRatio: 87.1, status: 'building' });
    const updatedAt = '2025-03-01T09:00:00.000Z';
    await db.builds.update(buildId, { updatedAt });
    const resin = await putMaterial(db, 'Clear casting resin');
    await putPour(db, buildId, resin.id, '2025-03-05T09:00:00.000Z');
    await putPour(db, buildId, resin.id, new Date(Date.now() + 86_400_000).toISOString());
    const cards = TestBed.runInInjectionContext(() => log.cards());

    const card = await settle('the card', () => cards()[0]?.lastActivityAt !== updatedAt && cards()[0]);

    expect(card.lastActivityAt).toBe('2025-03-05T09:00:00.000Z');
  });

  it('should follow the stock books as containers and pours come and go', async () => {
    const log = configure('builder');
    const buildId = await store.create('build', WORKSHOP_ID, { name: 'Harbour', scaleRatio: 87.1, status: 'building' });
    const cards = TestBed.runInInjectionContext(() => log.cards());
    const costOf = (): BuildCard['costs'] | undefined => cards()[0]?.costs;
    await settle('the card', () => cards().length === 1);

    const resin = await putMaterial(db, 'Clear casting resin');
    const pounds = await putContainer(db, resin.id, 'GBP');
    const pour = await putPour(db, buildId, resin.id, '2025-03-05T09:00:00.000Z');
    await putPourUse(db, pounds.id, pour.id, 450);
    await settle('the cost', () => costOf()?.length === 1);
    expect(costOf()).toEqual([{ currency: 'GBP', minor: 450 }]);

    await db.pours.update(pour.id, { deletedAt: '2025-03-06T09:00:00.000Z' });

    await settle('no cost', () => costOf()?.length === 0);
  });

  it('should refuse to write without a workshop, before anything is stored', async () => {
    const log = configure(null);

    await expectAsync(log.createBuild({ name: 'Harbour', scaleRatio: 87.1, status: 'planning' })).toBeRejectedWithError(
      'Sign in and choose a workshop before changing builds.',
    );
    expect(await db.builds.count()).toBe(0);
    expect(await db.outbox.count()).toBe(0);
  });

  it('should give each role what the shared policy allows', () => {
    expect(configure('viewer').canWrite()).toBeFalse();
    TestBed.resetTestingModule();
    expect(configure('builder').canWrite()).toBeTrue();
  });
});
