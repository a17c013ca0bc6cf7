import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { provideRouter } from '@angular/router';
import type { Mutation, SessionView } from '@benchtide/shared';
import { v7 } from 'uuid';
import { BenchIcons } from '../core/bench-icons';
import { InstallOffer } from '../core/install-offer';
import { fixesFor } from '../sync/change-fixes';
import { BENCH_DB_NAME, BenchDb } from '../sync/bench-db';
import { dropDatabase, until } from '../sync/sync-testing';
import { BuildPhotos } from '../photos/build-photos';
import { picked, pictureFile } from '../photos/photos-testing';
import { StorageHealth } from '../sync/storage-health';
import { SyncEngine } from '../sync/sync-engine';
import type { OutboxRow } from '../sync/synced-records';
import { DevicePage } from './device-page';

const SESSION_KEY = 'benchtide.session';

/** The engine's signals, set by each spec, and its actions as spies. */
class FakeEngine {
  readonly online = signal(true);
  readonly syncing = signal(false);
  readonly lastError = signal<string | null>(null);
  readonly sessionEnded = signal(false);
  readonly waitingCount = signal(0);
  readonly waiting = signal<OutboxRow[]>([]);
  readonly rejected = signal<OutboxRow[]>([]);
  readonly lastSyncedAt = signal<string | null>(null);
  readonly syncNow = jasmine.createSpy('syncNow').and.resolveTo();
  readonly retry = jasmine.createSpy('retry').and.resolveTo();
  readonly retryWith = jasmine.createSpy('retryWith').and.resolveTo();
  readonly discard = jasmine.createSpy('discard').and.resolveTo();
}

class FakeStorage {
  readonly persisted = signal<boolean | null>(null);
  readonly usage = signal<number | null>(null);
  readonly quota = signal<number | null>(null);
  readonly measure = jasmine.createSpy('measure').and.resolveTo();
  readonly keep = jasmine.createSpy('keep').and.resolveTo(true);
}

class FakeInstallOffer {
  readonly available = signal(false);
  readonly installed = signal(false);
  readonly install = jasmine.createSpy('install').and.resolveTo(true);
}

function signIn(): void {
  const session: SessionView = {
    account: { id: 'u-ada', email: 'ada@example.org', displayName: 'Ada Brush', emailVerified: true },
    workshops: [{ id: v7(), name: 'River Club', personal: false, role: 'builder', memberCount: 2 }],
  };
  localStorage.setItem(SESSION_KEY, JSON.stringify(session));
}

function pourCreate(): Mutation {
  return {
    type: 'pour.create',
    mutationId: v7(),
    data: {
      id: v7(),
      buildId: v7(),
      materialId: v7(),
      shape: { kind: 'rectangle', lengthMm: 400, widthMm: 250 },
      depthMm: 10,
      roomTempC: 20,
      startAt: '2025-03-01T10:00:00Z',
      whenShort: 'refuse',
    },
  };
}

function outboxRow(seq: number, mutation: Mutation, reason?: OutboxRow['reason']): OutboxRow {
  return {
    seq,
    mutationId: mutation.mutationId,
    workshopId: v7(),
    mutation,
    queuedAt: new Date(2025, 2, 1, 14, 5).toISOString(),
    attempts: 1,
    state: reason === undefined ? 'waiting' : 'rejected',
    ...(reason === undefined ? {} : { reason }),
    undo: [],
  };
}

const STOCK_SHORT_POUR = outboxRow(7, pourCreate(), {
  code: 'stock_short',
  message: 'The shelf holds 500 g of part A; this pour needs 550 g.',
});
const FORBIDDEN_BUILD = outboxRow(
  8,
  {
    type: 'build.create',
    mutationId: v7(),
    data: { id: v7(), name: 'Canal lock', scaleRatio: 76, status: 'planning' },
  },
  { code: 'forbidden', message: 'Viewers cannot add builds.' },
);

