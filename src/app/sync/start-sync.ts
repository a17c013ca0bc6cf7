import type { Injector } from '@angular/core';
import { StorageHealth } from './storage-health';
import { SyncEngine } from './sync-engine';

/**
 * Starts keeping this device and the server in step. Loaded by the shell after the first screen is up,
 * in a chunk of its own, so the device store and the shared schemas stay out of the first download.
 */
export function startSync(injector: Injector): void {
  injector.get(SyncEngine).start();
  void injector.get(StorageHealth).check();
}
