import { TestBed } from '@angular/core/testing';
import { SwUpdate, type UnrecoverableStateEvent, type VersionEvent } from '@angular/service-worker';
import { Subject } from 'rxjs';
import { AppUpdates } from './app-updates';

describe('AppUpdates', () => {
  let versionUpdates: Subject<VersionEvent>;
  let unrecoverable: Subject<UnrecoverableStateEvent>;

  function create(isEnabled = true): AppUpdates {
    versionUpdates = new Subject();
    unrecoverable = new Subject();
    TestBed.configureTestingModule({
      providers: [
        {
          provide: SwUpdate,
          useValue: { isEnabled, versionUpdates, unrecoverable, checkForUpdate: () => Promise.resolve(false) },
        },
      ],
    });
    return TestBed.inject(AppUpdates);
  }

  it('should say a new version is ready once the worker has it', () => {
    const updates = create();

    versionUpdates.next({ type: 'VERSION_DETECTED', version: { hash: 'b' } });
    expect(updates.ready()).toBeFalse();
    versionUpdates.next({ type: 'VERSION_READY', currentVersion: { hash: 'a' }, latestVersion: { hash: 'b' } });

    expect(updates.ready()).toBeTrue();
  });

  it('should say when the cached copy cannot go on', () => {
    const updates = create();

    unrecoverable.next({ type: 'UNRECOVERABLE_STATE', reason: 'a file went missing from the cache' });

    expect(updates.broken()).toBeTrue();
  });

  it('should stay quiet without a service worker', () => {
    const updates = create(false);

    versionUpdates.next({ type: 'VERSION_READY', currentVersion: { hash: 'a' }, latestVersion: { hash: 'b' } });

    expect(updates.ready()).toBeFalse();
  });
});
