import { and, asc, eq, isNull, type SQL } from 'drizzle-orm';
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { may } from '../../shared/workshop-policy.js';
import { authorize } from '../workshops/workshop-service.js';
import { stampChange, type Transaction } from './change-stamp.js';

/** A table made with syncedColumns(). */
export type SyncedTable = PgTable & {
  id: PgColumn;
  workshopId: PgColumn;
  deletedAt: PgColumn;
  updatedAt: PgColumn;
  changeNumber: PgColumn;
};

export interface RecordKind {
  table: SyncedTable;
  /** For messages: "build", "step"... */
  noun: string;
}

function notFound(kind: RecordKind): AppError {
  return new AppError(404, 'not_found', `There is no such ${kind.noun} in this workshop.`);
}

export async function listRecords(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  kind: RecordKind,
  where?: SQL,
) {
  await authorize(ctx.db, userId, workshopId, 'view');
  const { table } = kind;
  return ctx.db
    .select()
    .from(table)
    .where(and(eq(table.workshopId, workshopId), isNull(table.deletedAt), where))
    .orderBy(asc(table.changeNumber));
}

/** A live record of the workshop, locked for the rest of the transaction; 404 otherwise. */
export async function liveRecord(tx: Transaction, workshopId: string, kind: RecordKind, id: string) {
  const { table } = kind;
  const [row] = await tx
    .select()
    .from(table)
    .where(and(eq(table.id, id), eq(table.workshopId, workshopId), isNull(table.deletedAt)))
    .for('update');
  if (!row) throw notFound(kind);
  return row as Record<string, unknown>;
}

export async function getRecord(ctx: ServerContext, userId: string, workshopId: string, kind: RecordKind, id: string) {
  await authorize(ctx.db, userId, workshopId, 'view');
  const { table } = kind;
  const [row] = await ctx.db
    .select()
    .from(table)
    .where(and(eq(table.id, id), eq(table.workshopId, workshopId), isNull(table.deletedAt)));
  if (!row) throw notFound(kind);
  return row;
}

/** Writes inside one transaction with the workshop's next change number; the caller's role is checked first. */
export async function writeRecords<T>(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  write: (tx: Transaction, changeNumber: number) => Promise<T>,
): Promise<T> {
  if (ctx.batch) {
    if (!may(ctx.batch.role, 'write-builds')) {
      throw new AppError(403, 'forbidden', `As a ${ctx.batch.role} of this workshop you may not do this.`);
    }
    return write(ctx.db as unknown as Transaction, ctx.batch.changeNumber);
  }
  await authorize(ctx.db, userId, workshopId, 'write-builds');
  return ctx.db.transaction(async (tx) => write(tx, await stampChange(tx, workshopId)));
}

/**
 * Work outside the database that must wait until a write has committed, such as removing the
 * files of a deleted photo: at once after a lone write, after the whole batch for a sync push.
 */
export async function afterCommit(ctx: ServerContext, work: () => Promise<void>): Promise<void> {
  if (ctx.batch) ctx.batch.afterCommit.push(work);
  else await work();
}

export async function insertRecord(tx: Transaction, kind: RecordKind, values: Record<string, unknown>) {
  const [row] = await tx
    .insert(kind.table)
    .values(values as never)
    .onConflictDoNothing()
    .returning();
  if (!row) throw new AppError(409, 'id_taken', `A ${kind.noun} with this id exists already.`);
  return row as Record<string, unknown>;
}

export async function patchRecord(
  tx: Transaction,
  workshopId: string,
  kind: RecordKind,
  id: string,
  patch: Record<string, unknown>,
  changeNumber: number,
) {
  await liveRecord(tx, workshopId, kind, id);
  const { table } = kind;
  const [row] = await tx
    .update(table)
    .set({ ...patch, updatedAt: new Date(), changeNumber } as never)
    .where(eq(table.id, id))
    .returning();
  return row as Record<string, unknown>;
}

export async function tombstone(
  tx: Transaction,
  workshopId: string,
  kind: RecordKind,
  id: string,
  changeNumber: number,
) {
  await liveRecord(tx, workshopId, kind, id);
  const { table } = kind;
  const now = new Date();
  await tx
    .update(table)
    .set({ deletedAt: now, updatedAt: now, changeNumber } as never)
    .where(eq(table.id, id));
}

type Editor<Patch> = (
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  id: string,
  patch: Patch,
) => Promise<Record<string, unknown>>;
type Remover = (ctx: ServerContext, userId: string, workshopId: string, id: string) => Promise<void>;

/** Editing a record field by field, for a kind whose patch needs no translation on the way in. */
export function recordEditor<Patch extends object>(kind: RecordKind): Editor<Patch> {
  return (ctx, userId, workshopId, id, patch) =>
    writeRecords(ctx, userId, workshopId, (tx, changeNumber) =>
      patchRecord(tx, workshopId, kind, id, patch as Record<string, unknown>, changeNumber),
    );
}

/** Deleting a record: a tombstone that pulls carry to every device. */
export function recordRemover(kind: RecordKind): Remover {
  return (ctx, userId, workshopId, id) =>
    writeRecords(ctx, userId, workshopId, (tx, changeNumber) => tombstone(tx, workshopId, kind, id, changeNumber));
}
