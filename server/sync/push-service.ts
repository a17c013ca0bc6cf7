import { inArray } from 'drizzle-orm';
import * as z from 'zod';
import { SYNCED_ENTITIES, type SyncedEntity } from '../../shared/record-kinds.js';
import {
  mutationSchema,
  type MutationResult,
  type ParsedMutation,
  type PushAnswer,
} from '../../shared/sync-schemas.js';
import { may } from '../../shared/workshop-policy.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { pushedMutations } from '../db/schema/index.js';
import { AfterCommit, openWork, type UnitOfWork } from '../records/unit-of-work.js';
import { authorize, forbidden } from '../workshops/workshop-service.js';
import { serviceOf } from './record-services.js';

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
 * Applies a device's outbox in order, in one transaction with one change number (it commits as one).
 * A change that can never apply (a viewer's write, an edit to a deleted record, bad data) is answered
 * as rejected and the ones behind it still apply: services refuse before they write, so a refused
 * change leaves nothing behind, and the few that can refuse after writing run in a savepoint of their
 * own (decided by their service, up front). Every answer is recorded, so a replay after a lost
 * response changes nothing and answers the same. Anything else (the database going away) rolls the
 * whole batch back; the device retries later.
 */
export async function push(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  raw: readonly unknown[],
): Promise<PushAnswer> {
  const role = await authorize(ctx.db, userId, workshopId, 'view');
  const later = new AfterCommit();
  const answer = await ctx.db.transaction(async (tx) => {
    const recorded: (typeof pushedMutations.$inferInsert)[] = [];
    const ids = raw
      .map((item) => idOnly.safeParse(item).data?.mutationId)
      .filter((id): id is string => id !== undefined);
    const earlier = ids.length
      ? await tx.select().from(pushedMutations).where(inArray(pushedMutations.mutationId, ids))
      : [];
    const answered = new Map(earlier.map((row) => [row.mutationId, row.result]));
    // Taken when the first new change comes, so a batch of replays changes nothing at all. The
    // workshop stays locked until the commit.
    let work: UnitOfWork | null = null;
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
      work ??= await openWork(ctx, tx, { role, userId, workshopId }, later);
      const result = await applyOne(ctx, work, later, mutationId, item);
      recorded.push({ mutationId, workshopId, userId, result });
      answered.set(mutationId, result);
      results.push(result);
    }
    if (recorded.length > 0) await tx.insert(pushedMutations).values(recorded);
    return { results };
  });
  await later.run();
  return answer;
}

async function applyOne(
  ctx: ServerContext,
  work: UnitOfWork,
  later: AfterCommit,
  mutationId: string,
  item: unknown,
): Promise<MutationResult> {
  const parsed = mutationSchema.safeParse(item);
  if (!parsed.success) return rejection(mutationId, refusedShape(item));
  if (!may(work.role, 'write-builds')) {
    return rejection(mutationId, forbidden(work.role));
  }
  const mutation = parsed.data;
  const service = serviceOf(kindOf(mutation));
  const queued = later.size;
  try {
    if (service.needsSavepoint(mutation)) {
      await work.tx.transaction((savepoint) => service.apply({ ...work, tx: savepoint }, mutation, ctx));
    } else {
      await service.apply(work, mutation, ctx);
    }
  } catch (error) {
    if (error instanceof AppError && error.status < 500) {
      // Nothing it wrote is kept, so nothing it queued for after the commit may run.
      later.forgetFrom(queued);
      return rejection(mutationId, error);
    }
    throw error;
  }
  return { mutationId, status: 'applied', changeNumber: work.changeNumber };
}

function kindOf(mutation: ParsedMutation): SyncedEntity {
  return SYNCED_ENTITIES.find((kind) => mutation.type.startsWith(`${kind}.`))!;
}
