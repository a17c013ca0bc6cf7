import { remainingByContainer } from '@benchtide/shared';
import type { BenchDb } from './bench-db';

/**
 * What is left in each container by this device's stock book: the sum of its live entries, the ones
 * still waiting to be sent included. Call inside a live query to follow the stock as it changes.
 */
export async function remainingOnDevice(db: BenchDb, containerIds: readonly string[]): Promise<Record<string, number>> {
  const entries = await db.ledgerEntries
    .where('containerId')
    .anyOf([...containerIds])
    .filter((entry) => entry.deletedAt === null)
    .toArray();
  return remainingByContainer(entries.map((entry) => ({ ...entry, atMs: Date.parse(entry.at) })));
}
