import { and, eq, inArray, isNull } from 'drizzle-orm';
import type { Database } from '../db/database.js';
import { containers, containerStock } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';

type Queryable = Database | Transaction;

/**
 * Remaining stock of each container, in the container's unit: the sum of its live ledger entries,
 * as the database keeps it running (container_stock).
 */
export async function remainingOf(db: Queryable, containerIds: readonly string[]): Promise<Map<string, number>> {
  if (containerIds.length === 0) return new Map();
  const rows = await db
    .select({ containerId: containerStock.containerId, remaining: containerStock.remaining })
    .from(containerStock)
    .where(inArray(containerStock.containerId, [...containerIds]));
  return new Map(rows.map((row) => [row.containerId, Number(row.remaining)]));
}

export type ContainerRow = typeof containers.$inferSelect;

/** Live containers of a material, locked until the transaction ends so two pours cannot both spend the same grams. */
export async function lockedContainersOf(
  tx: Transaction,
  workshopId: string,
  materialId: string,
): Promise<ContainerRow[]> {
  return tx
    .select()
    .from(containers)
    .where(
      and(eq(containers.workshopId, workshopId), eq(containers.materialId, materialId), isNull(containers.deletedAt)),
    )
    .orderBy(containers.boughtOn, containers.id)
    .for('update');
}
