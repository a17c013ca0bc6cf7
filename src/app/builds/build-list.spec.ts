import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { photoUrl } from '@benchtide/shared';
import { BuildPhotos } from '../photos/build-photos';
import { picked, pictureFile } from '../photos/photos-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildList } from './build-list';
import {
  WORKSHOP_ID,
  buildsTestProviders,
  putContainer,
  putMaterial,
  putPour,
  putPourUse,
  signIn,
} from './builds-testing';

// HO 1:87.1 by NMRA S-1.2; 1:35 is common practice for figures. Costs are summed from the stock book's
// pour-use entries as stored (integer cents); €12.40 and $3.00 are how en-US writes 1240 euro cents and 300 cents.

describe('BuildList', () => {
  let fixture: ComponentFixture<BuildList>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let store: OfflineStore;

  function configure(role: Parameters<typeof signIn>[0]): void {
    signIn(role);
    TestBed.configureTestingModule({ imports: [BuildList], providers: buildsTestProviders('build-list-spec') });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
  }

  /**
   * `unseen` keeps the screen out of the layout, so its lazy thumbnails are never fetched: the test server has
   * none, and a thumbnail that fails to load gives way to its "Shown when online" mark whenever the 404 comes.
   */
  async function render(unseen = false): Promise<void> {
    fixture = TestBed.createComponent(BuildList);
    if (unseen) (fixture.nativeElement as HTMLElement).style.display = 'none';
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function settle(what: string, check: () => boolean): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function cards(): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>('[data-build]'));
  }

  function text(element: Element | null): string {
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function field(card: HTMLElement, name: string): string {
    return text(card.querySelector(`[data-field="${name}"]`));
  }

  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  describe('for a builder', () => {
    beforeEach(() => configure('builder'));

    it('should show each build from the store as a card, the one worked on last first', async () => {
      const trench = await store.create('build', WORKSHOP_ID, {
        name: 'Flooded trench',
        scaleRatio: 35,
        scaleId: 'fig-35',
        status: 'planning',
      });
      const harbour = await store.create('build', WORKSHOP_ID, {
        name: 'Harbour at low tide',
        scaleRatio: 87.1,
        scaleId: 'ho',
        status: 'building',
      });
      await db.builds.update(trench, { updatedAt: new Date(Date.now() - 5 * 3_600_000).toISOString() });
      await db.builds.update(harbour, { updatedAt: new Date(Date.now() - 3 * 3_600_000).toISOString() });
      await render();
      await settle('two cards', () => cards().length === 2);

      const [first, second] = cards();
      expect(text(first!.querySelector('.name'))).toBe('Harbour at low tide');
      expect(field(first!, 'scale')).toBe('HO 1:87.1');
      expect(field(first!, 'status')).toBe('Building');
      expect(first!.querySelector('[data-field="status"] mat-icon')).not.toBeNull();
      expect(field(first!, 'activity')).toBe('Last activity 3 hours ago');
      expect(field(first!, 'cost')).toBe('No costed pours yet');
      expect(first!.getAttribute('href')).toBe(`/builds/${harbour}`);
      expect(text(second!.querySelector('.name'))).toBe('Flooded trench');
      expect(field(second!, 'scale')).toBe('1:35');
      expect(field(second!, 'status')).toBe('Planning');
      expect(field(second!, 'activity')).toBe('Last activity 5 hours ago');
    });

    it('should move a build up when a step is logged on it', async () => {
      const harbour = await store.create('build', WORKSHOP_ID, {
        name: 'Harbour',
        scaleRatio: 87.1,
        status: 'building',
      });
      const canal = await store.create('build', WORKSHOP_ID, {
        name: 'Canal lock',
        scaleRatio: 76.2,
        status: 'building',
      });
      await db.builds.update(harbour, { updatedAt: new Date(Date.now() - 2 * 86_400_000).toISOString() });
      await db.builds.update(canal, { updatedAt: new Date(Date.now() - 86_400_000).toISOString() });
      await render();
      await settle('the canal first', () => text(cards()[0]?.querySelector('.name') ?? null) === 'Canal lock');

      const happenedAt = new Date(Date.now() - 10 * 60_000).toISOString();
      await store.create('step', WORKSHOP_ID, {
        buildId: harbour,
        kind: 'painting',
        title: 'Dark water base',
        happenedAt,
      });

      await settle('the harbour first', () => text(cards()[0]?.querySelector('.name') ?? null) === 'Harbour');
      expect(field(cards()[0]!, 'activity')).toBe('Last activity 10 minutes ago');
      expect(field(cards()[1]!, 'activity')).toBe('Last activity 1 day ago');
    });

    it('should add up the cost of the stock its pours used, each currency on its own', async () => {
      const harbour = await store.create('build', WORKSHOP_ID, {
        name: 'Harbour',
        scaleRatio: 87.1,
        status: 'building',
      });
      const other = await store.create('build', WORKSHOP_ID, {
        name: 'Canal lock',
        scaleRatio: 76.2,
        status: 'building',
      });
      const resin = await putMaterial(db, 'Clear casting resin');
      const euros = await putContainer(db, resin.id, 'EUR');
      const dollars = await putContainer(db, resin.id, 'USD');
      const first = await putPour(db, harbour, resin.id, '2025-03-02T09:00:00.000Z');
      const second = await putPour(db, harbour, resin.id, '2025-03-03T09:00:00.000Z');
      const elsewhere = await putPour(db, other, resin.id, '2025-03-03T09:00:00.000Z');
      await putPourUse(db, euros.id, first.id, 1000);
      await putPourUse(db, euros.id, second.id, 240);
      await putPourUse(db, dollars.id, second.id, 300);
      await putPourUse(db, euros.id, elsewhere.id, 99_999);
      await render();

      const card = () => cards().find((element) => element.getAttribute('href') === `/builds/${harbour}`);
      await settle('the cost', () => card() !== undefined && field(card()!, 'cost').includes('€'));
      expect(field(card()!, 'cost')).toBe('Cost so far €12.40 + $3.00');
    });

    it('should follow a build deleted on this device', async () => {
      const harbour = await store.create('build', WORKSHOP_ID, {
        name: 'Harbour',
        scaleRatio: 87.1,
        status: 'building',
      });
      await store.create('build', WORKSHOP_ID, { name: 'Canal lock', scaleRatio: 76.2, status: 'building' });
      await render();
      await settle('two cards', () => cards().length === 2);

      await store.remove('build', WORKSHOP_ID, harbour);

      await settle('one card', () => cards().length === 1);
      expect(text(cards()[0]!.querySelector('.name'))).toBe('Canal lock');
    });

    it('should say what to do when there are no builds, with the action to start one', async () => {
      await render();
      await settle('the empty state', () => query('[data-state="empty"]') !== null);

      expect(text(query('[data-state="empty"] h2'))).toBe('No builds yet — start one');
      const start = await loader.getHarness(MatButtonHarness.with({ text: /New build/ }));
      expect(await (await start.host()).getAttribute('href')).toBe('/builds/new');
    });

    it("should show a build's cover photo, from the server's thumbnail, and none on a build without one", async () => {
      const harbour = await store.create('build', WORKSHOP_ID, {
        name: 'Harbour',
        scaleRatio: 87.1,
        status: 'building',
      });
      await store.create('build', WORKSHOP_ID, { name: 'Canal lock', scaleRatio: 76.2, status: 'building' });
      const photo = picked(await pictureFile('cover.jpg'), '2025-03-01T09:30:00.000Z');
      await TestBed.inject(BuildPhotos).add(WORKSHOP_ID, { buildId: harbour }, [photo]);
      await db.photoUploads.clear();
      await db.photos.update(photo.id, { caption: 'Low tide at the jetty', changeNumber: 3, pending: undefined });
      await store.patch('build', WORKSHOP_ID, harbour, { coverPhotoId: photo.id });
      // The cover shows before the photo's record is read and takes its caption after, so its thumbnail must stay.
      await render(true);

      const card = (name: string) => cards().find((element) => text(element.querySelector('.name')) === name);
      await settle(
        'the cover',
        () =>
          card('Harbour')?.querySelector('[data-field="cover"] img')?.getAttribute('alt') === 'Low tide at the jetty',
      );
      const cover = card('Harbour')!.querySelector<HTMLImageElement>('[data-field="cover"] img')!;
      expect(cover.getAttribute('src')).toBe(photoUrl(WORKSHOP_ID, photo.id, 'thumb'));
      expect(cover.getAttribute('loading')).toBe('lazy');
      expect(cover.alt).toBe('Low tide at the jetty');
      expect(card('Canal lock')?.querySelector('[data-field="cover"]')).toBeNull();
    });

    it('should mark a build saved here and not yet synced', async () => {
      await store.create('build', WORKSHOP_ID, { name: 'Harbour', scaleRatio: 87.1, status: 'building' });
      await render();
      await settle('the card', () => cards().length === 1);

      expect(field(cards()[0]!, 'pending')).toBe('Saved on this device, not yet synced');
    });
  });

  describe('for a viewer', () => {
    beforeEach(() => configure('viewer'));

    it('should list the builds with no action to start one', async () => {
      await store.create('build', WORKSHOP_ID, { name: 'Harbour', scaleRatio: 87.1, status: 'finished' });
      await render();
      await settle('the card', () => cards().length === 1);

      expect(field(cards()[0]!, 'status')).toBe('Finished');
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New build/ }))).toEqual([]);
    });

    it('should say who starts builds when there are none', async () => {
      await render();
      await settle('the empty state', () => query('[data-state="empty"]') !== null);

      expect(text(query('[data-state="empty"] h2'))).toBe('No builds here yet');
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /New build/ }))).toEqual([]);
    });
  });

  describe('without a workshop', () => {
    it('should send a modeller who is not signed in to sign in', async () => {
      configure('signed-out');
      await render();

      expect(query('[data-state="signed-out"]')).not.toBeNull();
      const signInLink = await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }));
      expect(await (await signInLink.host()).getAttribute('href')).toBe('/sign-in');
      expect(cards()).toEqual([]);
    });

    it('should send a modeller in no workshop to the Workshop screen', async () => {
      configure(null);
      await render();

      expect(query('[data-state="no-workshop"]')).not.toBeNull();
      const workshopLink = await loader.getHarness(MatButtonHarness.with({ text: 'Go to Workshop' }));
      expect(await (await workshopLink.host()).getAttribute('href')).toBe('/workshop');
    });
  });
});
