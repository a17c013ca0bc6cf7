import { TestBed } from '@angular/core/testing';
import { StorageHealth } from './storage-health';

describe('StorageHealth', () => {
  let health: StorageHealth;

  beforeEach(() => {
    health = TestBed.inject(StorageHealth);
  });

  it('should ask for persistent storage once, then report it and the space used', async () => {
    spyOn(navigator.storage, 'persisted').and.resolveTo(false);
    const persist = spyOn(navigator.storage, 'persist').and.resolveTo(true);
    spyOn(navigator.storage, 'estimate').and.resolveTo({ usage: 2_500_000, quota: 600_000_000 });

    await health.check();
    await health.check();

    expect(persist).toHaveBeenCalledTimes(1);
    expect(health.persisted()).toBeTrue();
    expect(health.usage()).toBe(2_500_000);
    expect(health.quota()).toBe(600_000_000);
  });

  it('should not ask again when storage is persistent already', async () => {
    spyOn(navigator.storage, 'persisted').and.resolveTo(true);
    const persist = spyOn(navigator.storage, 'persist').and.resolveTo(true);
    spyOn(navigator.storage, 'estimate').and.resolveTo({ usage: 0, quota: 1 });

    await health.check();

    expect(persist).not.toHaveBeenCalled();
    expect(health.persisted()).toBeTrue();
  });

  it('should leave everything unknown in a browser without the storage API', async () => {
    spyOnProperty(navigator, 'storage', 'get').and.returnValue(undefined as unknown as StorageManager);

    await health.check();

    expect(health.persisted()).toBeNull();
    expect(health.usage()).toBeNull();
    expect(health.quota()).toBeNull();
  });

  it('should leave the amounts unknown when the browser refuses to estimate them', async () => {
    spyOn(navigator.storage, 'persisted').and.resolveTo(false);
    spyOn(navigator.storage, 'persist').and.resolveTo(false);
    spyOn(navigator.storage, 'estimate').and.rejectWith(new DOMException('Not allowed', 'SecurityError'));

    await health.check();

    expect(health.persisted()).toBeFalse();
    expect(health.usage()).toBeNull();
  });

  it('should ask again when the modeller taps to keep the data, after the browser said no', async () => {
    spyOn(navigator.storage, 'persisted').and.resolveTo(false);
    const persist = spyOn(navigator.storage, 'persist').and.resolveTo(false);
    spyOn(navigator.storage, 'estimate').and.resolveTo({ usage: 10, quota: 100 });
    await health.check();
    persist.and.resolveTo(true);

    expect(await health.keep()).toBeTrue();
    expect(persist).toHaveBeenCalledTimes(2);
    expect(health.persisted()).toBeTrue();
  });
});
