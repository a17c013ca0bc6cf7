/**
 * One pour, planned end to end: volume, layers, part A and B, and the cure schedule.
 * The pour form and the server both call planPour, so the bench and the record agree.
 */
import { cureTimeline, type CureTimeline } from './cure.js';
import { splitIntoLayers, volumePerLayerMl, type LayerSplit } from './layers.js';
import { mixAmounts, type MixAmounts } from './mix.js';
import { pourVolume, type PourVolume } from './pour-volume.js';
import { MAX_LAYERS, pourPlanRequestSchema, type PourPlanRequest } from './schemas.js';
import { formatLength } from './format.js';
import type { TradeWarning } from './warning.js';

export interface PourLayers extends LayerSplit {
  readonly volumePerLayerMl: number;
}

export interface PourPlan {
  readonly request: PourPlanRequest;
  readonly volume: PourVolume;
  readonly layers: PourLayers;
  readonly mix: MixAmounts;
  readonly cure: CureTimeline;
  /** Every warning from volume, mix and cure, in that order. */
  readonly warnings: readonly TradeWarning[];
}

export interface FieldError {
  /** Dotted path into the request, e.g. "material.densityBGPerMl" or "shape.points". */
  readonly path: string;
  readonly message: string;
}

export type PourPlanResult =
  { readonly ok: true; readonly plan: PourPlan } | { readonly ok: false; readonly errors: readonly FieldError[] };

/** Validates first; only invalid input gives errors, and then no numbers at all. */
export function planPour(input: unknown): PourPlanResult {
  const parsed = pourPlanRequestSchema.safeParse(input);
  if (!parsed.success) {
    return {
      ok: false,
      errors: parsed.error.issues.map((issue) => ({ path: issue.path.map(String).join('.'), message: issue.message })),
    };
  }
  const request = parsed.data;
  const { material } = request;

  const volume = pourVolume(request);
  const fewest = splitIntoLayers(request.depthMm, material.maxLayerMm);
  if (request.layerCount !== undefined && request.layerCount < fewest.count) {
    return {
      ok: false,
      errors: [{ path: 'layerCount', message: tooFewLayers(fewest.count, request.depthMm, material.maxLayerMm) }],
    };
  }
  if (fewest.count > MAX_LAYERS) {
    return { ok: false, errors: [{ path: 'depthMm', message: tooManyLayers(fewest.count) }] };
  }
  const count = request.layerCount ?? fewest.count;
  const split: LayerSplit = { count, layerDepthMm: request.depthMm / count };
  // Rocks and banks are taken off evenly: the plan cannot know which layers they stand in.
  const layers: PourLayers = { ...split, volumePerLayerMl: volumePerLayerMl(volume.totalToMixMl, split.count) };
  const mix = mixAmounts({
    volumeMl: volume.totalToMixMl,
    ratio: material.mixRatio,
    densityAGPerMl: material.densityAGPerMl,
    ...(material.densityBGPerMl === undefined ? {} : { densityBGPerMl: material.densityBGPerMl }),
    ...(material.ratioTolerancePercent === undefined ? {} : { tolerancePercent: material.ratioTolerancePercent }),
    layerCount: split.count,
    scaleResolutionG: request.scaleResolutionG,
    cupResolutionMl: request.cupResolutionMl,
  });
  const cure = cureTimeline({
    dataSheet: material,
    roomTempC: request.roomTempC,
    startAtMs: request.startAtMs,
    layerCount: split.count,
    layerDepthMm: split.layerDepthMm,
  });

  return {
    ok: true,
    plan: {
      request,
      volume,
      layers,
      mix,
      cure,
      warnings: [...volume.warnings, ...mix.warnings, ...cure.warnings],
    },
  };
}

/** Plain words for a layer count below what the maximum layer thickness allows. */
export function tooFewLayers(fewest: number, depthMm: number, maxLayerMm: number): string {
  return `At least ${fewest} layers: ${formatLength(depthMm)} at most ${formatLength(maxLayerMm)} a layer. Thicker layers can overheat, crack or yellow.`;
}

export function tooManyLayers(count: number): string {
  return `This would take ${count} layers; a pour can have at most ${MAX_LAYERS}. Check the depth and the maximum layer on the data sheet.`;
}
