import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatProgressBarHarness } from '@angular/material/progress-bar/testing';
import { WORKSHOP_ID, buildsTestProviders, signIn } from '../builds/builds-testing';
import { BenchDb } from '../sync/bench-db';
import { OfflineStore } from '../sync/offline-store';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildPhotos } from './build-photos';
import { PhotoUploadList } from './photo-upload-list';
import { eventually, picked, pictureFile } from './photos-testing';

describe('PhotoUploadList', () => {
  let fixture: ComponentFixture<PhotoUploadList>;
  let loader: HarnessLoader;
  let db: BenchDb;
  let photos: BuildPhotos;
  let buildId: string;

  beforeEach(async () => {
    signIn('builder');
    TestBed.configureTestingModule({
      imports: [PhotoUploadList],
      providers: buildsTestProviders('photo-upload-list-spec'),
    });
    db = TestBed.inject(BenchDb);
    photos = TestBed.inject(BuildPhotos);
    buildId = await TestBed.inject(OfflineStore).create('build', WORKSHOP_ID, {
      name: 'Harbour',
      scaleRatio: 87.1,
      status: 'building',
    });
  });
  afterEach(async () => {
    await dropDatabase(db);
    localStorage.clear();
  });

  async function render(): Promise<void> {
    fixture = TestBed.createComponent(PhotoUploadList);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  function rows(): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>('[data-upload]'));
  }

  function text(node: Element | null | undefined): string {
    return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  async function settle(what: string, check: () => unknown): Promise<void> {
    await until(() => {
      fixture.detectChanges();
      return check();
    }, what);
    await fixture.whenStable();
  }

  async function queue(name: string): Promise<string> {
    const photo = picked(await pictureFile(name));
    await photos.add(WORKSHOP_ID, { buildId }, [photo]);
    return photo.id;
  }

  it('should show nothing while every photo is on the server', async () => {
    await render();

    expect((fixture.nativeElement as HTMLElement).querySelector('section')).toBeNull();
  });

  it('should list each photo not sent yet with its build, how far it got, and why it stopped', async () => {
    const waiting = await queue('waiting.jpg');
    const sending = await queue('sending.jpg');
    const refused = await queue('refused.jpg');
    await db.photoUploads.update(waiting, {
      lastError: { code: 'offline', message: 'No connection, so nothing was sent.', status: 0 },
    });
    await db.photoUploads.update(sending, { state: 'sending', bytesSent: 300, bytesTotal: 400 });
    await db.photoUploads.update(refused, {
      state: 'refused',
      lastError: { code: 'not_a_photo', message: 'This file is not a JPEG, PNG or WebP photo.', status: 415 },
    });
    await render();

    await settle('the three photos as they stand', () => rows()[2]?.dataset['uploadState'] === 'refused');

    expect(text((fixture.nativeElement as HTMLElement).querySelector('h2'))).toBe('Photos not sent yet (3)');
    expect(rows().map((row) => row.dataset['uploadState'])).toEqual(['waiting', 'sending', 'refused']);
    expect(text(rows()[0]?.querySelector('.what'))).toBe('waiting.jpg for Harbour');
    expect(rows().map((row) => text(row.querySelector('[data-field="upload-state"]')))).toEqual([
      'Waiting to be sent',
      'Sending 75 %',
      'Not sent',
    ]);
    expect(rows().map((row) => text(row.querySelector('[data-field="upload-reason"]')))).toEqual([
      'Last try: No connection, so nothing was sent.',
      '',
      'This file is not a JPEG, PNG or WebP photo.',
    ]);
    expect(await (await loader.getHarness(MatProgressBarHarness)).getValue()).toBe(75);
    // A photo on its way is left to finish; a file of the wrong kind is not sent again as it is.
    expect(await loader.getAllHarnesses(MatButtonHarness.with({ ancestor: `[data-upload="${sending}"]` }))).toEqual([]);
    expect(
      await loader.getAllHarnesses(
        MatButtonHarness.with({ ancestor: `[data-upload="${refused}"]`, text: 'Send again' }),
      ),
    ).toEqual([]);
  });

  it('should send a refused photo again, for a refusal that may not hold', async () => {
    const id = await queue('forbidden.jpg');
    await db.photoUploads.update(id, {
      state: 'refused',
      lastError: { code: 'forbidden', message: 'Viewers cannot add photos.', status: 403 },
    });
    await render();
    await settle('the refused photo', () => rows()[0]?.dataset['uploadState'] === 'refused');

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Send again' }))).click();

    await eventually(async () => (await db.photoUploads.get(id))?.state === 'waiting', 'the photo to wait again');
    await settle('the photo shown as waiting', () => rows()[0]?.dataset['uploadState'] === 'waiting');
  });

  it('should discard a photo only on a second tap, with its record', async () => {
    const id = await queue('unwanted.jpg');
    await render();
    await settle('the photo', () => rows().length === 1);

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Discard…' }))).click();
    expect(text(rows()[0]?.querySelector('.confirm'))).toBe('Discard it? The photo goes from this device.');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Keep it' }))).click();
    expect(await db.photoUploads.get(id)).toBeDefined();

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Discard…' }))).click();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Discard' }))).click();

    await settle('the list to empty', () => rows().length === 0);
    expect(await db.photos.get(id)).toBeUndefined();
  });
});
