/**
 * A pour as it is really poured: the layers already on (when, at what room temperature, what was
 * weighed) and the layers still to come, re-timed from the real ones. The plan made at Start assumes
 * each layer goes on at the earliest recoat time of the one before; once a layer is recorded, every
 * later moment counts from its real time and the temperature of its room, and layers still to come
 * are projected at the last known temperature, never before now.
 */
import {
  after,
  correctedTimes,
  layerTimesAt,
  temperatureCorrection,
  type CureDataSheet,
  type LayerTimes,
} from './cure.js';
import { formatLength, formatMass } from './format.js';
import { mixAmounts, type PartAmounts } from './mix.js';
import type { PourPlan } from './pour-plan.js';
import { MAX_LAYERS } from './schemas.js';

/** What a poured layer's record holds: its real time and room, and the plan it was poured to. */
export interface PouredLayer {
  readonly number: number;
  readonly pouredAtMs: number;
  readonly roomTempC: number;
  /** Planned when it was poured, kept as it was whatever is re-planned later. */
  readonly depthMm: number;
  readonly partAG: number;
  readonly partBG: number;
  /** What was really weighed, when the modeller recorded it. */
  readonly weighedAG?: number | null;
  readonly weighedBG?: number | null;
}

export interface LayerAmounts {
  readonly depthMm: number;
  readonly partAG: number;
  readonly partBG: number;
  readonly partAMl: number;
  readonly partBMl: number;
}

export interface FollowedLayer extends LayerTimes {
  readonly poured: boolean;
  readonly roomTempC: number;
  readonly planned: LayerAmounts;
  /** Only on a poured layer whose amounts were recorded. */
  readonly weighed?: { readonly partAG: number; readonly partBG: number };
  /** When the plan made at Start had this layer going on; absent for a layer added since. */
  readonly plannedAtMs?: number;
}

export interface FollowedPour {
  readonly layerCount: number;
  readonly pouredCount: number;
  readonly layers: readonly FollowedLayer[];
  /** The first layer not yet on, or null once all are. */
  readonly next: FollowedLayer | null;
  /** Count from the last layer, real or projected. */
  readonly demouldAtMs: number;
  readonly fullCureAtMs: number;
  readonly plannedDemouldAtMs: number;
  readonly plannedFullCureAtMs: number;
  /** Grams of each part the whole pour takes: what was weighed where recorded, the plan elsewhere. */
  readonly needG: { readonly partA: number; readonly partB: number };
}

export interface FollowPourInput {
  readonly plan: PourPlan;
  /** The number of layers now planned: the plan's own until the modeller adds, skips or re-splits. */
  readonly layerCount: number;
  readonly poured: readonly PouredLayer[];
  /** Layers still to come are not projected before this moment. */
  readonly nowMs?: number;
}

const MILLI = 1000;
const toMilli = (value: number) => Math.round(value * MILLI) / MILLI;
// Depths within this of the maximum are within it: 6 mm split in 3 is 2.0000000000000004 in binary.
const DEPTH_TOLERANCE_MM = 1e-9;

