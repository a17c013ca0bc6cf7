import { ledgerEntryProblem, remainingByContainer, type ShelfContainer } from '@benchtide/shared';
import type { BenchDb } from './bench-db';

const CONTAINER_NOT_HERE =
  'A container chosen for this pour is not on this device’s shelf for that material. Choose again; nothing was saved.';

/**
 * What is left in each container by this device's stock book: the sum of its live entries, the ones
 * still waiting to be sent included. Call inside a live query to follow the stock as it changes.
 * An entry that cannot be summed (not a number, wrong sign: a damaged store) is left out rather than
 * turn the whole shelf into NaN; the server's stock book stays the truth and sync brings it back.
 */
export async function remainingOnDevice(db: BenchDb, containerIds: readonly string[]): Promise<Record<string, number>> {
  const entries = await db.ledgerEntries
    .where('containerId')
    .anyOf([...containerIds])
    .filter((entry) => entry.deletedAt === null && ledgerEntryProblem(entry) === null)
    .toArray();
  return remainingByContainer(entries.map((entry) => ({ ...entry, atMs: Date.parse(entry.at) })));
}

/** A material's live containers on this device, each with what its stock book here says is left. */
export async function shelfOnDevice(
  db: BenchDb,
  workshopId: string,
  pour: { materialId: string; containerIds?: readonly string[] },
): Promise<ShelfContainer[]> {
  const containers = await db.containers
    .where({ materialId: pour.materialId })
    .filter((container) => container.workshopId === workshopId && container.deletedAt === null)
    .toArray();
  if (pour.containerIds?.some((id) => !containers.some((container) => container.id === id))) {
    throw new Error(CONTAINER_NOT_HERE);
  }
  const sums = await remainingOnDevice(
    db,
    containers.map((container) => container.id),
  );
  return containers.map((container) => ({ ...container, remainingQty: sums[container.id] ?? 0 }));
}