describe('DevicePage', () => {
  let engine: FakeEngine;
  let storage: FakeStorage;
  let offer: FakeInstallOffer;
  let fixture: ComponentFixture<DevicePage>;
  let loader: HarnessLoader;

  beforeEach(() => {
    localStorage.clear();
    engine = new FakeEngine();
    storage = new FakeStorage();
    offer = new FakeInstallOffer();
    TestBed.configureTestingModule({
      imports: [DevicePage],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
        // The list of photos not sent yet reads the device store itself.
        { provide: BENCH_DB_NAME, useValue: `device-page-spec-${v7()}` },
        { provide: SyncEngine, useValue: engine },
        { provide: StorageHealth, useValue: storage },
        { provide: InstallOffer, useValue: offer },
      ],
    });
  });
  afterEach(async () => {
    localStorage.clear();
    await dropDatabase(TestBed.inject(BenchDb));
  });

  async function render(): Promise<void> {
    fixture = TestBed.createComponent(DevicePage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function queryAll(selector: string): HTMLElement[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll<HTMLElement>(selector));
  }

  function textOf(selector: string | Element | null): string {
    const element = typeof selector === 'string' ? query(selector) : selector;
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  async function summary(): Promise<string> {
    await fixture.whenStable();
    return textOf('.summary');
  }

  function button(text: string | RegExp): Promise<MatButtonHarness> {
    return loader.getHarness(MatButtonHarness.with({ text }));
  }

  async function press(text: string | RegExp): Promise<void> {
    await (await button(text)).click();
    await fixture.whenStable();
  }

  function panel(heading: string): HTMLElement | null {
    return queryAll('section').find((section) => textOf(section.querySelector('h2')) === heading) ?? null;
  }

  describe('the sync summary', () => {
    describe('signed in', () => {
      beforeEach(async () => {
        signIn();
        await render();
      });

      it('should say everything has reached the server', async () => {
        expect(await summary()).toBe('Everything changed on this device has reached the server.');
        expect(textOf('.detail')).toBe('Last synced: not yet on this device');
      });

      it('should count the changes waiting to be sent', async () => {
        engine.waitingCount.set(1);
        expect(await summary()).toBe('1 change waits to be sent.');

        engine.waitingCount.set(3);
        expect(await summary()).toBe('3 changes wait to be sent.');
      });

      it('should say offline that the changes wait here', async () => {
        engine.online.set(false);
        expect(await summary()).toBe(
          'Offline: everything you change is kept here and sent when the connection returns.',
        );

        engine.waitingCount.set(2);
        expect(await summary()).toBe('Offline: 2 changes wait here and will be sent when the connection returns.');
      });

      it('should say the session has ended, and offer to sign in again', async () => {
        engine.sessionEnded.set(true);
        engine.waitingCount.set(1);

        expect(await summary()).toBe('You are signed out: 1 change waits on this device until you sign in again.');
        expect(query('a[href="/sign-in"]')).not.toBeNull();
        expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Sync now/ }))).toEqual([]);
      });

      it('should show the last error of the sync', async () => {
        engine.lastError.set('The server did not answer.');
        await fixture.whenStable();

        expect(textOf('.error')).toBe('The server did not answer.');
      });
    });

    describe('signed out', () => {
      beforeEach(render);

      it('should say so and offer to sign in', async () => {
        expect(await summary()).toBe('You are signed out.');
        expect(textOf('a[href="/sign-in"]')).toBe('Sign in');
      });
    });
  });

  describe('syncing now', () => {
    beforeEach(async () => {
      signIn();
      await render();
    });

    it('should sync when asked', async () => {
      await press(/Sync now/);

      expect(engine.syncNow).toHaveBeenCalledTimes(1);
    });

    it('should not offer to sync offline, nor while a sync runs', async () => {
      engine.online.set(false);
      await fixture.whenStable();
      expect(await (await button(/Sync now/)).isDisabled()).toBeTrue();

      engine.online.set(true);
      engine.syncing.set(true);
      await fixture.whenStable();
      expect(await (await button(/Sync now/)).isDisabled()).toBeTrue();
      expect(query('mat-progress-bar')).not.toBeNull();
    });
  });

  describe('changes the server refused', () => {
    beforeEach(async () => {
      signIn();
      engine.rejected.set([STOCK_SHORT_POUR, FORBIDDEN_BUILD]);
      await render();
    });

    function change(index: number): HTMLElement {
      const item = panel('Could not be saved')?.querySelectorAll<HTMLElement>('.change')[index];
      if (!item) throw new Error(`No refused change ${index}`);
      return item;
    }

    function within(index: number, text: string | RegExp): Promise<MatButtonHarness> {
      return loader.getHarness(MatButtonHarness.with({ ancestor: `.change:nth-child(${index + 1})`, text }));
    }

    it('should list each change with its reason', () => {
      expect(textOf(change(0).querySelector('.what'))).toBe('Pour logged');
      expect(textOf(change(0).querySelector('.reason'))).toBe(
        'The shelf holds 500 g of part A; this pour needs 550 g.',
      );
      expect(textOf(change(0).querySelector('.when'))).toBe('Made 14:05, 1 Mar');
      expect(textOf(change(1).querySelector('.what'))).toBe('New build: Canal lock');
      expect(textOf(change(1).querySelector('.reason'))).toBe('Viewers cannot add builds.');
    });

    it('should offer the fix for a pour refused for short stock, and only for it', async () => {
      const [fix] = fixesFor(STOCK_SHORT_POUR);

      await (await within(0, fix!.label)).click();
      await fixture.whenStable();

      expect(engine.retryWith).toHaveBeenCalledOnceWith(7, fix!);
      expect(
        await loader.getAllHarnesses(MatButtonHarness.with({ ancestor: '.change:nth-child(2)', text: fix!.label })),
      ).toEqual([]);
    });

    it('should send a change again', async () => {
      await (await within(1, 'Send again')).click();
      await fixture.whenStable();

      expect(engine.retry).toHaveBeenCalledOnceWith(8);
    });

    it('should ask before discarding, and discard on the second tap', async () => {
      await (await within(0, 'Discard…')).click();
      await fixture.whenStable();

      expect(engine.discard).not.toHaveBeenCalled();
      expect(textOf(change(0).querySelector('.confirm'))).toBe('Discard it? What it changed here goes back.');

      await (await within(0, 'Discard')).click();
      await fixture.whenStable();

      expect(engine.discard).toHaveBeenCalledOnceWith(7);
      expect(query('.confirm')).toBeNull();
    });

    it('should keep the change when the discard is called off', async () => {
      await (await within(0, 'Discard…')).click();
      await fixture.whenStable();

      await (await within(0, 'Keep it')).click();
      await fixture.whenStable();

      expect(engine.discard).not.toHaveBeenCalled();
      expect(query('.confirm')).toBeNull();
      expect(await (await within(0, 'Discard…')).isDisabled()).toBeFalse();
    });

    it('should hold the buttons while a change is being sent again', async () => {
      let done!: () => void;
      engine.retry.and.returnValue(new Promise<void>((resolve) => (done = resolve)));

      await (await within(1, 'Send again')).click();
      await fixture.whenStable();

      expect(await (await within(0, 'Send again')).isDisabled()).toBeTrue();
      done();
      await fixture.whenStable();
      expect(await (await within(0, 'Send again')).isDisabled()).toBeFalse();
    });
  });

  describe('changes waiting', () => {
    it('should list them with their count', async () => {
      signIn();
      engine.waitingCount.set(1);
      engine.waiting.set([outboxRow(3, { type: 'step.delete', mutationId: v7(), recordId: v7() })]);
      await render();

      expect(textOf('#waiting-heading')).toBe('Waiting to be sent (1)');
      expect(textOf(panel('Waiting to be sent (1)')?.querySelector('.what') ?? null)).toBe('Step deleted');
    });
  });

  describe('storage', () => {
    it('should measure the space used when opened', async () => {
      await render();

      expect(storage.measure).toHaveBeenCalled();
    });

    it('should tell how much space it uses of what the browser offers', async () => {
      // Decimal prefixes, as the SI has them: 4 000 000 bytes = 4.0 MB, 11 000 000 000 bytes = 11 GB.
      storage.usage.set(4_000_000);
      storage.quota.set(11_000_000_000);
      await render();

      expect(textOf(panel('Storage')?.querySelector('p') ?? null)).toBe(
        'Benchtide uses 4.0 MB of the 11 GB this browser offers.',
      );
    });

    it('should tell the space used alone when the browser gives no quota', async () => {
      storage.usage.set(512);
      await render();

      expect(textOf(panel('Storage')?.querySelector('p') ?? null)).toBe('Benchtide uses 512 bytes here.');
    });

    it('should offer to keep the data when the browser may clear it', async () => {
      storage.persisted.set(false);
      await render();

      await press('Keep my data on this device');

      expect(storage.keep).toHaveBeenCalledTimes(1);
    });

    it('should say the data is kept once the browser promised it', async () => {
      storage.persisted.set(true);
      await render();

      expect(textOf(panel('Storage'))).toContain('The browser keeps this data even when space runs short.');
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Keep my data/ }))).toEqual([]);
    });
  });

  describe('installing', () => {
    it('should install when the browser offers it', async () => {
      offer.available.set(true);
      await render();

      await press(/Install Benchtide/);

      expect(offer.install).toHaveBeenCalledTimes(1);
    });

    it('should say it is installed', async () => {
      offer.installed.set(true);
      await render();

      expect(textOf(panel('On the home screen'))).toContain('Benchtide is installed on this device.');
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Install/ }))).toEqual([]);
    });

    it("should point to the browser's menu when there is no offer", async () => {
      await render();

      expect(textOf(panel('On the home screen'))).toContain("use your browser's menu");
      expect(await loader.getAllHarnesses(MatButtonHarness.with({ text: /Install/ }))).toEqual([]);
    });
  });

  describe('photos not sent yet', () => {
    it('should list them beside the changes, asking for attention when one was refused', async () => {
      signIn();
      const photo = picked(await pictureFile('jetty.jpg'));
      await TestBed.inject(BuildPhotos).add(v7(), { buildId: v7() }, [photo]);
      await TestBed.inject(BenchDb).photoUploads.update(photo.id, {
        state: 'refused',
        lastError: { code: 'photo_too_large', message: 'This photo is larger than 25 MB.', status: 413 },
      });
      await render();

      await until(() => {
        fixture.detectChanges();
        return panel('Photos not sent yet (1)')?.classList.contains('attention');
      }, 'the photos panel, refused');
      const photos = panel('Photos not sent yet (1)')!;
      expect(photos.classList).toContain('attention');
      expect(textOf(photos.querySelector('.what'))).toBe('jetty.jpg for a build not on this device');
      expect(textOf(photos.querySelector('[data-field="upload-reason"]'))).toBe('This photo is larger than 25 MB.');
    });
  });
});
