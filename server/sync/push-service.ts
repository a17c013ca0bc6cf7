import { inArray } from 'drizzle-orm';
import * as z from 'zod';
import type { Role } from '../../shared/account-schemas.js';
import { mutationSchema, type MutationResult, type PushAnswer } from '../../shared/sync-schemas.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import type { Database } from '../db/database.js';
import { pushedMutations } from '../db/schema/index.js';
import { stampChange } from '../records/change-stamp.js';
import { authorize } from '../workshops/workshop-service.js';
import { applyMutation } from './apply-mutation.js';

const idOnly = z.object({ mutationId: z.uuid() });

function rejection(mutationId: string, error: AppError): MutationResult {
  return {
    mutationId,
    status: 'rejected',
    reason: { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}) },
  };
}

function refusedShape(raw: unknown): AppError {
  const parsed = mutationSchema.safeParse(raw);
  const fields = parsed.success
    ? {}
    : Object.fromEntries(
        parsed.error.issues.map((issue) => [issue.path.map(String).join('.') || 'mutation', issue.message]),
      );
  return new AppError(400, 'invalid', 'This change could not be read: some values need another look.', fields);
}

/**
 * Applies a device's outbox in order, in one transaction. Each mutation runs in a savepoint: one
 * that can never apply (a viewer's write, an edit to a deleted record, bad data) is rolled back
 * alone and answered as rejected, and the ones behind it still apply. Every answer is recorded,
 * so a replay after a lost response changes nothing and answers the same. Anything else (the
 * database going away) rolls the whole batch back; the device retries later.
 */
export async function push(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  raw: readonly unknown[],
): Promise<PushAnswer> {
  const role = await authorize(ctx.db, userId, workshopId, 'view');
  try {
    return await applyBatch(ctx, role, userId, workshopId, raw, false);
  } catch (error) {
    if (!(error instanceof RefusalInBatch)) throw error;
    // Someone's change is refused: do the batch again with each change in a savepoint of its own.
    return applyBatch(ctx, role, userId, workshopId, raw, true);
  }
}

/** Thrown on the quick path, where a refusal rolls the whole batch back to be done again with savepoints. */
class RefusalInBatch extends Error {}

/**
 * Savepoints cost round trips, so a batch is first applied without them; only when a change is
 * refused is it applied again with one savepoint per change.
 */
async function applyBatch(
  ctx: ServerContext,
  role: Role,
  userId: string,
  workshopId: string,
  raw: readonly unknown[],
  isolate: boolean,
): Promise<PushAnswer> {
  const afterCommit: (() => Promise<void>)[] = [];
  const answer = await ctx.db.transaction(async (tx) => {
    // One change number for the batch (it commits as one), taken when the first change is applied,
    // so a batch of replays changes nothing at all. The workshop stays locked until the commit.
    let batchCtx: ServerContext | null = null;
    const recorded: (typeof pushedMutations.$inferInsert)[] = [];
    const ids = raw
      .map((item) => idOnly.safeParse(item).data?.mutationId)
      .filter((id): id is string => id !== undefined);
    const earlier = ids.length
      ? await tx.select().from(pushedMutations).where(inArray(pushedMutations.mutationId, ids))
      : [];
    const answered = new Map(earlier.map((row) => [row.mutationId, row.result]));
    const results: MutationResult[] = [];
    for (const item of raw) {
      const mutationId = idOnly.safeParse(item).data?.mutationId;
      if (mutationId === undefined) {
        results.push(rejection('', refusedShape(item)));
        continue;
      }
      const known = answered.get(mutationId);
      if (known) {
        results.push(known);
        continue;
      }
      batchCtx ??= {
        ...ctx,
        db: tx as unknown as Database,
        batch: { role, changeNumber: await stampChange(tx, workshopId), afterCommit },
      };
      const result = await applyOne(batchCtx, userId, workshopId, mutationId, item, isolate);
      recorded.push({ mutationId, workshopId, userId, result });
      answered.set(mutationId, result);
      results.push(result);
    }
    if (recorded.length > 0) await tx.insert(pushedMutations).values(recorded);
    return { results };
  });
  for (const work of afterCommit) await work();
  return answer;
}

async function applyOne(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  mutationId: string,
  item: unknown,
  isolate: boolean,
): Promise<MutationResult> {
  const parsed = mutationSchema.safeParse(item);
  if (!parsed.success) return rejection(mutationId, refusedShape(item));
  const queued = ctx.batch!.afterCommit.length;
  try {
    if (isolate) {
      // A savepoint: a refused mutation leaves no trace, and the batch goes on.
      await ctx.db.transaction((savepoint) =>
        applyMutation({ ...ctx, db: savepoint as unknown as Database }, userId, workshopId, parsed.data),
      );
    } else {
      await applyMutation(ctx, userId, workshopId, parsed.data);
    }
  } catch (error) {
    if (error instanceof AppError && error.status < 500) {
      if (!isolate) throw new RefusalInBatch();
      // Its savepoint is rolled back, so nothing it queued for after the commit may run.
      ctx.batch!.afterCommit.length = queued;
      return rejection(mutationId, error);
    }
    throw error;
  }
  return { mutationId, status: 'applied', changeNumber: ctx.batch!.changeNumber };
}
