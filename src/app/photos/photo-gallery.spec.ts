import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { photoUrl } from '@benchtide/shared';
import { format } from 'date-fns';
import { WORKSHOP_ID, buildsTestProviders, signIn } from '../builds/builds-testing';
import { BenchDb } from '../sync/bench-db';
import { LocalRecords } from '../sync/local-records';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildPhotos } from './build-photos';
import { PhotoGallery } from './photo-gallery';
import { chooseFiles, eventually, heicFile, picked, pictureFile } from './photos-testing';

/** The gallery as the build page holds it: the build and its photos read live from the device. */
@Component({
  imports: [PhotoGallery],
  template: `
    @if (build(); as build) {
      <bt-photo-gallery [workshopId]="workshopId" [build]="build" [entries]="photos()" [canWrite]="canWrite()" />
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class GalleryHost {
  readonly buildId = input.required<string>();
  readonly canWrite = input(true);
  protected readonly workshopId = WORKSHOP_ID;
  private readonly builds = inject(LocalRecords).builds(signal(WORKSHOP_ID));
  protected readonly build = computed(() => this.builds().find((build) => build.id === this.buildId()));
  protected readonly photos = inject(BuildPhotos).ofBuild(this.buildId);
}

describe('PhotoGallery', () => {
  let fixture: ComponentFixture<GalleryHost>;
  let loader: HarnessLoader;
  let root: HarnessLoader;
  let db: BenchDb;
  let photos: BuildPhotos;
  let buildId: string;

  beforeEach(async () => {
    signIn('builder');
    TestBed.configureTestingModule({ imports: [GalleryHost], providers: buildsTestProviders('photo-gallery-spec') });
    db = TestBed.inject(BenchDb);
    photos = TestBed.inject(BuildPhotos);
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

  async function render(canWrite = true): Promise<void> {
    fixture = TestBed.createComponent(GalleryHost);
    fixture.componentRef.setInput('buildId', buildId);
    fixture.componentRef.setInput('canWrite', canWrite);
    loader = TestbedHarnessEnvironment.loader(fixture);
    root = TestbedHarnessEnvironment.documentRootLoader(fixture);
    await fixture.whenStable();
  }

  async function settle(what: string, check: () => unknown): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  function element(): HTMLElement {
    return fixture.nativeElement as HTMLElement;
  }

  function tiles(): HTMLElement[] {
    return Array.from(element().querySelectorAll<HTMLElement>('[data-photo]'));
  }

  function text(node: Element | null): string {
    return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function buttons(): string[] {
    return Array.from(element().querySelectorAll('button')).map(text);
  }

  /** A photo the server holds: its record as pulled, no upload left. */
  async function sentPhoto(more: { caption?: string; takenAt?: string | null } = {}): Promise<string> {
    const photo = picked(await pictureFile('sent.jpg'), more.takenAt ?? '2025-03-01T09:30:00.000Z');
    await photos.add(WORKSHOP_ID, { buildId }, [photo]);
    await db.photoUploads.delete(photo.id);
    await db.photos.update(photo.id, { caption: more.caption ?? '', changeNumber: 3, pending: undefined });
    return photo.id;
  }

  describe('for a builder', () => {
    it('should add the photos chosen, say why one stays out, and show each as waiting to be sent', async () => {
      await render();
      await settle('the picker', () => element().querySelector('input[data-field="library"]'));
      const library = element().querySelector<HTMLInputElement>('input[data-field="library"]')!;
      expect(library.accept).toBe('image/jpeg,image/png,image/webp,image/heic');
      expect(library.multiple).toBeTrue();
      expect(element().querySelector<HTMLInputElement>('input[data-field="camera"]')?.getAttribute('capture')).toBe(
        'environment',
      );

      chooseFiles(library, [await pictureFile('riverbed.jpg'), heicFile('IMG_0042.HEIC')]);

      await settle('the photo added', () => tiles().length === 1);
      expect(text(element().querySelector('[data-state="photos-refused"]'))).toContain(
        '“IMG_0042.HEIC” is a HEIC photo, which Benchtide cannot read yet',
      );
      expect(tiles()[0]?.dataset['uploadState']).toBe('waiting');
      expect(text(tiles()[0]!.querySelector('[data-field="upload-state"]'))).toBe('Waiting to be sent');
      const [upload] = await db.photoUploads.toArray();
      expect(upload?.fileName).toBe('riverbed.jpg');
    });

    it('should show the bytes of the photo being sent', async () => {
      const photo = picked(await pictureFile('sending.jpg'));
      await photos.add(WORKSHOP_ID, { buildId }, [photo]);
      await db.photoUploads.update(photo.id, { state: 'sending', bytesSent: 512, bytesTotal: 2048 });
      await render();

      await settle(
        'the progress',
        () => text(element().querySelector('[data-field="upload-state"]')) === 'Sending 25 %',
      );
      expect(await (await loader.getHarness(MatProgressBarHarness)).getValue()).toBe(25);
    });

    it('should show a refused photo with the reason, send it again, and discard one only on a second tap', async () => {
      const [again, gone] = [picked(await pictureFile('again.jpg')), picked(await pictureFile('gone.jpg'))];
      await photos.add(WORKSHOP_ID, { buildId }, [again, gone]);
      const forbidden = { code: 'forbidden', message: 'Viewers cannot add photos.', status: 403 };
      await db.photoUploads.update(again.id, { state: 'refused', lastError: forbidden });
      const tooLarge = { code: 'photo_too_large', message: 'This photo is larger than 25 MB.', status: 413 };
      await db.photoUploads.update(gone.id, { state: 'refused', lastError: tooLarge });
      await render();
      await settle(
        'the refused photos',
        () => tiles().filter((tile) => tile.dataset['uploadState'] === 'refused').length === 2,
      );

      const reasons = tiles().map((tile) => text(tile.querySelector('[data-field="upload-reason"]')));
      expect(reasons).toEqual(jasmine.arrayWithExactContents([forbidden.message, tooLarge.message]));
      // A size does not change by sending again: only discarding is offered.
      expect(buttons().filter((label) => label === 'Send again').length).toBe(1);

      const button = (id: string, text: string) =>
        loader.getHarness(MatButtonHarness.with({ ancestor: `[data-photo="${id}"]`, text }));
      await (await button(again.id, 'Send again')).click();
      await eventually(async () => (await db.photoUploads.get(again.id))?.state === 'waiting', 'sent again');

      await (await button(gone.id, 'Discard…')).click();
      expect(await db.photoUploads.get(gone.id)).toBeDefined();
      await (await button(gone.id, 'Yes, discard it')).click();
      await settle('the discarded photo to go', () => tiles().length === 1);
      expect(await db.photos.get(gone.id)).toBeUndefined();
      expect(await db.photoUploads.get(gone.id)).toBeUndefined();
    });

    it('should show a photo not sent yet from its bytes on this device, and let the picture go when it leaves', async () => {
      const photo = picked(await pictureFile('local.jpg'));
      await photos.add(WORKSHOP_ID, { buildId }, [photo]);
      const revoke = spyOn(URL, 'revokeObjectURL').and.callThrough();
      await render();
      await settle('the thumbnail', () => element().querySelector('img'));

      const src = element().querySelector('img')!.src;
      expect(src).toMatch(/^blob:/);

      fixture.destroy();
      expect(revoke).toHaveBeenCalledWith(src);
    });

    it("should show a sent photo from the server's thumbnail, loaded lazily, described for those who cannot see it", async () => {
      const id = await sentPhoto({ takenAt: '2025-03-01T09:30:00.000Z' });
      await render();
      await settle('the thumbnail', () => element().querySelector('img'));

      const img = element().querySelector('img')!;
      expect(img.getAttribute('src')).toBe(photoUrl(WORKSHOP_ID, id, 'thumb'));
      expect(img.getAttribute('loading')).toBe('lazy');
      expect(img.alt).toBe(`Photo of Harbour, taken ${format('2025-03-01T09:30:00.000Z', 'd MMM yyyy, HH:mm')}`);
    });

    it('should change the caption, make the photo the cover and delete it (on a second tap) in the large view', async () => {
      const id = await sentPhoto();
      await render();
      await settle('the photo', () => tiles().length === 1);

      element().querySelector<HTMLButtonElement>('[data-photo] button.open')!.click();
      const dialog = await root.getHarness(MatDialogHarness);
      expect(await dialog.getTitleText()).toBe('Photo of Harbour');
      const large = document.querySelector<HTMLImageElement>('bt-photo-viewer img');
      expect(large?.getAttribute('src')).toBe(photoUrl(WORKSHOP_ID, id, 'display'));

      const caption = await dialog.getHarness(MatInputHarness);
      await caption.setValue('First layer, still tacky');
      await (await dialog.getHarness(MatButtonHarness.with({ text: 'Save caption' }))).click();
      await eventually(async () => (await db.outbox.count()) === 1, 'the caption change');
      expect((await db.outbox.toArray()).map((row) => row.mutation)).toEqual([
        jasmine.objectContaining({ type: 'photo.patch', recordId: id, data: { caption: 'First layer, still tacky' } }),
      ]);

      await (await dialog.getHarness(MatButtonHarness.with({ text: 'Use as cover' }))).click();
      await eventually(async () => (await db.builds.get(buildId))?.coverPhotoId === id, 'the cover');
      await settle('the cover mark', () => text(element().querySelector('[data-field="cover"]')) === 'Cover');

      await (await dialog.getHarness(MatButtonHarness.with({ text: 'Delete…' }))).click();
      expect((await db.photos.get(id))?.deletedAt).toBeNull();
      await (await dialog.getHarness(MatButtonHarness.with({ text: 'Yes, delete it' }))).click();
      await eventually(async () => (await root.getAllHarnesses(MatDialogHarness)).length === 0, 'the dialog to close');

      expect((await db.photos.get(id))?.deletedAt).toEqual(jasmine.any(String));
      expect((await db.outbox.toArray()).map((row) => row.mutation.type)).toEqual([
        'photo.patch',
        'build.patch',
        'build.patch',
        'photo.delete',
      ]);
      expect((await db.builds.get(buildId))?.coverPhotoId).toBeNull();
      await settle('the photo to leave the gallery', () => tiles().length === 0);
    });

    it('should not offer a photo not sent yet as the cover, and say when it can be', async () => {
      await photos.add(WORKSHOP_ID, { buildId }, [picked(await pictureFile('unsent.jpg'))]);
      await render();
      await settle('the photo', () => tiles().length === 1);

      element().querySelector<HTMLButtonElement>('[data-photo] button.open')!.click();
      const dialog = await root.getHarness(MatDialogHarness);

      expect(await dialog.getAllHarnesses(MatButtonHarness.with({ text: 'Use as cover' }))).toEqual([]);
      expect(await dialog.getText()).toContain("It can go on the build's card once it is sent.");
    });
  });

  describe('for a viewer', () => {
    it('should show the photos and their captions with no way to add, change or delete any', async () => {
      await sentPhoto({ caption: 'Low tide at the jetty' });
      const refused = picked(await pictureFile('refused.jpg'));
      await photos.add(WORKSHOP_ID, { buildId }, [refused]);
      await db.photoUploads.update(refused.id, {
        state: 'refused',
        lastError: { code: 'forbidden', message: 'Viewers cannot add photos.', status: 403 },
      });
      await render(false);
      await settle('the photos', () => tiles().length === 2);

      expect(element().querySelector('bt-photo-picker')).toBeNull();
      // Only the thumbnails themselves, which open the photos large.
      expect(element().querySelectorAll('button:not(.open)').length).toBe(0);
      const sent = tiles().find((tile) => tile.dataset['uploadState'] === 'sent')!;
      expect(sent.querySelector('img')?.alt).toBe('Low tide at the jetty');

      sent.querySelector<HTMLButtonElement>('button.open')!.click();
      const dialog = await root.getHarness(MatDialogHarness);
      expect(await dialog.getAllHarnesses(MatInputHarness)).toEqual([]);
      const labels = await Promise.all((await dialog.getAllHarnesses(MatButtonHarness)).map((b) => b.getText()));
      expect(labels).toEqual(['Close']);
      expect(await dialog.getText()).toContain('Low tide at the jetty');
    });
  });
});
