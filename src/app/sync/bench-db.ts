import { inject, Injectable, InjectionToken } from '@angular/core';
import { firstLayer } from '@benchtide/shared';
import Dexie, { type EntityTable, type Table } from 'dexie';
import {
  SYNCED_TABLES,
  type LocalBuild,
  type LocalContainer,
  type LocalLedgerEntry,
  type LocalMaterial,
  type LocalPhoto,
  type LocalPour,
  type LocalPourLayer,
  type LocalStep,
  type OutboxRow,
  type PhotoUploadRow,
  type SyncedFields,
  type SyncStateRow,
} from './synced-records';

/** The IndexedDB database name; specs give each run its own. */
export const BENCH_DB_NAME = new InjectionToken<string>('BENCH_DB_NAME', {
  providedIn: 'root',
  factory: () => 'benchtide',
});

/** The first schema, kept so that devices holding it are upgraded: its outbox rows had no state. */
export const SCHEMA_V1 = {
  builds: 'id, workshopId, changeNumber',
  steps: 'id, workshopId, buildId, changeNumber',
  materials: 'id, workshopId, changeNumber',
  containers: 'id, workshopId, materialId, changeNumber',
  ledgerEntries: 'id, workshopId, containerId, pourId, changeNumber',
  pours: 'id, workshopId, buildId, materialId, changeNumber',
  outbox: '++seq, workshopId',
  syncState: 'workshopId',
} as const;

export const SCHEMA_V2 = {
  ...SCHEMA_V1,
  // A mutation id is queued once; rows are found by workshop and state, oldest (lowest seq) first.
  outbox: '++seq, workshopId, state, [workshopId+state], &mutationId',
};

export const SCHEMA_V3 = {
  ...SCHEMA_V2,
  photos: 'id, workshopId, buildId, stepId, pourId, changeNumber',
  // Sent oldest first, one workshop at a time.
  photoUploads: 'id, workshopId, state, [workshopId+state], createdAt',
};

const SCHEMA_V4 = {
  ...SCHEMA_V3,
  pourLayers: 'id, workshopId, pourId, changeNumber',
};

/**
 * The records of every workshop this device has opened, the changes not yet pushed, the photos not yet
 * uploaded, and where each pull stopped.
 */
@Injectable({ providedIn: 'root', useFactory: () => new BenchDb(inject(BENCH_DB_NAME)) })
export class BenchDb extends Dexie {
  declare readonly builds: EntityTable<LocalBuild, 'id'>;
  declare readonly steps: EntityTable<LocalStep, 'id'>;
  declare readonly materials: EntityTable<LocalMaterial, 'id'>;
  declare readonly containers: EntityTable<LocalContainer, 'id'>;
  declare readonly ledgerEntries: EntityTable<LocalLedgerEntry, 'id'>;
  declare readonly pours: EntityTable<LocalPour, 'id'>;
  declare readonly pourLayers: EntityTable<LocalPourLayer, 'id'>;
  declare readonly photos: EntityTable<LocalPhoto, 'id'>;
  declare readonly photoUploads: EntityTable<PhotoUploadRow, 'id'>;
  declare readonly outbox: EntityTable<OutboxRow, 'seq'>;
  declare readonly syncState: EntityTable<SyncStateRow, 'workshopId'>;

  constructor(name = 'benchtide') {
    // Live queries run against IndexedDB itself: the optimistic result cache missed rows leaving an index range.
    super(name, { cache: 'disabled' });
    this.version(1).stores(SCHEMA_V1);
    this.version(2)
      .stores(SCHEMA_V2)
      .upgrade((tx) =>
        tx
          .table<Partial<OutboxRow>>('outbox')
          .toCollection()
          .modify((row) => {
            row.state ??= 'waiting';
            row.undo ??= [];
          }),
      );
    // New tables only: nothing stored before changes.
    this.version(3).stores(SCHEMA_V3);
    // Layers became records: each pour held here gets its layer 1, as the server's migration made it.
    this.version(4)
      .stores(SCHEMA_V4)
      .upgrade(async (tx) => {
        const pours = tx.table<LocalPour & { layerCount?: number }, string>('pours');
        const layers = tx.table<LocalPourLayer, string>('pourLayers');
        for (const pour of await pours.toArray()) {
          // A pour logged by an older version may still wait for its plan: the server's layer 1 comes with it.
          if (!pour.plan || !pour.request) continue;
          await pours.update(pour.id, { layerCount: pour.layerCount ?? pour.plan.layers.count });
          const { id, workshopId, createdAt, updatedAt, deletedAt, changeNumber } = pour;
          const first = firstLayer(pour.plan, pour.startAt, pour.request.roomTempC);
          await layers.put({
            id,
            workshopId,
            createdAt,
            updatedAt,
            deletedAt,
            changeNumber,
            pourId: id,
            ...first,
            recordedBy: pour.loggedBy ?? null,
          });
        }
      });
  }

  /** The tables of synced records, for transactions and loops over all of them. */
  get syncedTables(): Table<SyncedFields, string>[] {
    return SYNCED_TABLES.map((name) => this.table<SyncedFields, string>(name));
  }
}
