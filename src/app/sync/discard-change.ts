import type { BenchDb } from './bench-db';
import type { RecordUndo, SyncedFields } from './synced-records';

type LocalRecord = SyncedFields & Record<string, unknown>;

/**
 * Removes a rejected change from the outbox and puts back what it changed on this device: a record it
 * created goes; fields it changed return to their earlier values, except those a later queued change also
 * set. A record the server has sent since (no longer pending) is the server's copy and stays as it is.
 */
export async function discardChange(db: BenchDb, seq: number): Promise<void> {
  await db.transaction('rw', [...db.syncedTables, db.outbox], async () => {
    const row = await db.outbox.get(seq);
    if (row?.state !== 'rejected') return;
    await db.outbox.delete(seq);
    const others = await db.outbox.where({ workshopId: row.workshopId }).toArray();
    for (const undo of row.undo) {
      const table = db.table<LocalRecord, string>(undo.table);
      const record = await table.get(undo.id);
      if (!record?.pending) continue;
      if (undo.restore === null) {
        await table.delete(undo.id);
        continue;
      }
      const touching = others.filter((other) => other.undo.some((u) => sameRecord(u, undo)));
      const fields = { ...undo.restore };
      for (const later of touching.filter((other) => other.seq > seq)) {
        for (const u of later.undo.filter((u) => sameRecord(u, undo))) {
          for (const field of Object.keys(u.restore ?? {})) delete fields[field];
        }
      }
      await table.update(undo.id, { ...fields, pending: touching.length > 0 });
    }
  });
}

function sameRecord(a: RecordUndo, b: RecordUndo): boolean {
  return a.table === b.table && a.id === b.id;
}
