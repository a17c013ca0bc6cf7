import { eq, sql } from 'drizzle-orm';
import type { Database } from '../db/database.js';
import { workshops } from '../db/schema/index.js';

export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];

/**
 * The next change number of a workshop. The UPDATE locks the workshop's row until the writing
 * transaction ends, so numbers are taken in commit order: a reader that has seen number n has
 * seen every change before it (no holes from a slow transaction committing late).
 */
export async function stampChange(tx: Transaction, workshopId: string): Promise<number> {
  const [row] = await tx
    .update(workshops)
    .set({ changeCounter: sql`${workshops.changeCounter} + 1` })
    .where(eq(workshops.id, workshopId))
    .returning({ changeNumber: workshops.changeCounter });
  return row!.changeNumber;
}