/** The plan's amounts for the layers not yet poured, split evenly over the depth left. */
export function remainingLayers(
  plan: PourPlan,
  layerCount: number,
  poured: readonly Pick<PouredLayer, 'depthMm'>[],
): { readonly perLayer: LayerAmounts; readonly total: PartAmounts; readonly count: number } | null {
  const count = layerCount - poured.length;
  if (count <= 0) return null;
  const { request, volume, mix, layers } = plan;
  const pouredDepthMm = poured.reduce((sum, layer) => sum + layer.depthMm, 0);
  const depthLeftMm = Math.max(0, request.depthMm - pouredDepthMm);
  if (
    layerCount === layers.count &&
    Math.abs(depthLeftMm - count * layers.layerDepthMm) <= DEPTH_TOLERANCE_MM * count
  ) {
    // The plan as made at Start: its own rounded amounts, so an unchanged pour draws exactly what it planned.
    const total = subtractLayers(mix.total, mix.perLayer, poured.length);
    return { perLayer: { depthMm: layers.layerDepthMm, ...amountsOf(mix.perLayer) }, total, count };
  }
  const { material } = request;
  const share = request.depthMm > 0 ? depthLeftMm / request.depthMm : 0;
  const remaining = mixAmounts({
    volumeMl: volume.totalToMixMl * share,
    ratio: material.mixRatio,
    densityAGPerMl: material.densityAGPerMl,
    ...(material.densityBGPerMl === undefined ? {} : { densityBGPerMl: material.densityBGPerMl }),
    ...(material.ratioTolerancePercent === undefined ? {} : { tolerancePercent: material.ratioTolerancePercent }),
    layerCount: count,
    scaleResolutionG: request.scaleResolutionG,
    cupResolutionMl: request.cupResolutionMl,
  });
  return {
    perLayer: { depthMm: depthLeftMm / count, ...amountsOf(remaining.perLayer) },
    total: remaining.total,
    count,
  };
}

function amountsOf(parts: PartAmounts) {
  return { partAG: parts.partAG, partBG: parts.partBG, partAMl: parts.partAMl, partBMl: parts.partBMl };
}

function subtractLayers(total: PartAmounts, perLayer: PartAmounts, layers: number): PartAmounts {
  const less = (key: keyof PartAmounts) => toMilli(Math.max(0, total[key] - perLayer[key] * layers));
  return {
    partAG: less('partAG'),
    partBG: less('partBG'),
    partAMl: less('partAMl'),
    partBMl: less('partBMl'),
    totalG: less('totalG'),
    totalMl: less('totalMl'),
  };
}

/** Each layer's moments at its own room temperature, layers to come projected; demould and cure from the last. */
export function followPour(input: FollowPourInput): FollowedPour {
  const { plan, layerCount, nowMs } = input;
  const poured = [...input.poured].sort((a, b) => a.number - b.number);
  if (!Number.isInteger(layerCount) || layerCount < Math.max(1, poured.length) || layerCount > MAX_LAYERS) {
    throw new RangeError(
      `Layer count must be a whole number from ${Math.max(1, poured.length)} to ${MAX_LAYERS}, got ${layerCount}`,
    );
  }
  poured.forEach((layer, index) => {
    if (layer.number !== index + 1)
      throw new RangeError(`Poured layers must be 1, 2, 3...; found layer ${layer.number} at ${index + 1}`);
  });
  const dataSheet: CureDataSheet = plan.request.material;
  const timesAt = (roomTempC: number) => correctedTimes(dataSheet, temperatureCorrection(dataSheet, roomTempC).factor);
  const plannedLayers = plan.cure.layers;

  const layers: FollowedLayer[] = poured.map((layer) => ({
    ...layerTimesAt(layer.number, layer.pouredAtMs, timesAt(layer.roomTempC)),
    poured: true,
    roomTempC: layer.roomTempC,
    planned: plannedAmounts(layer, plan),
    ...(layer.weighedAG == null ? {} : { weighed: { partAG: layer.weighedAG, partBG: layer.weighedBG ?? 0 } }),
    ...plannedAt(plannedLayers[layer.number - 1]),
  }));
  const rest = remainingLayers(plan, layerCount, poured);
  const lastTempC = poured.at(-1)?.roomTempC ?? plan.request.roomTempC;
  const restTimes = timesAt(lastTempC);
  for (let number = poured.length + 1; number <= layerCount; number += 1) {
    const below = layers.at(-1);
    const earliest = below ? below.recoatFromMs : plan.request.startAtMs;
    const pourAtMs = nowMs === undefined ? earliest : Math.max(earliest, nowMs);
    layers.push({
      ...layerTimesAt(number, pourAtMs, restTimes),
      poured: false,
      roomTempC: lastTempC,
      planned: rest!.perLayer,
      ...plannedAt(plannedLayers[number - 1]),
    });
  }
  const last = layers.at(-1)!;
  const lastTimes = last.poured ? timesAt(last.roomTempC) : restTimes;
  const needOf = (part: 'partAG' | 'partBG') => {
    const done = layers
      .filter((layer) => layer.poured)
      .reduce((sum, layer) => sum + (layer.weighed?.[part] ?? layer.planned[part]), 0);
    return toMilli(done + (rest?.total[part] ?? 0));
  };
  return {
    layerCount,
    pouredCount: poured.length,
    layers,
    next: layers.find((layer) => !layer.poured) ?? null,
    demouldAtMs: after(last.pourAtMs, lastTimes.demouldMin),
    fullCureAtMs: after(last.pourAtMs, lastTimes.fullCureMin),
    plannedDemouldAtMs: plan.cure.demouldAtMs,
    plannedFullCureAtMs: plan.cure.fullCureAtMs,
    needG: { partA: needOf('partAG'), partB: needOf('partBG') },
  };
}

