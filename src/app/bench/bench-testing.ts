import {
  firstLayer,
  followedMilestones,
  planPour,
  type MaterialDataSheetInput,
  type PourPlan,
} from '@benchtide/shared';
import type { LocalPour, LocalPourLayer } from '../sync/synced-records';
import { followAt, type PourOnBench } from './bench-today';

/**
 * An invented data sheet, no maker's figures: 1:1 by weight, both parts 1 g/mL, working time 40 min,
 * recoat from 6 h, demould after 24 h and full cure after 72 h, all at 20 °C, at most 5 mm a layer.
 */
export const BENCH_DATA_SHEET: MaterialDataSheetInput = {
  mixRatio: { basis: 'weight', partA: 1, partB: 1 },
  densityAGPerMl: 1,
  densityBGPerMl: 1,
  potLifeMin: 40,
  recoatMin: 360,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 5,
};

export interface LaterLayer {
  readonly number: number;
  readonly pouredAtMs: number;
  readonly roomTempC?: number;
  readonly weighedAG?: number;
  readonly weighedBG?: number;
}

const SYNCED = { workshopId: 'workshop-1', createdAt: '', updatedAt: '', deletedAt: null, changeNumber: 1 };

/**
 * A pour on the bench as the bench reads it: 100 × 60 × 12 mm (72 mL) in 3 layers of 4 mm, 24 mL each,
 * 12 g of each part a layer (1 g/mL, 1:1), in a 20 °C room, with layer 1 at `startMs` and the later
 * layers given.
 */
export function benchPour(
  startMs: number,
  later: readonly LaterLayer[] = [],
  dataSheet: MaterialDataSheetInput = BENCH_DATA_SHEET,
): PourOnBench {
  const planned = planPour({
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 60 },
    depthMm: 12,
    roomTempC: 20,
    layerCount: 3,
    startAtMs: startMs,
    scaleResolutionG: 0.1,
    material: dataSheet,
  });
  if (!planned.ok) throw new Error(`The spec pour cannot be planned: ${JSON.stringify(planned.errors)}`);
  const { request, ...plan } = planned.plan;
  const startAt = new Date(startMs).toISOString();
  const record = { request, plan, layerCount: 3 } satisfies Pick<LocalPour, 'request' | 'plan' | 'layerCount'>;
  const layers: LocalPourLayer[] = [
    { ...SYNCED, id: 'pour-1', pourId: 'pour-1', ...firstLayer(plan, startAt, 20) },
    ...later.map((layer) => ({
      ...SYNCED,
      id: `layer-${layer.number}`,
      pourId: 'pour-1',
      number: layer.number,
      pouredAt: new Date(layer.pouredAtMs).toISOString(),
      roomTempC: layer.roomTempC ?? 20,
      depthMm: 4,
      partAG: 12,
      partBG: 12,
      weighedAG: layer.weighedAG ?? null,
      weighedBG: layer.weighedBG ?? null,
      note: '',
    })),
  ];
  const followed = followAt({ record, layers }, startMs);
  return {
    id: 'pour-1',
    buildId: 'build-1',
    buildName: 'Mill race',
    materialName: 'Clear casting resin',
    note: 'The mill pond',
    startMs,
    layerCount: 3,
    followed,
    milestones: followedMilestones(followed),
    mix: plan.mix,
    plan: planned.plan as PourPlan,
    record,
    layers,
  };
}
