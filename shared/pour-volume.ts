/**
 * How much material a water feature takes: area x depth, less what rocks and banks
 * displace, plus what stays behind in the cup and on the stick.
 */
import { MM3_PER_ML } from './units.js';
import type { TradeWarning } from './warning.js';

export interface PointMm {
  readonly xMm: number;
  readonly yMm: number;
}

export type PourShape =
  | { readonly kind: 'rectangle'; readonly lengthMm: number; readonly widthMm: number }
  | { readonly kind: 'circle'; readonly diameterMm: number }
  /** Full axes, as measured across the pond, not the half-axes. */
  | { readonly kind: 'ellipse'; readonly lengthMm: number; readonly widthMm: number }
  /** A traced outline, in order around the edge. */
  | { readonly kind: 'polygon'; readonly points: readonly PointMm[] }
  | { readonly kind: 'area'; readonly areaMm2: number };

export type PourShapeKind = PourShape['kind'];

/** The surface of a feature in mm². Refuses sides, diameters or an area that are not finite numbers of 0 or more. */
export function shapeAreaMm2(shape: PourShape): number {
  switch (shape.kind) {
    case 'rectangle':
      return size(shape.lengthMm, 'Length') * size(shape.widthMm, 'Width');
    case 'circle':
      return Math.PI * (size(shape.diameterMm, 'Diameter') / 2) ** 2;
    case 'ellipse':
      return Math.PI * (size(shape.lengthMm, 'Length') / 2) * (size(shape.widthMm, 'Width') / 2);
    case 'polygon':
      return polygonAreaMm2(shape.points);
    case 'area':
      return size(shape.areaMm2, 'Area');
    default:
      throw new RangeError(`Unknown shape "${String((shape as { kind?: unknown }).kind)}"`);
  }
}

function size(value: number, label: string): number {
  assertNonNegative(value, label);
  return value;
}

/** Shoelace formula (Gauss's area formula); absolute, so the outline may run either way round. */
export function polygonAreaMm2(points: readonly PointMm[]): number {
  if (points.length < 3) {
    throw new RangeError(`A traced outline needs at least 3 points, got ${points.length}`);
  }
  for (const point of points) {
    if (!Number.isFinite(point.xMm) || !Number.isFinite(point.yMm)) {
      throw new RangeError(`Every point of an outline needs finite x and y in mm, got ${point.xMm}, ${point.yMm}`);
    }
  }
  let twiceArea = 0;
  points.forEach((point, index) => {
    const next = points[(index + 1) % points.length] ?? point;
    twiceArea += point.xMm * next.yMm - next.xMm * point.yMm;
  });
  return Math.abs(twiceArea) / 2;
}

export interface PourVolumeInput {
  readonly shape: PourShape;
  readonly depthMm: number;
  /** Volume of rocks, banks and models standing in the pour. */
  readonly displacedMl?: number;
  /** Extra to mix for what stays in the cup and on the stick, in percent. */
  readonly wastePercent?: number;
}

export type PourVolumeWarningCode = 'displacement-exceeds-volume';

export interface PourVolume {
  readonly areaMm2: number;
  readonly grossVolumeMl: number;
  readonly displacedMl: number;
  readonly netVolumeMl: number;
  readonly wastePercent: number;
  readonly totalToMixMl: number;
  readonly warnings: readonly TradeWarning<PourVolumeWarningCode>[];
}

export function pourVolume(input: PourVolumeInput): PourVolume {
  const displacedMl = input.displacedMl ?? 0;
  const wastePercent = input.wastePercent ?? 0;
  assertNonNegative(input.depthMm, 'Depth');
  assertNonNegative(displacedMl, 'Displaced volume');
  assertNonNegative(wastePercent, 'Waste allowance');
  const areaMm2 = shapeAreaMm2(input.shape);
  assertNonNegative(areaMm2, 'Area');

  const grossVolumeMl = (areaMm2 * input.depthMm) / MM3_PER_ML;
  const netVolumeMl = Math.max(0, grossVolumeMl - displacedMl);
  const warnings: TradeWarning<PourVolumeWarningCode>[] = [];
  if (displacedMl > grossVolumeMl) {
    warnings.push({
      code: 'displacement-exceeds-volume',
      message:
        'The displaced volume is more than the whole pour, so there is nothing to pour. Check the depth and the displaced volume.',
    });
  }
  return {
    areaMm2,
    grossVolumeMl,
    displacedMl,
    netVolumeMl,
    wastePercent,
    totalToMixMl: netVolumeMl * (1 + wastePercent / 100),
    warnings,
  };
}

function assertNonNegative(value: number, label: string): void {
  if (!Number.isFinite(value) || value < 0) {
    throw new RangeError(`${label} must be a finite number of 0 or more, got ${value}`);
  }
}
