import type { Role } from '../../shared/account-schemas.js';
import type { ServerContext } from '../context.js';
import type { Clock } from '../core/clock.js';
import { authorize } from '../workshops/workshop-service.js';
import { stampChange, type Transaction } from './change-stamp.js';

/**
 * One write to a workshop's records: the transaction it runs in, the change number every record it
 * touches carries, who writes and with which role, and work to do once it has committed (removing
 * the files of a deleted photo). Opened by `inUnitOfWork` for a REST write and by a sync push for a
 * whole batch, and passed to the services as their first argument.
 */
export interface UnitOfWork {
  readonly tx: Transaction;
  readonly changeNumber: number;
  readonly role: Role;
  readonly userId: string;
  readonly workshopId: string;
  readonly clock: Clock;
  afterCommit(work: () => Promise<void>): void;
}

/** Runs queued after-commit work in order, once the transaction is done. */
export class AfterCommit {
  private readonly queued: (() => Promise<void>)[] = [];

  add(work: () => Promise<void>): void {
    this.queued.push(work);
  }

  /** How much is queued, to forget what a rolled-back savepoint queued. */
  get size(): number {
    return this.queued.length;
  }

  forgetFrom(size: number): void {
    this.queued.length = size;
  }

  async run(): Promise<void> {
    for (const work of this.queued) await work();
  }
}

/** A unit of work in `tx` with the workshop's next change number; the workshop stays locked until the commit. */
export async function openWork(
  ctx: ServerContext,
  tx: Transaction,
  who: { role: Role; userId: string; workshopId: string },
  later: AfterCommit,
): Promise<UnitOfWork> {
  return {
    tx,
    changeNumber: await stampChange(tx, who.workshopId),
    ...who,
    clock: ctx.clock,
    afterCommit: (work) => later.add(work),
  };
}

/** A REST write: the caller's role checked, one transaction with the workshop's next change number. */
export async function inUnitOfWork<T>(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  write: (work: UnitOfWork) => Promise<T>,
): Promise<T> {
  const role = await authorize(ctx.db, userId, workshopId, 'write-builds');
  const later = new AfterCommit();
  const result = await ctx.db.transaction(async (tx) =>
    write(await openWork(ctx, tx, { role, userId, workshopId }, later)),
  );
  await later.run();
  return result;
}

/** A service's write as its own unit of work: `writeRecords(ctx, userId, workshopId, createBuild, input)`. */
export function writeRecords<Args extends unknown[], T>(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  service: (work: UnitOfWork, ...args: Args) => Promise<T>,
  ...args: Args
): Promise<T> {
  return inUnitOfWork(ctx, userId, workshopId, (work) => service(work, ...args));
}