function plannedAt(layer: LayerTimes | undefined) {
  return layer === undefined ? {} : { plannedAtMs: layer.pourAtMs };
}

function plannedAmounts(layer: PouredLayer, plan: PourPlan): LayerAmounts {
  const { densityAGPerMl, densityBGPerMl } = plan.request.material;
  return {
    depthMm: layer.depthMm,
    partAG: layer.partAG,
    partBG: layer.partBG,
    partAMl: toMilli(layer.partAG / densityAGPerMl),
    partBMl: toMilli(layer.partBG / (densityBGPerMl ?? densityAGPerMl)),
  };
}

/** Plain words for a layer count the depth left cannot take, or null when it can. */
export function layerCountProblem(
  plan: PourPlan,
  layerCount: number,
  poured: readonly Pick<PouredLayer, 'depthMm'>[],
): string | null {
  if (!Number.isInteger(layerCount)) return 'The number of layers must be a whole number.';
  if (layerCount > MAX_LAYERS) return `A pour can have at most ${MAX_LAYERS} layers.`;
  if (layerCount < Math.max(1, poured.length)) {
    return `${poured.length} layers are already poured; the pour cannot have fewer.`;
  }
  const depthLeftMm = plan.request.depthMm - poured.reduce((sum, layer) => sum + layer.depthMm, 0);
  const toCome = layerCount - poured.length;
  const { maxLayerMm } = plan.request.material;
  if (toCome === 0 && depthLeftMm > DEPTH_TOLERANCE_MM) {
    return `${formatLength(depthLeftMm)} is still to pour: keep at least one more layer.`;
  }
  if (toCome > 0 && depthLeftMm / toCome > maxLayerMm + DEPTH_TOLERANCE_MM) {
    const fewest = poured.length + Math.ceil(depthLeftMm / maxLayerMm - DEPTH_TOLERANCE_MM);
    return `${formatLength(depthLeftMm)} is still to pour, at most ${formatLength(maxLayerMm)} a layer: at least ${fewest} layers in all. Thicker layers can overheat, crack or yellow.`;
  }
  return null;
}

export interface LayerCandidate {
  readonly number: number;
  readonly pouredAtMs: number;
}

export type LayerProblemCode = 'already-poured' | 'out-of-order' | 'beyond-plan' | 'before-layer-below' | 'in-future';

/** Common practice: a time a little ahead covers a phone's clock; an hour ahead is a slip of the finger. */
export const MAX_FUTURE_MS = 60 * 60_000;

/**
 * Why a layer cannot be recorded as poured, in plain words, or null when it can: it must be the next
 * one, within the plan, not before the layer below it and not more than an hour ahead of now.
 */
