import { and, asc, eq, isNull, type SQL } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { authorize } from '../workshops/workshop-service.js';
import type { Transaction } from './change-stamp.js';

/** A table made with syncedColumns(). */
export type SyncedTable = PgTable & {
  id: PgColumn;
  workshopId: PgColumn;
  deletedAt: PgColumn;
  updatedAt: PgColumn;
  changeNumber: PgColumn;
};

export interface RecordKind<T extends SyncedTable = SyncedTable> {
  table: T;
  /** For messages: "build", "step"... */
  noun: string;
}

function notFound(kind: RecordKind): AppError {
  return new AppError(404, 'not_found', `There is no such ${kind.noun} in this workshop.`);
}

export async function listRecords<T extends SyncedTable>(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  kind: RecordKind<T>,
  where?: SQL,
): Promise<T['$inferSelect'][]> {
  await authorize(ctx.db, userId, workshopId, 'view');
  const table: SyncedTable = kind.table;
  return ctx.db
    .select()
    .from(table)
    .where(and(eq(table.workshopId, workshopId), isNull(table.deletedAt), where))
    .orderBy(asc(table.changeNumber));
}

/** A live record of the workshop, locked for the rest of the transaction; 404 otherwise. */
export async function liveRecord<T extends SyncedTable>(
  tx: Transaction,
  workshopId: string,
  kind: RecordKind<T>,
  id: string,
): Promise<T['$inferSelect']> {
  const table: SyncedTable = kind.table;
  const [row] = await tx
    .select()
    .from(table)
    .where(and(eq(table.id, id), eq(table.workshopId, workshopId), isNull(table.deletedAt)))
    .for('update');
  if (!row) throw notFound(kind);
  return row;
}

export async function getRecord<T extends SyncedTable>(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  kind: RecordKind<T>,
  id: string,
): Promise<T['$inferSelect']> {
  await authorize(ctx.db, userId, workshopId, 'view');
  const table: SyncedTable = kind.table;
  const [row] = await ctx.db
    .select()
    .from(table)
    .where(and(eq(table.id, id), eq(table.workshopId, workshopId), isNull(table.deletedAt)));
  if (!row) throw notFound(kind);
  return row;
}

export async function insertRecord<T extends SyncedTable>(
  tx: Transaction,
  kind: RecordKind<T>,
  values: T['$inferInsert'],
): Promise<T['$inferSelect']> {
  const [row] = await tx.insert(kind.table).values(values).onConflictDoNothing().returning();
  if (!row) throw new AppError(409, 'id_taken', `A ${kind.noun} with this id exists already.`);
  return row;
}

export async function patchRecord<T extends SyncedTable>(
  tx: Transaction,
  workshopId: string,
  kind: RecordKind<T>,
  id: string,
  patch: Partial<T['$inferInsert']>,
  changeNumber: number,
): Promise<T['$inferSelect']> {
  await liveRecord(tx, workshopId, kind, id);
  const rows = await tx
    .update(kind.table)
    .set({ ...patch, updatedAt: new Date(), changeNumber })
    .where(eq(kind.table.id, id))
    .returning();
  return (rows as T['$inferSelect'][])[0]!;
}

export async function tombstone(
  tx: Transaction,
  workshopId: string,
  kind: RecordKind,
  id: string,
  changeNumber: number,
): Promise<void> {
  await liveRecord(tx, workshopId, kind, id);
  const now = new Date();
  await tx.update(kind.table).set({ deletedAt: now, updatedAt: now, changeNumber }).where(eq(kind.table.id, id));
}
