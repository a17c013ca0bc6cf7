import { followPour, pouredLayerOf, type FollowedPour, type PourPlan } from '@benchtide/shared';
import type { BenchDb } from './bench-db';
import type { LocalPour, LocalPourLayer } from './synced-records';

/** A pour on this device as really poured: its plan and the layers recorded so far. */
export function followLocalPour(
  pour: Pick<LocalPour, 'request' | 'plan' | 'layerCount'>,
  layers: readonly LocalPourLayer[],
  nowMs?: number,
): FollowedPour {
  const plan = { ...pour.plan, request: pour.request } as PourPlan;
  const poured = layers.filter((layer) => !layer.deletedAt).map(pouredLayerOf);
  return followPour({
    plan,
    layerCount: Math.max(pour.layerCount ?? plan.layers.count, poured.length),
    poured,
    ...(nowMs === undefined ? {} : { nowMs }),
  });
}

/** The live layers of each pour given, by pour id, lowest number first. */
export async function layersOfPours(db: BenchDb, pourIds: readonly string[]): Promise<Map<string, LocalPourLayer[]>> {
  const rows = await db.pourLayers
    .where('pourId')
    .anyOf([...pourIds])
    .toArray();
  const byPour = new Map<string, LocalPourLayer[]>(pourIds.map((id) => [id, []]));
  for (const row of rows) if (row.deletedAt === null) byPour.get(row.pourId)?.push(row);
  for (const list of byPour.values()) list.sort((a, b) => a.number - b.number);
  return byPour;
}
