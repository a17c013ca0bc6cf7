import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { chooseFiles, jpegTaken, pictureFile } from '../photos/photos-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import type { LocalStep } from '../sync/synced-records';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildLog } from './build-log';
import { WORKSHOP_ID, buildsTestProviders, signIn } from './builds-testing';
import { StepForm } from './step-form';

@Component({
  imports: [StepForm],
  providers: [BuildLog],
  template: `<bt-step-form [buildId]="buildId()" [step]="step()" (saved)="saved.push($event)" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class StepFormHost {
  readonly buildId = input.required<string>();
  readonly step = input<LocalStep>();
  readonly saved: string[] = [];
}

describe('StepForm', () => {
  let fixture: ComponentFixture<StepFormHost>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let buildId: string;

  beforeEach(async () => {
    signIn('builder');
    TestBed.configureTestingModule({ imports: [StepFormHost], providers: buildsTestProviders('step-form-spec') });
    db = TestBed.inject(BenchDb);
    buildId = await TestBed.inject(OfflineStore).create('build', WORKSHOP_ID, {
      name: 'Harbour',
      scaleRatio: 87.1,
      status: 'building',
    });
    await db.outbox.clear();
  });
  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  async function render(step?: LocalStep): Promise<void> {
    fixture = TestBed.createComponent(StepFormHost);
    fixture.componentRef.setInput('buildId', buildId);
    if (step) fixture.componentRef.setInput('step', step);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  async function choose(files: File[]): Promise<void> {
    const count = chosen().length;
    const library = (fixture.nativeElement as HTMLElement).querySelector<HTMLInputElement>('[data-field="library"]')!;
    chooseFiles(library, files);
    await until(() => {
      fixture.detectChanges();
      return chosen().length > count;
    }, 'the photos to be read');
    await fixture.whenStable();
  }

  function chosen(): HTMLElement[] {
    return Array.from(
      (fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>('[data-field="photo-to-add"]'),
    );
  }

  async function when(): Promise<MatInputHarness> {
    return loader.getHarness(MatInputHarness.with({ selector: '[data-field="when"]' }));
  }

  async function whenHint(): Promise<string> {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'When' }));
    return (await field.getTextHints()).join(' ');
  }

  async function fillAndSave(label: string): Promise<void> {
    await (await loader.getHarness(MatSelectHarness)).clickOptions({ text: 'Water pour' });
    await (await loader.getHarness(MatInputHarness.with({ selector: '[data-field="title"]' }))).setValue('Poured');
    await (await loader.getHarness(MatButtonHarness.with({ text: label }))).click();
    await until(() => fixture.componentInstance.saved.length > 0, 'the step to be saved');
  }

  describe('a new step with photos', () => {
    it('should take the time the earliest photo was taken, say so, and store the step and its photos together', async () => {
      await render();

      await choose([
        await jpegTaken('later.jpg', '2025:03:01 09:30:00'),
        await jpegTaken('earliest.jpg', '2025:02:28 16:45:00'),
        await pictureFile('no-time.png', 'image/png'),
      ]);

      expect(await (await when()).getValue()).toBe('2025-02-28T16:45');
      expect(await whenHint()).toBe('From the earliest photo, taken 28 Feb 2025, 16:45');
      expect(chosen().map((item) => item.textContent?.replace(/\s+/g, ' ').trim())).toEqual([
        'later.jpg, taken 1 Mar 2025, 09:30 Remove',
        'earliest.jpg, taken 28 Feb 2025, 16:45 Remove',
        'no-time.png Remove',
      ]);

      await fillAndSave('Log step');

      const [stepId] = fixture.componentInstance.saved;
      const step = await db.steps.get(stepId!);
      expect(step?.happenedAt).toBe(new Date(2025, 1, 28, 16, 45).toISOString());
      const photos = await db.photos.where('stepId').equals(stepId!).toArray();
      expect(photos.map((photo) => photo.takenAt)).toEqual(
        jasmine.arrayWithExactContents([
          new Date(2025, 2, 1, 9, 30).toISOString(),
          new Date(2025, 1, 28, 16, 45).toISOString(),
          null,
        ]),
      );
      expect(await db.photoUploads.count()).toBe(3);
      expect((await db.outbox.toArray()).map((row) => row.mutation.type)).toEqual(['step.create']);
      expect(chosen()).toEqual([]);
    });

    it('should keep a time the modeller set by hand', async () => {
      await render();
      await (await when()).setValue('2025-03-05T08:00');

      await choose([await jpegTaken('old.jpg', '2024:11:02 10:00:00')]);

      expect(await (await when()).getValue()).toBe('2025-03-05T08:00');
      expect(await whenHint()).toBe('Now, unless you change it');
    });

    it('should go back to now when the photo the time came from is removed', async () => {
      await render();
      await choose([await jpegTaken('old.jpg', '2024:11:02 10:00:00')]);
      expect(await (await when()).getValue()).toBe('2024-11-02T10:00');

      await (await loader.getHarness(MatButtonHarness.with({ text: 'Remove' }))).click();

      expect(chosen()).toEqual([]);
      const now = Date.parse(await (await when()).getValue());
      expect(Math.abs(now - Date.now())).toBeLessThan(2 * 60_000);
      expect(await whenHint()).toBe('Now, unless you change it');
    });

    it('should leave the time at now when no photo says when it was taken', async () => {
      await render();

      await choose([await pictureFile('screenshot.png', 'image/png')]);

      expect(Math.abs(Date.parse(await (await when()).getValue()) - Date.now())).toBeLessThan(2 * 60_000);
      expect(await whenHint()).toBe('Now, unless you change it');
    });
  });

  describe('a step already logged', () => {
    it('should keep its time and store the photos added with it', async () => {
      const stepId = await TestBed.inject(OfflineStore).create('step', WORKSHOP_ID, {
        buildId,
        kind: 'painting',
        title: 'Base coat',
        happenedAt: '2025-03-03T10:00:00.000Z',
      });
      await render((await db.steps.get(stepId))!);

      await choose([await jpegTaken('coat.jpg', '2025:03:01 09:30:00')]);
      await (await loader.getHarness(MatButtonHarness.with({ text: 'Save step' }))).click();
      await until(() => fixture.componentInstance.saved.length > 0, 'the step to be saved');

      expect((await db.steps.get(stepId))?.happenedAt).toBe('2025-03-03T10:00:00.000Z');
      expect((await db.photos.where('stepId').equals(stepId).toArray()).length).toBe(1);
    });
  });
});
