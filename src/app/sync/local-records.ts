import { inject, Injectable, type Injector, type Signal } from '@angular/core';
import type { EntityTable } from 'dexie';
import { BenchDb } from './bench-db';
import { liveSignalOf } from './live-signal';
import type {
  LocalBuild,
  LocalContainer,
  LocalLedgerEntry,
  LocalMaterial,
  LocalPour,
  LocalStep,
  SyncedFields,
} from './synced-records';

/**
 * The records on this device as live signals, deleted ones left out, oldest first. Each follows the signal
 * it is given (a workshop, build, material or container id; null gives an empty list). Call in an
 * injection context, or pass an injector: the query stops when that context is destroyed.
 */
@Injectable({ providedIn: 'root' })
export class LocalRecords {
  private readonly db = inject(BenchDb);

  builds(workshopId: Signal<string | null>, injector?: Injector): Signal<LocalBuild[]> {
    return this.live(this.db.builds, 'workshopId', workshopId, injector);
  }
  steps(buildId: Signal<string | null>, injector?: Injector): Signal<LocalStep[]> {
    return this.live(this.db.steps, 'buildId', buildId, injector);
  }
  pours(buildId: Signal<string | null>, injector?: Injector): Signal<LocalPour[]> {
    return this.live(this.db.pours, 'buildId', buildId, injector);
  }
  materials(workshopId: Signal<string | null>, injector?: Injector): Signal<LocalMaterial[]> {
    return this.live(this.db.materials, 'workshopId', workshopId, injector);
  }
  containers(materialId: Signal<string | null>, injector?: Injector): Signal<LocalContainer[]> {
    return this.live(this.db.containers, 'materialId', materialId, injector);
  }
  /** A container's stock book; its remaining stock is the sum of `quantity`. */
  ledger(containerId: Signal<string | null>, injector?: Injector): Signal<LocalLedgerEntry[]> {
    return this.live(this.db.ledgerEntries, 'containerId', containerId, injector);
  }

  private live<T extends SyncedFields>(
    table: EntityTable<T, 'id'>,
    index: string,
    key: Signal<string | null>,
    injector?: Injector,
  ): Signal<T[]> {
    const query = (value: string | null) =>
      value === null
        ? []
        : table
            .where(index)
            .equals(value)
            .filter((record) => record.deletedAt === null)
            .sortBy('createdAt');
    return liveSignalOf(key, query, [], injector);
  }
}
