/**
 * Layers: every material has a maximum layer thickness; thicker pours overheat,
 * crack, yellow, or melt the foam beneath.
 */

export interface LayerSplit {
  readonly count: number;
  readonly layerDepthMm: number;
}

// Ratios within this relative distance of a whole number are that number: 2.1 / 0.7
// is 3.0000000000000004 in binary and must give 3 layers, not 4.
const WHOLE_NUMBER_TOLERANCE = 1e-9;

/** n = ceil(depth / max layer), each layer depth / n (common practice: never thicker than the data sheet's maximum). */
export function splitIntoLayers(depthMm: number, maxLayerMm: number): LayerSplit {
  if (!Number.isFinite(depthMm) || depthMm <= 0) {
    throw new RangeError(`Depth must be a finite number above 0 mm, got ${depthMm}`);
  }
  if (!Number.isFinite(maxLayerMm) || maxLayerMm <= 0) {
    throw new RangeError(`Maximum layer must be a finite number above 0 mm, got ${maxLayerMm}`);
  }
  const layers = depthMm / maxLayerMm;
  const nearest = Math.round(layers);
  const count = Math.max(
    1,
    Math.abs(layers - nearest) <= WHOLE_NUMBER_TOLERANCE * Math.max(1, nearest) ? nearest : Math.ceil(layers),
  );
  return { count, layerDepthMm: depthMm / count };
}

/** Equal share per layer: with straight sides every layer has the same area. */
export function volumePerLayerMl(volumeMl: number, layerCount: number): number {
  if (!Number.isInteger(layerCount) || layerCount < 1) {
    throw new RangeError(`Layer count must be a whole number of 1 or more, got ${layerCount}`);
  }
  return volumeMl / layerCount;
}
