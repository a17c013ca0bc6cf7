import { and, eq, inArray, isNull } from 'drizzle-orm';
import type { FollowedPour } from '../../shared/pour-layers.js';
import { drawForPour, stockShortMessage, type NeedG } from '../../shared/pour-draw.js';
import type { PourPlan } from '../../shared/pour-plan.js';
import { AppError } from '../core/app-error.js';
import { ledgerEntries, pours, type PourShortfall } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';
import { uuidv7 } from '../records/ids.js';
import type { UnitOfWork } from '../records/unit-of-work.js';
import { lockedContainersOf, remainingOf } from '../shelf/stock.js';
import { planOf, type PourRow } from './followed-pour-row.js';

const MILLI = 1000;

export interface DrawRequest {
  readonly workshopId: string;
  readonly pourId: string;
  readonly materialId: string;
  readonly plan: PourPlan;
  readonly chosenContainerIds?: readonly string[] | null;
  /** What the pour takes as followed layer by layer; the plan's totals when absent. */
  readonly needG?: NeedG;
}

/**
 * Takes each part from the shelf, oldest container first (or from the chosen ones), under row locks,
 * as if the pour's own live uses were back on the shelf: what a pour draws when it is logged and each
 * time its layers change. Writes nothing; `ledgerEntriesOf` turns the uses into stock-book entries.
 */
export async function drawFromShelf(tx: Transaction, request: DrawRequest) {
  const held = await lockedContainersOf(tx, request.workshopId, request.materialId);
  const remaining = await remainingOf(
    tx,
    held.map((container) => container.id),
  );
  // container_stock sums live entries only: the pour's own uses are added back, as they are to be replaced.
  const own = await liveUsesOf(tx, request.pourId);
  for (const use of own) {
    remaining.set(use.containerId, Math.round(((remaining.get(use.containerId) ?? 0) - use.quantity) * MILLI) / MILLI);
  }
  const shelf = held.map((container) => ({ ...container, remainingQty: remaining.get(container.id) ?? 0 }));
  const draw = drawForPour(request.plan, shelf, request.chosenContainerIds ?? undefined, request.needG);
  return { ...draw, own };
}

export const liveUsesOf = (tx: Transaction, pourId: string) =>
  tx
    .select()
    .from(ledgerEntries)
    .where(and(eq(ledgerEntries.pourId, pourId), eq(ledgerEntries.kind, 'pour-use'), isNull(ledgerEntries.deletedAt)));

export function refuseShort(request: DrawRequest, shortfall: readonly PourShortfall[]): never {
  throw new AppError(409, 'stock_short', stockShortMessage(request.plan, shortfall, request.needG));
}

export function ledgerEntriesOf(
  uses: readonly { containerId: string; quantity: number; costMinor: number }[],
  where: { workshopId: string; pourId: string; changeNumber: number; at: Date },
) {
  return uses.map(({ containerId, quantity, costMinor }) => ({
    id: uuidv7(),
    workshopId: where.workshopId,
    changeNumber: where.changeNumber,
    containerId,
    kind: 'pour-use' as const,
    quantity: -quantity,
    costMinor,
    at: where.at,
    pourId: where.pourId,
  }));
}

const sameUses = (
  a: readonly { containerId: string; quantity: number }[],
  b: readonly { containerId: string; quantity: number }[],
) => {
  const key = (uses: readonly { containerId: string; quantity: number }[]) =>
    uses
      .map((use) => `${use.containerId}:${Math.abs(use.quantity).toFixed(3)}`)
      .sort()
      .join(' ');
  return key(a) === key(b);
};

/**
 * Draws a pour again from what it now takes (what was weighed, or a re-planned rest), in place of its
 * uses so far, and bumps the pour row so devices pull its new state. Refused, before anything is written,
 * when the shelf falls short of a part the pour was not short of before: record less, or restock first.
 */
export async function redrawPour(work: UnitOfWork, pour: PourRow, followed: FollowedPour): Promise<PourRow> {
  const { tx, workshopId, changeNumber } = work;
  const request: DrawRequest = {
    workshopId,
    pourId: pour.id,
    materialId: pour.materialId,
    plan: planOf(pour),
    chosenContainerIds: pour.chosenContainerIds,
    needG: followed.needG,
  };
  const { uses, shortfall, own } = await drawFromShelf(tx, request);
  const newlyShort = shortfall.filter((short) => !pour.shortfall.some((before) => before.part === short.part));
  if (newlyShort.length > 0) refuseShort(request, shortfall);
  const now = work.clock.now();
  if (!sameUses(uses, own)) {
    if (own.length > 0) {
      await tx
        .update(ledgerEntries)
        .set({ deletedAt: now, updatedAt: now, changeNumber })
        .where(
          inArray(
            ledgerEntries.id,
            own.map((entry) => entry.id),
          ),
        );
    }
    const entries = ledgerEntriesOf(uses, { workshopId, pourId: pour.id, changeNumber, at: pour.startAt });
    if (entries.length > 0) await tx.insert(ledgerEntries).values(entries);
  } else if (own.length > 0) {
    // A device that recorded the layer drew again under its own ids and set these aside; stamped with this
    // change they reach it again with the layer, and stand once more.
    await tx
      .update(ledgerEntries)
      .set({ updatedAt: now, changeNumber })
      .where(
        inArray(
          ledgerEntries.id,
          own.map((entry) => entry.id),
        ),
      );
  }
  const [row] = await tx
    .update(pours)
    .set({ shortfall, updatedAt: now, changeNumber })
    .where(eq(pours.id, pour.id))
    .returning();
  return row!;
}
