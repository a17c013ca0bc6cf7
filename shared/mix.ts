/**
 * Part A and part B for a pour, by weight or by volume, as the maker's data sheet gives
 * the ratio. A single-part medium (gloss medium, water gel) has no part B.
 */
import { roundToStep } from './rounding.js';
import type { TradeWarning } from './warning.js';

export type MixBasis = 'volume' | 'weight';

export interface MixRatio {
  readonly basis: MixBasis;
  readonly partA: number;
  /** Absent or 0 for a single-part medium. */
  readonly partB?: number;
}

export interface PartAmounts {
  readonly partAMl: number;
  readonly partBMl: number;
  readonly partAG: number;
  readonly partBG: number;
  readonly totalMl: number;
  readonly totalG: number;
}

export type MixWarningCode = 'batch-too-small' | 'ratio-shifted';

export interface MixAmounts {
  readonly basis: MixBasis;
  readonly singlePart: boolean;
  readonly layerCount: number;
  readonly mixedDensityGPerMl: number;
  /** Before rounding; for records and the server's checks. */
  readonly exactPerLayer: PartAmounts;
  readonly exactTotal: PartAmounts;
  /** What to weigh or measure for each layer: grams to the scale, mL to the cup. */
  readonly perLayer: PartAmounts;
  /** perLayer times the layer count, as actually mixed over the whole pour. */
  readonly total: PartAmounts;
  /** How far the rounded per-layer amounts stray from the data-sheet ratio, in percent. */
  readonly ratioShiftPercent: number;
  readonly warnings: readonly TradeWarning<MixWarningCode>[];
}

export interface MixAmountsInput {
  readonly volumeMl: number;
  readonly ratio: MixRatio;
  readonly densityAGPerMl: number;
  /** Required for a two-part ratio. */
  readonly densityBGPerMl?: number;
  readonly layerCount?: number;
  readonly scaleResolutionG: number;
  /** Smallest mark on the mixing cup or syringe (default 1 mL). */
  readonly cupResolutionMl?: number;
}

/**
 * Common practice: a part is weighable when one step of the scale is at most 5% of it,
 * i.e. at least 20 steps; a reading can be off by a whole step near the threshold.
 */
export const MIN_STEPS_PER_PART = 20;

/** Common practice: data sheets ask for an accurate ratio; a few percent off leaves soft or tacky spots. */
export const MAX_RATIO_SHIFT_PERCENT = 3;

export function isSinglePart(ratio: MixRatio): boolean {
  return (ratio.partB ?? 0) === 0;
}

/** Density of the mixed material, assuming the parts' volumes simply add. */
export function mixedDensityGPerMl(ratio: MixRatio, densityAGPerMl: number, densityBGPerMl?: number): number {
  const { fractionA, fractionB, densityB } = checkedParts(ratio, densityAGPerMl, densityBGPerMl);
  if (ratio.basis === 'volume') {
    return fractionA * densityAGPerMl + fractionB * densityB;
  }
  // By weight: volume of one gram of mix is wA/rhoA + wB/rhoB (design.md section 4).
  return 1 / (fractionA / densityAGPerMl + fractionB / densityB);
}

export function mixAmounts(input: MixAmountsInput): MixAmounts {
  const { ratio, densityAGPerMl, scaleResolutionG } = input;
  const layerCount = input.layerCount ?? 1;
  const cupResolutionMl = input.cupResolutionMl ?? 1;
  if (!Number.isFinite(input.volumeMl) || input.volumeMl < 0) {
    throw new RangeError(`Volume must be a finite number of 0 mL or more, got ${input.volumeMl}`);
  }
  if (!Number.isInteger(layerCount) || layerCount < 1) {
    throw new RangeError(`Layer count must be a whole number of 1 or more, got ${layerCount}`);
  }
  assertPositive(scaleResolutionG, 'Scale resolution');
  assertPositive(cupResolutionMl, 'Cup resolution');
  const { fractionA, fractionB, densityB } = checkedParts(ratio, densityAGPerMl, input.densityBGPerMl);
  const singlePart = isSinglePart(ratio);
  const density = mixedDensityGPerMl(ratio, densityAGPerMl, densityB);

  const exactTotal = splitParts(input.volumeMl, ratio.basis, fractionA, fractionB, densityAGPerMl, densityB, density);
  const exactPerLayer = scaleAmounts(exactTotal, 1 / layerCount);
  const perLayer = roundAmounts(exactPerLayer, scaleResolutionG, cupResolutionMl);
  const total = roundAmounts(scaleAmounts(perLayer, layerCount), scaleResolutionG, cupResolutionMl);

  // Every amount is shown in grams first: weighing is the finest measure a bench has, whatever
  // the basis of the ratio, so the warnings judge the scale, not the cup.
  const nothingToMix = input.volumeMl === 0;
  const shiftPercent = nothingToMix || singlePart ? 0 : weighedRatioShiftPercent(exactPerLayer, perLayer);
  const warnings: TradeWarning<MixWarningCode>[] = [];
  const smallerPartG = singlePart ? exactPerLayer.partAG : Math.min(exactPerLayer.partAG, exactPerLayer.partBG);
  if (!nothingToMix && smallerPartG < MIN_STEPS_PER_PART * scaleResolutionG) {
    warnings.push({
      code: 'batch-too-small',
      message:
        'One part is too small to weigh within 5% on this scale. Use a scale that reads finer or mix more at once.',
    });
  }
  if (shiftPercent > MAX_RATIO_SHIFT_PERCENT) {
    warnings.push({
      code: 'ratio-shifted',
      message: `Rounded to what the scale can weigh, the mix is ${Math.round(shiftPercent)}% off the data-sheet ratio. Use a finer scale or mix a larger batch.`,
    });
  }

  return {
    basis: ratio.basis,
    singlePart,
    layerCount,
    mixedDensityGPerMl: density,
    exactPerLayer,
    exactTotal,
    perLayer,
    total,
    ratioShiftPercent: shiftPercent,
    warnings,
  };
}

