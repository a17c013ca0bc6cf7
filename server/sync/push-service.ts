import { eq, inArray } from 'drizzle-orm';
import { z } from 'zod';
import { mutationSchema, type MutationResult, type PushAnswer } from '../../shared/sync-schemas.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import type { Database } from '../db/database.js';
import { pushedMutations, workshops } from '../db/schema/index.js';
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
  await authorize(ctx.db, userId, workshopId, 'view');
  return ctx.db.transaction(async (tx) => {
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
      const result = await applyOne(ctx, tx as unknown as Database, userId, workshopId, mutationId, item);
      await tx.insert(pushedMutations).values({ mutationId, workshopId, userId, result });
      answered.set(mutationId, result);
      results.push(result);
    }
    return { results };
  });
}

async function applyOne(
  ctx: ServerContext,
  tx: Database,
  userId: string,
  workshopId: string,
  mutationId: string,
  item: unknown,
): Promise<MutationResult> {
  const parsed = mutationSchema.safeParse(item);
  if (!parsed.success) return rejection(mutationId, refusedShape(item));
  try {
    // A savepoint: a refused mutation leaves no trace, and the batch goes on.
    await tx.transaction((savepoint) =>
      applyMutation({ ...ctx, db: savepoint as unknown as Database }, userId, workshopId, parsed.data),
    );
  } catch (error) {
    if (error instanceof AppError && error.status < 500) return rejection(mutationId, error);
    throw error;
  }
  const [workshop] = await tx
    .select({ changeNumber: workshops.changeCounter })
    .from(workshops)
    .where(eq(workshops.id, workshopId));
  return { mutationId, status: 'applied', changeNumber: workshop!.changeNumber };
}
