import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { Router } from '@angular/router';
import { v7 } from 'uuid';
import { DevicePreferences } from '../core/device-preferences';
import { ScalePickerHarness } from '../scale-tools/scale-picker-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildEditor } from './build-editor';
import { WORKSHOP_ID, buildsTestProviders, signIn } from './builds-testing';

// Base = real / N and real = base × N (the definition of a 1:N scale); HO 1:87.1 and N 1:160 by NMRA S-1.2.
// The worked example: a 40 m × 12 m stretch of riverbank is 459 mm × 138 mm of base at 1:87.1 (40000 / 87.1 =
// 459.24, 12000 / 87.1 = 137.77), and 459.2 mm × 137.8 mm of base stands for 40.0 m × 12.0 m. At 1:160 a
// 250 mm × 100 mm base is 40 m × 16 m. 1 in = 25.4 mm and 1 ft = 304.8 mm exactly (NIST Handbook 44).

describe('BuildEditor', () => {
  let fixture: ComponentFixture<BuildEditor>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let store: OfflineStore;

  function configure(role: Parameters<typeof signIn>[0] = 'builder'): void {
    signIn(role);
    TestBed.configureTestingModule({ imports: [BuildEditor], providers: buildsTestProviders('build-editor-spec') });
    db = TestBed.inject(BenchDb);
    store = TestBed.inject(OfflineStore);
  }

  async function render(buildId?: string): Promise<void> {
    fixture = TestBed.createComponent(BuildEditor);
    if (buildId !== undefined) fixture.componentRef.setInput('buildId', buildId);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function text(selector: string): string {
    return (query(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  async function input(label: string): Promise<MatInputHarness> {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    const control = await field.getControl(MatInputHarness);
    if (!control) throw new Error(`No input labelled ${label}`);
    return control;
  }

  async function type(label: string, value: string): Promise<void> {
    await (await input(label)).setValue(value);
    await fixture.whenStable();
  }

  async function hint(label: string): Promise<string> {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    return (await field.getTextHints()).join(' ');
  }

  async function press(label: string | RegExp): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: label }))).click();
    await fixture.whenStable();
  }

  async function toggle(label: string): Promise<void> {
    await (await loader.getHarness(MatButtonToggleHarness.with({ text: label }))).check();
    await fixture.whenStable();
  }

  function scalePicker(): Promise<ScalePickerHarness> {
    return loader.getHarness(ScalePickerHarness);
  }

  function url(): string {
    return TestBed.inject(Router).url;
  }

  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  describe('a new build', () => {
    beforeEach(async () => {
      configure();
      await render();
    });

    it('should start at HO, planning, with the base size to type', async () => {
      expect(await (await scalePicker()).getScaleText()).toBe('HO · 1:87.1');
      expect(await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Planning' }))).isChecked()).toBeTrue();
      expect(await (await input('Base width')).getType()).toBe('text');
      expect(await (await (await input('Base width')).host()).getAttribute('inputmode')).toBe('decimal');
    });

    it('should work out the real footprint from the base size as it is typed', async () => {
      await type('Base width', '459.2');
      await type('Base depth', '137,8');

      expect(text('[data-result="worked"]')).toBe('Shows 40 m × 12 m of the real world at HO 1:87.1');
    });

    it('should work out the base from the real footprint', async () => {
      await toggle('Real footprint');
      await type('Real width', '40');
      await type('Real depth', '12');

      expect(text('[data-result="worked"]')).toBe('Needs a base of 459 mm × 138 mm at HO 1:87.1');
    });

    it('should work the footprint out again for another scale', async () => {
      await type('Base width', '250');
      await type('Base depth', '100');

      await (await scalePicker()).chooseScale('N · 1:160');

      expect(text('[data-result="worked"]')).toBe('Shows 40 m × 16 m of the real world at N 1:160');
    });

    it('should carry the sizes over when the other side is chosen for typing', async () => {
      await type('Base width', '250');
      await type('Base depth', '100');
      await (await scalePicker()).chooseScale('N · 1:160');

      await toggle('Real footprint');

      expect(await (await input('Real width')).getValue()).toBe('40');
      expect(await (await input('Real depth')).getValue()).toBe('16');
      expect(text('[data-result="worked"]')).toBe('Needs a base of 250 mm × 100 mm at N 1:160');
    });

    it('should save the build in the device store at once and open it', async () => {
      await type('Name', '  Riverbank ');
      await (await scalePicker()).chooseScale('N · 1:160');
      await toggle('Building');
      await type('Base width', '250');
      await type('Base depth', '100');
      await type('Notes', 'For the club show');

      await press('Save build');

      await until(() => url().startsWith('/builds/'), 'the build to open');
      const [build] = await db.builds.toArray();
      expect(url()).toBe(`/builds/${build?.id}`);
      expect(build).toEqual(
        jasmine.objectContaining({
          workshopId: WORKSHOP_ID,
          name: 'Riverbank',
          scaleRatio: 160,
          scaleId: 'n',
          status: 'building',
          baseWidthMm: 250,
          baseDepthMm: 100,
          realWidthMm: 40_000,
          realDepthMm: 16_000,
          notes: 'For the club show',
          pending: true,
        }),
      );
      const [queued] = await db.outbox.toArray();
      expect(queued?.mutation.type).toBe('build.create');
    });

    it('should save a ratio of the modeller’s own without a standard scale', async () => {
      await type('Name', 'Dockside');
      await (await scalePicker()).chooseScale('Other 1:N…');
      await (await scalePicker()).setRatio('100');
      await type('Base width', '400');

      await press('Save build');

      await until(() => url().startsWith('/builds/'), 'the build to open');
      const [build] = await db.builds.toArray();
      expect(build?.scaleRatio).toBe(100);
      expect(build?.scaleId ?? null).toBeNull();
      expect(build?.realWidthMm).toBe(40_000);
      expect(build?.baseDepthMm ?? null).toBeNull();
    });

    it('should explain each bad entry beside its field, keep what was typed and save nothing', async () => {
      await type('Base width', 'abc');
      await type('Base depth', '-5');

      await press('Save build');

      expect(await hint('Name')).toBe('Name is required');
      expect(await hint('Base width')).toBe('Base width must be a number');
      expect(await hint('Base depth')).toBe('Base depth must be more than 0 mm');
      expect(await (await input('Base width')).getValue()).toBe('abc');
      expect(url()).toBe('/');
      expect(await db.builds.count()).toBe(0);
      expect(await db.outbox.count()).toBe(0);
    });

    it('should say so when the scale cannot be read, and save nothing', async () => {
      await type('Name', 'Dockside');
      await (await scalePicker()).chooseScale('Other 1:N…');
      await (await scalePicker()).setRatio('0');

      await press('Save build');

      expect(text('[role="alert"]')).toContain('Type N of 1:N, a number above 0');
      expect(await db.builds.count()).toBe(0);
    });
  });

  describe('in inches', () => {
    it('should take the base in inches, show the footprint in feet and store millimetres', async () => {
      configure();
      TestBed.inject(DevicePreferences).update({ unitSystem: 'imperial', temperatureUnit: 'F' });
      await render();
      await type('Name', 'Yard');
      await type('Base width', '10');
      await type('Base depth', '5');

      expect(text('[data-result="worked"]')).toBe('Shows 72.6 ft × 36.3 ft of the real world at HO 1:87.1');
      await press('Save build');

      await until(() => url().startsWith('/builds/'), 'the build to open');
      const [build] = await db.builds.toArray();
      expect(build?.baseWidthMm).toBeCloseTo(254, 9);
      expect(build?.baseDepthMm).toBeCloseTo(127, 9);
    });
  });

  describe('a saved build', () => {
    let buildId: string;

    beforeEach(async () => {
      configure();
      buildId = await store.create('build', WORKSHOP_ID, {
        name: 'Harbour',
        scaleRatio: 87.1,
        scaleId: 'ho',
        status: 'building',
        baseWidthMm: 40_000 / 87.1,
        baseDepthMm: 12_000 / 87.1,
        realWidthMm: 40_000,
        realDepthMm: 12_000,
        notes: 'Low tide',
      });
      await db.outbox.clear();
      await render(buildId);
      await until(() => {
        fixture.detectChanges();
        return query('form');
      }, 'the saved build');
      await fixture.whenStable();
      expect(await (await input('Name')).getValue()).toBe('Harbour');
    });

    it('should fill the form from the saved build', async () => {
      expect(await (await input('Base width')).getValue()).toBe('459.2');
      expect(await (await input('Base depth')).getValue()).toBe('137.8');
      expect(await (await loader.getHarness(MatButtonToggleHarness.with({ text: 'Building' }))).isChecked()).toBeTrue();
      expect(text('[data-result="worked"]')).toBe('Shows 40 m × 12 m of the real world at HO 1:87.1');
    });

    it('should send only what changed, so the saved sizes stay exact', async () => {
      await toggle('Finished');
      await type('Name', 'Harbour at low tide');

      await press('Save changes');

      await until(() => url() === `/builds/${buildId}`, 'the build to open');
      const build = await db.builds.get(buildId);
      expect(build?.status).toBe('finished');
      expect(build?.baseWidthMm).toBe(40_000 / 87.1);
      const [queued] = await db.outbox.toArray();
      expect(queued?.mutation).toEqual(
        jasmine.objectContaining({ type: 'build.patch', data: { name: 'Harbour at low tide', status: 'finished' } }),
      );
    });

    it('should send every size again for a new scale', async () => {
      await (await scalePicker()).chooseScale('N · 1:160');

      await press('Save changes');

      await until(() => url() === `/builds/${buildId}`, 'the build to open');
      const build = await db.builds.get(buildId);
      expect(build?.scaleRatio).toBe(160);
      expect(build?.scaleId).toBe('n');
      expect(build?.baseWidthMm).toBe(40_000 / 87.1);
      expect(build?.realWidthMm).toBeCloseTo((40_000 / 87.1) * 160, 6);
    });

    it('should explain that a saved size cannot be emptied, and change nothing', async () => {
      await type('Base width', '');

      await press('Save changes');

      expect(await hint('Base width')).toBe('The saved width cannot be removed; type the width it should have');
      expect(await db.outbox.count()).toBe(0);
    });

    it('should delete the build only once the modeller confirms', async () => {
      await press('Delete build…');
      expect(text('.danger [role="alert"]')).toContain('Delete “Harbour”?');
      expect((await db.builds.get(buildId))?.deletedAt).toBeNull();

      await press('Yes, delete the build');

      await until(() => url() === '/builds', 'the Builds list');
      expect((await db.builds.get(buildId))?.deletedAt).not.toBeNull();
      const [queued] = await db.outbox.toArray();
      expect(queued?.mutation.type).toBe('build.delete');
    });

    it('should keep the build when the modeller thinks again', async () => {
      await press('Delete build…');
      await press('Keep it');

      expect(query('.danger [role="alert"]')).toBeNull();
      expect(await db.outbox.count()).toBe(0);
    });
  });

  describe('what cannot be edited', () => {
    it('should say a build not on this device is not here', async () => {
      configure();
      await render(v7());
      await until(() => {
        fixture.detectChanges();
        return query('[data-state="missing"]');
      }, 'the missing state');

      expect(text('[data-state="missing"]')).toContain('This build is not on this device');
      expect(query('form')).toBeNull();
    });

    it('should show a viewer no form at all', async () => {
      configure('viewer');
      await render();

      expect(text('[data-state="read-only"]')).toContain('viewers read, builders and owners write');
      expect(query('form')).toBeNull();
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Save/ }))).toEqual([]);
    });
  });
});
