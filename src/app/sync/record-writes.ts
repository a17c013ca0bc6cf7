import type { Table } from 'dexie';
import type { BenchDb } from './bench-db';
import type { LocalLedgerEntry, RecordUndo, SyncedFields, SyncedTableName } from './synced-records';

/**
 * The changes a write makes to this device's records, run inside OfflineStore.apply's transaction. Each
 * returns how to undo itself, kept with the queued change in case the server rejects it.
 */
export type NewFields = { id: string } & Record<string, unknown>;
type LocalRecord = SyncedFields & Record<string, unknown>;

export async function insertRecords(
  db: BenchDb,
  workshopId: string,
  now: string,
  records: readonly (readonly [SyncedTableName, NewFields])[],
): Promise<RecordUndo[]> {
  const undo: RecordUndo[] = [];
  for (const [table, fields] of records) {
    const times = { createdAt: now, updatedAt: now, deletedAt: null };
    await tableOf(db, table).add({ ...fields, workshopId, ...times, changeNumber: 0, pending: true });
    undo.push({ table, id: fields.id, restore: null });
  }
  return undo;
}

export async function patchRecord(
  db: BenchDb,
  table: SyncedTableName,
  id: string,
  data: object,
  now: string,
): Promise<RecordUndo[]> {
  const record = await existing(db, table, id);
  const restore = Object.fromEntries(Object.keys(data).map((field) => [field, record[field] ?? null]));
  await tableOf(db, table).update(id, { ...data, updatedAt: now, pending: true });
  return [{ table, id, restore }];
}

/**
 * A soft delete: the record stays, marked, until the server's tombstone arrives. A pour takes its layers and
 * the stock it drew with it, so the shelf and the build's cost go back at once.
 */
export async function softDelete(
  db: BenchDb,
  table: SyncedTableName,
  id: string,
  deletedAt: string,
): Promise<RecordUndo[]> {
  const targets: [SyncedTableName, string][] = [[table, id]];
  if (table === 'pours') {
    const uses = db.ledgerEntries.where({ pourId: id }).filter((use) => use.deletedAt === null);
    for (const useId of await uses.primaryKeys()) targets.push(['ledgerEntries', useId]);
    const layers = db.pourLayers.where({ pourId: id }).filter((layer) => layer.deletedAt === null);
    for (const layerId of await layers.primaryKeys()) targets.push(['pourLayers', layerId]);
  }
  const undo: RecordUndo[] = [];
  for (const [name, targetId] of targets) {
    const record = await existing(db, name, targetId);
    await tableOf(db, name).update(targetId, { deletedAt, pending: true });
    undo.push({ table: name, id: targetId, restore: { deletedAt: record.deletedAt } });
  }
  return undo;
}

/** A stock book entry as the server would write it; `id` defaults to the container's, as a purchase has. */
export function ledgerEntry(
  containerId: string,
  kind: LocalLedgerEntry['kind'],
  quantity: number,
  more: Partial<LocalLedgerEntry> = {},
): NewFields {
  const at = new Date().toISOString();
  return { id: containerId, containerId, kind, quantity, costMinor: 0, at, pourId: null, note: '', ...more };
}

async function existing(db: BenchDb, table: SyncedTableName, id: string): Promise<LocalRecord> {
  const record = await tableOf(db, table).get(id);
  if (!record) throw new Error(`There is no such record on this device (${table} ${id}).`);
  return record;
}

function tableOf(db: BenchDb, name: SyncedTableName): Table<LocalRecord, string> {
  return db.table(name);
}
