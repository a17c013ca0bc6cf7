import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatChipListboxHarness } from '@angular/material/chips/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { DEFERENCE_NOTE } from '@benchtide/shared';
import { format } from 'date-fns';
import { v7 } from 'uuid';
import { BuildPhotos } from '../photos/build-photos';
import { chooseFiles, picked, pictureFile } from '../photos/photos-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildPage } from './build-page';
import {
  WORKSHOP_ID,
  buildsTestProviders,
  putContainer,
  putMaterial,
  putPour,
  putPourUse,
  signIn,
} from './builds-testing';

// The pour in builds-testing.ts, worked by hand: 100 mm × 50 mm × 4 mm = 20 000 mm³ = 20 mL (1 mL = 1000 mm³);
// at most 2 mm a layer gives ceil(4 / 2) = 2 layers of 2 mm; 10 mL a layer split 1 : 1 by volume is 5 mL of
// each part, 5 g at 1 g/mL; 20 g in all. The times are at the data sheet's own temperature, so unchanged:
// layer 2 at +4 h (recoat), full cure 24 h after the last layer. 40 m at 1:87.1 is 459 mm (NMRA S-1.2 ratio).

const WHEN = 'EEE d MMM yyyy, HH:mm';

describe('BuildPage', () => {
  let fixture: ComponentFixture<BuildPage>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let store: OfflineStore;
  let buildId: string;
  let pourStart: string;

  async function arrange(role: Parameters<typeof signIn>[0]): Promise<void> {
    signIn(role);
    TestBed.configureTestingModule({ imports: [BuildPage], providers: buildsTestProviders('build-page-spec') });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
    buildId = await store.create('build', WORKSHOP_ID, {
      name: 'Harbour',
      scaleRatio: 87.1,
      scaleId: 'ho',
      status: 'building',
      baseWidthMm: 40_000 / 87.1,
      baseDepthMm: 12_000 / 87.1,
      realWidthMm: 40_000,
      realDepthMm: 12_000,
      notes: 'Low tide, mud flats',
    });
    const at = (hoursAgo: number) => new Date(Date.now() - hoursAgo * 3_600_000).toISOString();
    await store.create('step', WORKSHOP_ID, {
      buildId,
      kind: 'base-and-terrain',
      title: 'Carved the foam',
      happenedAt: at(50),
    });
    await store.create('step', WORKSHOP_ID, {
      buildId,
      kind: 'painting',
      title: 'Dark water base',
      happenedAt: at(30),
    });
    await store.create('step', WORKSHOP_ID, {
      buildId,
      kind: 'detailing',
      title: 'Added the jetty',
      happenedAt: at(2),
    });
    const resin = await putMaterial(db, 'Clear casting resin');
    const euros = await putContainer(db, resin.id, 'EUR');
    pourStart = at(20);
    const pour = await putPour(db, buildId, resin.id, pourStart);
    await putPourUse(db, euros.id, pour.id, 1240);
    await db.outbox.clear();
  }

  async function render(id = buildId): Promise<void> {
    fixture = TestBed.createComponent(BuildPage);
    fixture.componentRef.setInput('buildId', id);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function settle(what: string, check: () => unknown): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function text(selector: string | Element | null): string {
    const element = typeof selector === 'string' ? query(selector) : selector;
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function entries(): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>('.timeline [data-entry]'));
  }

  function titles(): string[] {
    return entries().map((entry) => text(entry.querySelector('.title')));
  }

  async function filterBy(label: string): Promise<void> {
    const listbox = await loader.getHarness(MatChipListboxHarness);
    await listbox.selectChips({ text: label });
    await fixture.whenStable();
  }

  async function press(label: string | RegExp): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: label }))).click();
    await fixture.whenStable();
  }

  async function field(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function type(label: string, value: string): Promise<void> {
    await (await (await field(label)).getControl(MatInputHarness))?.setValue(value);
    await fixture.whenStable();
  }

  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  describe('for a builder', () => {
    beforeEach(async () => {
      await arrange('builder');
      await render();
      await settle('the whole log', () => entries().length === 4 && text('[data-field="cost"]').includes('€'));
    });

    it('should head the log with the scale, the base and the real footprint it shows', () => {
      expect(text('h1')).toBe('Harbour');
      expect(text('[data-field="scale"]')).toBe('HO 1:87.1');
      expect(text('[data-field="status"]')).toBe('Building');
      expect(text('[data-field="base"]')).toBe('459 mm × 138 mm');
      expect(text('[data-field="real"]')).toBe('40 m × 12 m');
      expect(text('[data-field="cost"]')).toBe('€12.40');
      expect(text('.header .notes')).toBe('Low tide, mud flats');
    });

    it('should list steps and pours together, newest first', () => {
      expect(titles()).toEqual(['Added the jetty', 'Clear casting resin', 'Dark water base', 'Carved the foam']);
      const pour = entries()[1]!;
      expect(text(pour.querySelector('[data-field="mixed"]'))).toBe('20.0 g mixed in all (20 mL)');
      expect(text(pour.querySelector('[data-field="layers"]'))).toBe('4 mm deep in 2 layers of 2 mm');
      expect(text(pour.querySelector('time'))).toContain(format(Date.parse(pourStart), WHEN));
      expect(text(entries()[0]!.querySelector('time'))).toContain('2 hours ago');
    });

    it('should show only the kind of entry chosen', async () => {
      await filterBy('Pours');
      expect(titles()).toEqual(['Clear casting resin']);

      await filterBy('Steps');
      expect(titles()).toEqual(['Added the jetty', 'Dark water base', 'Carved the foam']);

      await filterBy('Painting');
      expect(titles()).toEqual(['Dark water base']);

      await filterBy('Water pour');
      expect(titles()).toEqual([]);
      expect(text('[data-state="empty-log"]')).toBe('Nothing of this kind in the log.');

      await filterBy('All');
      expect(titles().length).toBe(4);
    });

    it('should log a step through the device store and show it at once', async () => {
      await press(/Log a step/);
      await (await loader.getHarness(MatSelectHarness)).clickOptions({ text: 'Water pour' });
      await type('What was done', 'Sealed the riverbed');
      await type('Notes', 'Two coats of white glue');

      await press('Log step');

      await settle('the new step', () => titles().includes('Sealed the riverbed'));
      expect(titles()[0]).toBe('Sealed the riverbed');
      expect(query('bt-step-form')).toBeNull();
      const step = (await db.steps.toArray()).find((saved) => saved.title === 'Sealed the riverbed');
      expect(step).toEqual(
        jasmine.objectContaining({ buildId, kind: 'water-pour', notes: 'Two coats of white glue', pending: true }),
      );
      expect(Math.abs(Date.parse(step!.happenedAt) - Date.now())).toBeLessThan(2 * 60_000);
      const [queued] = await db.outbox.toArray();
      expect(queued?.mutation.type).toBe('step.create');
    });

    it('should explain a step with no kind and no title, and save nothing', async () => {
      await press(/Log a step/);
      await type('When', '');

      await press('Log step');

      expect((await (await field('Kind of step')).getTextHints()).join()).toBe('Choose what kind of step this is');
      expect((await (await field('What was done')).getTextHints()).join()).toBe('Title is required');
      expect((await (await field('When')).getTextHints()).join()).toBe('When must be a date and time');
      expect(await db.outbox.count()).toBe(0);
    });

    it('should change a step and delete one once confirmed', async () => {
      const painting = entries().find((entry) => entry.dataset['kind'] === 'painting')!;
      await (
        await loader.getHarness(MatButtonHarness.with({ text: 'Change', ancestor: '[data-kind="painting"]' }))
      ).click();
      await fixture.whenStable();
      expect(painting.querySelector('bt-step-form')).not.toBeNull();
      await type('What was done', 'Dark water base, two shades');
      await press('Save step');
      await settle('the changed step', () => titles().includes('Dark water base, two shades'));

      await (
        await loader.getHarness(MatButtonHarness.with({ text: 'Delete…', ancestor: '[data-kind="detailing"]' }))
      ).click();
      await fixture.whenStable();
      expect(titles()).toContain('Added the jetty');
      await press('Yes, delete the step');

      await settle('the step gone', () => !titles().includes('Added the jetty'));
      const types = (await db.outbox.toArray()).map((row) => row.mutation.type);
      expect(types).toEqual(['step.patch', 'step.delete']);
    });

    // The pour was started 20 h ago; layer 2 was planned for 4 h after it (recoat) and has not been recorded.
    it('should show the layers as poured and to come, re-timed from now, beside the plan', () => {
      const pour = query('[data-entry="pour"]')!;
      expect(text(pour.querySelector('[data-field="layer-progress"]'))).toBe('1 of 2 layers poured');
      const second = pour.querySelector('[data-layer="2"]')!;
      const planned = format(Date.parse(pourStart) + 4 * 3_600_000, WHEN);
      expect(text(second)).toContain('expected');
      expect(text(second.querySelector('[data-field="planned-at"]'))).toBe(`(planned ${planned})`);
    });

    it('should add a layer to the pour, keeping layer 1 as poured', async () => {
      await (
        await loader.getHarness(MatButtonHarness.with({ text: 'Add a layer', ancestor: '[data-entry="pour"]' }))
      ).click();
      await settle('three layers', () => text('[data-field="layer-progress"]') === '1 of 3 layers poured');
      const types = (await db.outbox.toArray()).map((row) => row.mutation.type);
      expect(types).toEqual(['pour.patch']);
      expect((await db.pourLayers.toArray()).filter((layer) => layer.deletedAt === null).length).toBe(1);
    });

    it('should correct the note of a pour', async () => {
      await (
        await loader.getHarness(MatButtonHarness.with({ text: 'Correct…', ancestor: '[data-entry="pour"]' }))
      ).click();
      await fixture.whenStable();
      await type('Note of the pour', 'Tail race, tinted green');
      await press('Save correction');
      await settle('the corrected note', () => text('[data-entry="pour"] .notes') === 'Tail race, tinted green');
      const types = (await db.outbox.toArray()).map((row) => row.mutation.type);
      expect(types).toEqual(['pour.patch']);
    });

    it('should delete a pour once told what goes back, and its stock and cost with it', async () => {
      await (
        await loader.getHarness(MatButtonHarness.with({ text: 'Delete…', ancestor: '[data-entry="pour"]' }))
      ).click();
      await fixture.whenStable();
      // putPourUse drew 10 g of part A, costed 1240 cents.
      const confirm = text('[data-confirm="delete-pour"]');
      expect(confirm).toContain('The stock it drew goes back to the shelf: part A 10 g.');
      expect(confirm).toContain('12.40');
      expect(confirm).toContain('Its reminders are cancelled');
      await press('Delete the pour');

      await settle('the pour gone', () => entries().length === 3);
      expect(text('[data-field="cost"]')).toBe('no costed pours yet');
      const uses = (await db.ledgerEntries.toArray()).filter((use) => use.kind === 'pour-use');
      expect(uses.every((use) => use.deletedAt !== null)).toBeTrue();
      expect((await db.pourLayers.toArray()).every((layer) => layer.deletedAt !== null)).toBeTrue();
      const types = (await db.outbox.toArray()).map((row) => row.mutation.type);
      expect(types).toEqual(['pour.delete']);
    });

    it('should offer the pour screen for this build and the editor', async () => {
      const logPour = await loader.getHarness(MatButtonHarness.with({ text: /Log a pour/ }));
      const edit = await loader.getHarness(MatButtonHarness.with({ text: /Edit/ }));

      expect(await (await logPour.host()).getAttribute('href')).toBe(`/log-pour?build=${buildId}`);
      expect(await (await edit.host()).getAttribute('href')).toBe(`/builds/${buildId}/edit`);
    });

    it('should print a build sheet with the recipe of every pour and the usual cautions', async () => {
      const print = spyOn(window, 'print');

      await press(/Print build sheet/);

      expect(print).toHaveBeenCalledTimes(1);
      const recipe = text('bt-build-sheet [data-recipe]');
      expect(recipe).toContain('Pour 1: Clear casting resin');
      expect(recipe).toContain('Rectangle 100 mm × 50 mm (50 cm²)');
      expect(recipe).toContain('4 mm in 2 layers of 2 mm');
      expect(recipe).toContain('1 : 1 by volume; 20.0 g mixed in all (20 mL)');
      const rows = Array.from(query('bt-build-sheet tbody')!.querySelectorAll('tr')).map((row) =>
        Array.from(row.children).map((cell) => text(cell)),
      );
      expect(rows).toEqual([
        ['Part A', '5.0 g', '5 mL', '10.0 g'],
        ['Part B', '5.0 g', '5 mL', '10.0 g'],
      ]);
      const start = Date.parse(pourStart);
      expect(recipe).toContain(`Layer 2 poured ${format(start + 4 * 3_600_000, WHEN)}`);
      expect(recipe).toContain(`Full cure ${format(start + 28 * 3_600_000, WHEN)}`);
      expect(recipe).toContain('Safety data sheet: Maker’s sheet in the blue folder');
      expect(text('bt-build-sheet .cautions')).toContain(DEFERENCE_NOTE);
      expect(text('bt-build-sheet .steps')).toContain('Carved the foam');
    });
  });

  describe('for a viewer', () => {
    beforeEach(async () => {
      await arrange('viewer');
      await render();
      await settle('the whole log', () => entries().length === 4);
    });

    it('should show the whole log with no way to change it', async () => {
      expect(titles().length).toBe(4);
      const labels = await Promise.all(
        (await loader.getAllHarnesses(MatButtonHarness)).map((button) => button.getText()),
      );
      expect(labels.map((label) => label.trim())).toEqual(['All builds', 'Print build sheet']);
      expect(query('a[href*="log-pour"]')).toBeNull();
      expect(query('a[href$="/edit"]')).toBeNull();
      expect(query('bt-step-form')).toBeNull();
    });

    it('should still filter the log', async () => {
      await filterBy('Pours');

      expect(titles()).toEqual(['Clear casting resin']);
    });
  });

  describe('photos', () => {
    it("should show each step's and pour's photos in the log, add photos to a pour, and gather all in the gallery", async () => {
      await arrange('builder');
      const jetty = (await db.steps.toArray()).find((step) => step.title === 'Added the jetty')!;
      const photo = picked(await pictureFile('jetty.jpg'));
      await TestBed.inject(BuildPhotos).add(WORKSHOP_ID, { buildId, stepId: jetty.id }, [photo]);
      await render();
      await settle('the step photo', () => entries()[0]?.querySelector('bt-photo-strip [data-photo]'));

      const pour = entries()[1]!;
      expect(pour.dataset['entry']).toBe('pour');
      expect(pour.querySelector('[data-action="take-photo"]')?.getAttribute('aria-label')).toBe(
        `Take a photo of the pour of ${format(Date.parse(pourStart), WHEN)}`,
      );
      chooseFiles(pour.querySelector<HTMLInputElement>('[data-field="library"]')!, [await pictureFile('pour.jpg')]);

      await settle('the pour photo', () => entries()[1]?.querySelector('bt-photo-strip [data-photo]'));
      const [stored] = await db.photos
        .where('pourId')
        .anyOf((await db.pours.toArray()).map((p) => p.id))
        .toArray();
      expect(stored?.buildId).toBe(buildId);
      expect(text(entries()[0]!.querySelector('bt-photo-strip .state'))).toBe('Waiting to be sent');
      await settle('both in the gallery', () => query('#photos')?.querySelectorAll('[data-photo]').length === 2);
    });

    it('should give a viewer no way to add photos to a pour', async () => {
      await arrange('viewer');
      await render();
      await settle('the whole log', () => entries().length === 4);

      expect(query('bt-photo-picker')).toBeNull();
      expect(text('[data-state="no-photos"]')).toBe('No photos yet.');
    });
  });

  describe('other builds', () => {
    it('should say a build is not on this device and lead back to the list', async () => {
      await arrange('builder');
      await render(v7());
      await settle('the missing state', () => query('[data-state="missing"]'));

      expect(text('[data-state="missing"] h1')).toBe('This build is not on this device');
      const back = await loader.getHarness(MatButtonHarness.with({ text: 'Back to Builds' }));
      expect(await (await back.host()).getAttribute('href')).toBe('/builds');
      expect(query('.timeline')).toBeNull();
    });

    it('should say a pour logged here by an older version waits for its plan', async () => {
      await arrange('builder');
      const material = await putMaterial(db, 'Gloss medium', 'single-part-medium');
      await putPour(db, buildId, material.id, new Date().toISOString(), false);
      await render();
      await settle('the unplanned pour', () => query('[data-field="planned-here"]'));

      expect(text('[data-field="planned-here"]')).toBe(
        'Planned on this device: the amounts and times arrive once it syncs.',
      );
    });
  });
});