/** How far the weighed part B per gram of part A strays from the exact one, in percent. */
function weighedRatioShiftPercent(exact: PartAmounts, weighed: PartAmounts): number {
  if (weighed.partAG === 0) {
    return 100;
  }
  // A part B too small to be a number in grams: the mix is right only if none is weighed either.
  if (exact.partBG === 0 || exact.partAG === 0) return weighed.partBG === 0 ? 0 : 100;
  return Math.abs(weighed.partBG / weighed.partAG / (exact.partBG / exact.partAG) - 1) * 100;
}

function splitParts(
  volumeMl: number,
  basis: MixBasis,
  fractionA: number,
  fractionB: number,
  densityA: number,
  densityB: number,
  mixedDensity: number,
): PartAmounts {
  if (basis === 'volume') {
    const partAMl = volumeMl * fractionA;
    const partBMl = volumeMl * fractionB;
    return amounts(partAMl, partBMl, partAMl * densityA, partBMl * densityB);
  }
  // M = V / (wA/rhoA + wB/rhoB) (design.md section 4), then split by weight fractions.
  const totalG = volumeMl * mixedDensity;
  const partAG = totalG * fractionA;
  const partBG = totalG * fractionB;
  return amounts(partAG / densityA, partBG / densityB, partAG, partBG);
}

function amounts(partAMl: number, partBMl: number, partAG: number, partBG: number): PartAmounts {
  return { partAMl, partBMl, partAG, partBG, totalMl: partAMl + partBMl, totalG: partAG + partBG };
}

function scaleAmounts(parts: PartAmounts, factor: number): PartAmounts {
  return amounts(parts.partAMl * factor, parts.partBMl * factor, parts.partAG * factor, parts.partBG * factor);
}

function roundAmounts(parts: PartAmounts, stepG: number, stepMl: number): PartAmounts {
  const partAMl = roundToStep(parts.partAMl, stepMl);
  const partBMl = roundToStep(parts.partBMl, stepMl);
  const partAG = roundToStep(parts.partAG, stepG);
  const partBG = roundToStep(parts.partBG, stepG);
  return {
    partAMl,
    partBMl,
    partAG,
    partBG,
    totalMl: roundToStep(partAMl + partBMl, stepMl),
    totalG: roundToStep(partAG + partBG, stepG),
  };
}

function checkedParts(ratio: MixRatio, densityAGPerMl: number, densityBGPerMl: number | undefined) {
  const partB = ratio.partB ?? 0;
  assertPositive(ratio.partA, 'Part A of the ratio');
  if (!Number.isFinite(partB) || partB < 0) {
    throw new RangeError(`Part B of the ratio must be a finite number of 0 or more, got ${partB}`);
  }
  assertPositive(densityAGPerMl, 'Part A density');
  const singlePart = partB === 0;
  if (!singlePart) {
    assertPositive(densityBGPerMl ?? NaN, 'Part B density');
  }
  return {
    fractionA: ratio.partA / (ratio.partA + partB),
    fractionB: partB / (ratio.partA + partB),
    // A single-part medium never uses part B's density; A's keeps the formulas finite.
    densityB: singlePart ? densityAGPerMl : (densityBGPerMl ?? densityAGPerMl),
  };
}

function assertPositive(value: number, label: string): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${label} must be a finite number above 0, got ${value}`);
  }
}
