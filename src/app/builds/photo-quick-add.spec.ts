import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { chooseFiles, eventually, pictureFile } from '../photos/photos-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { WORKSHOP_ID, buildsTestProviders, signIn } from './builds-testing';
import { PhotoQuickAdd } from './photo-quick-add';

describe('PhotoQuickAdd', () => {
  let fixture: ComponentFixture<PhotoQuickAdd>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let store: OfflineStore;

  function configure(role: Parameters<typeof signIn>[0]): void {
    signIn(role);
    TestBed.configureTestingModule({
      imports: [PhotoQuickAdd],
      providers: buildsTestProviders('photo-quick-add-spec'),
    });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
  }

  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  async function render(): Promise<void> {
    fixture = TestBed.createComponent(PhotoQuickAdd);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function text(selector: string): string {
    return (query(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  async function settle(what: string, check: () => unknown): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  describe('for a builder', () => {
    let harbour: string;
    let canal: string;

    beforeEach(async () => {
      configure('builder');
      harbour = await store.create('build', WORKSHOP_ID, { name: 'Harbour', scaleRatio: 87.1, status: 'building' });
      canal = await store.create('build', WORKSHOP_ID, { name: 'Canal lock', scaleRatio: 76.2, status: 'building' });
      await db.builds.update(harbour, { updatedAt: new Date(Date.now() - 86_400_000).toISOString() });
      await db.builds.update(canal, { updatedAt: new Date(Date.now() - 3_600_000).toISOString() });
      const happenedAt = new Date(Date.now() - 60_000).toISOString();
      await store.create('step', WORKSHOP_ID, { buildId: harbour, kind: 'painting', title: 'Gloss', happenedAt });
    });

    it('should add the photo to the build worked on last, and say where it went', async () => {
      await render();
      await settle(
        'the build worked on last',
        () => query('[data-action="take-photo"]')?.getAttribute('aria-label') === 'Take a photo for Harbour',
      );
      const select = await loader.getHarness(MatSelectHarness);
      expect(await select.getValueText()).toBe('Harbour (worked on last)');
      expect(await (await loader.getHarness(MatButtonHarness.with({ text: /Take a photo/ }))).getText()).toBe(
        'Take a photo',
      );
      expect(query('[data-action="take-photo"]')?.getAttribute('aria-label')).toBe('Take a photo for Harbour');

      chooseFiles(query('[data-field="library"]') as HTMLInputElement, [await pictureFile('gloss.jpg')]);

      await settle('the note', () => query('[data-state="photos-added"]'));
      expect(text('[data-state="photos-added"]')).toBe('The photo was added to Harbour.');
      const open = await loader.getHarness(MatButtonHarness.with({ text: 'Open Harbour' }));
      expect(await (await open.host()).getAttribute('href')).toBe(`/builds/${harbour}#photos`);
      const [photo] = await db.photos.toArray();
      expect(photo?.buildId).toBe(harbour);
      expect(await db.photoUploads.count()).toBe(1);
    });

    it('should add photos to another build chosen', async () => {
      await render();
      await settle(
        'the build worked on last',
        () => query('[data-action="take-photo"]')?.getAttribute('aria-label') === 'Take a photo for Harbour',
      );

      await (await loader.getHarness(MatSelectHarness)).clickOptions({ text: 'Canal lock' });
      chooseFiles(query('[data-field="library"]') as HTMLInputElement, [
        await pictureFile('lock.jpg'),
        await pictureFile('gates.png', 'image/png'),
      ]);

      await settle('the note', () => query('[data-state="photos-added"]'));
      expect(text('[data-state="photos-added"]')).toBe('2 photos were added to Canal lock.');
      await eventually(async () => (await db.photos.where('buildId').equals(canal).count()) === 2, 'two photos');
    });
  });

  it('should send a builder with no builds to start one', async () => {
    configure('builder');
    await render();
    await settle('the empty state', () => query('[data-state="no-builds"]'));

    const start = await loader.getHarness(MatButtonHarness.with({ text: 'New build' }));
    expect(await (await start.host()).getAttribute('href')).toBe('/builds/new');
  });

  it('should tell a viewer they cannot add photos, offering no way to', async () => {
    configure('viewer');
    await store.create('build', WORKSHOP_ID, { name: 'Harbour', scaleRatio: 87.1, status: 'building' });
    await render();
    await settle('the read-only note', () => query('[data-state="read-only"]'));

    expect(text('[data-state="read-only"]')).toBe(
      'Your role in River Club lets you look at its builds and their photos, not add to them.',
    );
    expect(query('bt-photo-picker')).toBeNull();
  });
});