export function layerProblem(
  followed: FollowedPour,
  candidate: LayerCandidate,
  nowMs: number,
  formatTime: (ms: number) => string = isoMinute,
): { readonly code: LayerProblemCode; readonly field: string; readonly message: string } | null {
  const { number, pouredAtMs } = candidate;
  const kept = followed.layers[number - 1];
  if (kept?.poured) {
    return {
      code: 'already-poured',
      field: 'number',
      message: `Layer ${number} was already recorded as poured at ${formatTime(kept.pourAtMs)}; that time is kept.`,
    };
  }
  if (number > followed.layerCount) {
    return {
      code: 'beyond-plan',
      field: 'number',
      message: `This pour has ${followed.layerCount} layers. Add a layer to the plan first.`,
    };
  }
  if (number !== followed.pouredCount + 1) {
    return {
      code: 'out-of-order',
      field: 'number',
      message: `Layer ${followed.pouredCount + 1} comes before layer ${number}.`,
    };
  }
  const below = followed.layers[number - 2];
  if (below && pouredAtMs < below.pourAtMs) {
    return {
      code: 'before-layer-below',
      field: 'pouredAt',
      message: `Layer ${number} cannot go on before layer ${number - 1}, which was poured at ${formatTime(below.pourAtMs)}.`,
    };
  }
  if (pouredAtMs > nowMs + MAX_FUTURE_MS) {
    return {
      code: 'in-future',
      field: 'pouredAt',
      message: 'That time is more than an hour from now. Record a layer when it is poured.',
    };
  }
  return null;
}

/** YYYY-MM-DD HH:MM UTC: for the server's words, where the modeller's time zone is not known. */
function isoMinute(ms: number): string {
  return `${new Date(ms).toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/** Common practice: without a tolerance on the data sheet, a few percent off the ratio leaves soft spots. */
export const DEFAULT_WEIGHED_TOLERANCE_PERCENT = 5;

/**
 * Plain words when what was weighed strays from the data sheet's ratio by more than it allows
 * (or 5 % when it says nothing), or null. Judged on part B per gram of part A, as weighed.
 */
export function weighedRatioProblem(
  plan: PourPlan,
  weighed: { readonly partAG: number; readonly partBG: number },
  tolerancePercent = plan.request.material.ratioTolerancePercent ?? DEFAULT_WEIGHED_TOLERANCE_PERCENT,
): string | null {
  const { exactPerLayer, singlePart } = plan.mix;
  if (singlePart || exactPerLayer.partAG === 0 || exactPerLayer.partBG === 0) return null;
  if (!(weighed.partAG > 0) || !(weighed.partBG > 0)) return 'Record both parts, each more than 0 g.';
  const shiftPercent =
    Math.abs(weighed.partBG / weighed.partAG / (exactPerLayer.partBG / exactPerLayer.partAG) - 1) * 100;
  if (shiftPercent <= tolerancePercent) return null;
  const wantedBG = weighed.partAG * (exactPerLayer.partBG / exactPerLayer.partAG);
  return (
    `${formatMass(weighed.partAG)} of part A and ${formatMass(weighed.partBG)} of part B is ${Math.round(shiftPercent)} % off the ratio ` +
    `(the data sheet allows ${tolerancePercent} %): part A wants ${formatMass(wantedBG)} of part B. ` +
    'Adjust before stirring if you can; an off-ratio mix can stay soft or tacky.'
  );
}

/** Layer 1 as recorded with its pour: poured at the pour's start, in the room it was planned for. */
export function firstLayer(plan: Pick<PourPlan, 'layers' | 'mix'>, startAt: string, roomTempC: number) {
  return {
    number: 1,
    pouredAt: startAt,
    roomTempC,
    depthMm: plan.layers.layerDepthMm,
    partAG: plan.mix.perLayer.partAG,
    partBG: plan.mix.perLayer.partBG,
    weighedAG: null,
    weighedBG: null,
    note: '',
  };
}

/** A layer record (device or server row) as the maths takes it. */
export function pouredLayerOf(record: {
  readonly number: number;
  readonly pouredAt: string | Date;
  readonly roomTempC: number;
  readonly depthMm: number;
  readonly partAG: number;
  readonly partBG: number;
  readonly weighedAG?: number | null;
  readonly weighedBG?: number | null;
}): PouredLayer {
  const pouredAtMs = record.pouredAt instanceof Date ? record.pouredAt.getTime() : Date.parse(record.pouredAt);
  return { ...record, pouredAtMs };
}
