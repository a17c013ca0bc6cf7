import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { PulledChange, PullAnswer } from '@benchtide/shared';
import { firstValueFrom } from 'rxjs';
import { BenchDb } from './bench-db';
import { SYNCED_TABLES, TABLE_OF, type SyncedFields, type SyncedTableName } from './synced-records';

const PAGE_SIZE = 1000;

/**
 * Brings a workshop's records up to date from the server, page by page from where the last pull stopped.
 * The server's copy of a record replaces this device's, even one with changes still queued here: those
 * are sent again on the next push and come back with the pull after it. A pour logged here drew stock
 * under ids of this device's making (again each time a layer was recorded here); the server's uses of it
 * have their own, so when the server's pour, one of its layers or one of its uses arrives the provisional
 * uses go, and the stock here is the server's sum again. Layer 1 shares its pour's id on both sides, so the
 * server's copy replaces the one written here with the pour. A photo uploaded from here
 * is shown from the server's copies once its record arrives, so the bytes kept for the upload go then.
 */
@Injectable({ providedIn: 'root' })
export class ChangePull {
  private readonly db = inject(BenchDb);
  private readonly http = inject(HttpClient);

  async pull(workshopId: string): Promise<void> {
    let cursor = (await this.db.syncState.get(workshopId))?.cursor ?? 0;
    let startedOver = false;
    for (;;) {
      const params = { workshopId, after: cursor, limit: PAGE_SIZE };
      const page = await firstValueFrom(this.http.get<PullAnswer>('/api/sync/pull', { params }));
      if (page.startOver) {
        if (startedOver) throw new Error(`The server asked twice to start over: ${page.reason}`);
        startedOver = true;
        await this.dropWorkshop(workshopId);
        cursor = 0;
        continue;
      }
      if (page.more && page.cursor <= cursor) throw new Error('The server sent more changes without moving on.');
      // Only a start over goes back: an empty page answered with a lower cursor must not re-pull everything.
      cursor = Math.max(cursor, page.cursor);
      await this.applyPage(workshopId, page.changes, cursor);
      if (!page.more) return;
    }
  }

  /** One transaction per page: its records and the cursor after it are stored together or not at all. */
  private async applyPage(workshopId: string, changes: readonly PulledChange[], cursor: number): Promise<void> {
    // Pages come in change order: the last change to a record in a page is the server's latest copy.
    const latest = new Map<string, [SyncedTableName, PulledChange['record']]>();
    for (const change of changes) {
      // An entity this version of the app does not know yet is left for a later version to pull.
      const table = TABLE_OF[change.entity] as SyncedTableName | undefined;
      if (table !== undefined) latest.set(`${table}/${change.record.id}`, [table, change.record]);
    }
    const idsIn = (name: SyncedTableName) =>
      [...latest.values()].filter(([table]) => table === name).map(([, record]) => record.id);
    // The server draws a pour's stock again as its layers go on: its copy of any of these replaces the draw made here.
    const pourIds = [
      ...idsIn('pours'),
      ...[...latest.values()]
        .filter(([table]) => table === 'pourLayers' || table === 'ledgerEntries')
        .map(([, record]) => (record as { pourId?: string | null }).pourId)
        .filter((pourId) => typeof pourId === 'string'),
    ];
    const { db } = this;
    await db.transaction('rw', [...db.syncedTables, db.syncState, db.photoUploads], async () => {
      await db.ledgerEntries
        .where('pourId')
        .anyOf(pourIds)
        .filter(
          (entry) => entry.pending === true && entry.changeNumber === 0 && !latest.has(`ledgerEntries/${entry.id}`),
        )
        .delete();
      for (const name of SYNCED_TABLES) {
        const records = [...latest.values()].filter(([table]) => table === name).map(([, record]) => record);
        // A tombstone removes the record: nothing of a deleted record is shown.
        const tombstones = records.filter((record) => record.deletedAt !== null).map((record) => record.id);
        await db.table(name).bulkPut(records.filter((record) => record.deletedAt === null));
        await db.table(name).bulkDelete(tombstones);
      }
      // The server holds these photos (or deleted them): the bytes kept here for the upload can go.
      await db.photoUploads.bulkDelete(idsIn('photos'));
      await db.syncState.put({ workshopId, cursor, lastSyncedAt: new Date().toISOString() });
    });
  }

  /** The server cannot continue from our cursor: forget what it sent before, keeping what this device changed. */
  private async dropWorkshop(workshopId: string): Promise<void> {
    const { db } = this;
    await db.transaction('rw', [...db.syncedTables, db.syncState], async () => {
      for (const table of db.syncedTables) {
        await table
          .where('workshopId')
          .equals(workshopId)
          .filter((record: SyncedFields) => !record.pending)
          .delete();
      }
      await db.syncState.delete(workshopId);
    });
  }
}
