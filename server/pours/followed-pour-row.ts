import { and, asc, eq, isNull } from 'drizzle-orm';
import { followPour, pouredLayerOf, type FollowedPour } from '../../shared/pour-layers.js';
import type { PourPlan } from '../../shared/pour-plan.js';
import { pourLayers, pours } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';

export type PourRow = typeof pours.$inferSelect;
export type PourLayerRow = typeof pourLayers.$inferSelect;

/** The plan as planPour made it: the request kept beside what was computed from it. */
export const planOf = (pour: Pick<PourRow, 'request' | 'plan'>): PourPlan => ({ request: pour.request, ...pour.plan });

export async function liveLayersOf(tx: Transaction, pourId: string): Promise<PourLayerRow[]> {
  return tx
    .select()
    .from(pourLayers)
    .where(and(eq(pourLayers.pourId, pourId), isNull(pourLayers.deletedAt)))
    .orderBy(asc(pourLayers.number));
}

/** A pour followed from its recorded layers, with `layerCount` and `layers` changed where a write would change them. */
export function followRow(
  pour: Pick<PourRow, 'request' | 'plan' | 'layerCount'>,
  layers: readonly PourLayerRow[],
  change: { layerCount?: number; nowMs?: number } = {},
): FollowedPour {
  return followPour({
    plan: planOf(pour),
    layerCount: change.layerCount ?? pour.layerCount,
    poured: layers.map(pouredLayerOf),
    ...(change.nowMs === undefined ? {} : { nowMs: change.nowMs }),
  });
}
