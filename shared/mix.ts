/**
 * Part A and part B for a pour, by weight or by volume, as the maker's data sheet gives
 * the ratio. A single-part medium (gloss medium, water gel) has no part B.
 */
import { formatCupped, formatMass, formatVolume, formatWeighed } from './format.js';
import { roundToStep } from './rounding.js';
import type { MassUnit, VolumeUnit } from './units.js';
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

export type MixWarningCode = 'batch-too-small' | 'ratio-shifted' | 'ratio-shifted-by-volume';

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
  /** How far the per-layer grams shown stray from the data-sheet ratio, in percent. */
  readonly ratioShiftPercent: number;
  /** How far the per-layer millilitres shown (rounded to the cup's marks) stray from the ratio, in percent. */
  readonly volumeRatioShiftPercent: number;
  /** The shift either measure may have before a warning: the data sheet's, or the default. */
  readonly tolerancePercent: number;
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
  /** How far off the ratio the data sheet allows, in percent (default DEFAULT_RATIO_TOLERANCE_PERCENT). */
  readonly tolerancePercent?: number;
}

/**
 * Common practice: a part is weighable when one step of the scale is at most 5% of it,
 * i.e. at least 20 steps; a reading can be off by a whole step near the threshold.
 */
export const MIN_STEPS_PER_PART = 20;

/**
 * Common practice: data sheets ask for an accurate ratio and a few percent off leaves soft or tacky
 * spots, so the amounts shown may stray at most 2 % unless the data sheet allows more.
 */
export const DEFAULT_RATIO_TOLERANCE_PERCENT = 2;

export function isSinglePart(ratio: MixRatio): boolean {
  return (ratio.partB ?? 0) === 0;
}

/** Density of the mixed material, assuming the parts' volumes simply add. */
export function mixedDensityGPerMl(ratio: MixRatio, densityAGPerMl: number, densityBGPerMl?: number): number {
  const { fractionA, fractionB, densityB } = checkedParts(ratio, densityAGPerMl, densityBGPerMl);
  if (ratio.basis === 'volume') {
    return fractionA * densityAGPerMl + fractionB * densityB;
  }
  // By weight: volume of one gram of mix is wA/rhoA + wB/rhoB (ideal mixing: the parts' volumes add).
  return 1 / (fractionA / densityAGPerMl + fractionB / densityB);
}

export function mixAmounts(input: MixAmountsInput): MixAmounts {
  const { ratio, densityAGPerMl, scaleResolutionG } = input;
  const layerCount = input.layerCount ?? 1;
  const cupResolutionMl = input.cupResolutionMl ?? 1;
  const tolerancePercent = input.tolerancePercent ?? DEFAULT_RATIO_TOLERANCE_PERCENT;
  if (!Number.isFinite(input.volumeMl) || input.volumeMl < 0) {
    throw new RangeError(`Volume must be a finite number of 0 mL or more, got ${input.volumeMl}`);
  }
  if (!Number.isInteger(layerCount) || layerCount < 1) {
    throw new RangeError(`Layer count must be a whole number of 1 or more, got ${layerCount}`);
  }
  assertPositive(scaleResolutionG, 'Scale resolution');
  assertPositive(cupResolutionMl, 'Cup resolution');
  assertPositive(tolerancePercent, 'Ratio tolerance');
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
  const unmixed = nothingToMix || singlePart;
  const shiftPercent = unmixed
    ? 0
    : ratioShiftPercent(exactPerLayer.partAG, exactPerLayer.partBG, perLayer.partAG, perLayer.partBG);
  const volumeShiftPercent = unmixed
    ? 0
    : ratioShiftPercent(exactPerLayer.partAMl, exactPerLayer.partBMl, perLayer.partAMl, perLayer.partBMl);
  const warnings: TradeWarning<MixWarningCode>[] = [];
  const smallerPartG = singlePart ? exactPerLayer.partAG : Math.min(exactPerLayer.partAG, exactPerLayer.partBG);
  if (!nothingToMix && smallerPartG < MIN_STEPS_PER_PART * scaleResolutionG) {
    warnings.push({
      code: 'batch-too-small',
      message:
        'One part is too small to weigh within 5% on this scale. Use a scale that reads finer or mix more at once.',
    });
  }
  if (shiftPercent > tolerancePercent) {
    warnings.push({
      code: 'ratio-shifted',
      message:
        `Weighed as shown (${formatMass(perLayer.partAG)} and ${formatMass(perLayer.partBG)}), the mix is ` +
        `${percent(shiftPercent)} off the ratio; the data sheet allows ${percent(tolerancePercent)}. ` +
        'Use a scale that reads finer or mix a larger batch.',
    });
  }
  if (volumeShiftPercent > tolerancePercent) {
    warnings.push({
      code: 'ratio-shifted-by-volume',
      message:
        `Measured to the cup's marks as shown (${formatVolume(perLayer.partAMl)} and ${formatVolume(perLayer.partBMl)}), ` +
        `the mix is ${percent(volumeShiftPercent)} off the ratio; the data sheet allows ${percent(tolerancePercent)}. ` +
        'Weigh the parts instead, use a cup with finer marks or mix a larger batch.',
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
    volumeRatioShiftPercent: volumeShiftPercent,
    tolerancePercent,
    warnings,
  };
}

/**
 * One part as the bench measures it: grams to the scale's step, millilitres to the cup's marks, and
 * "under 1 mL" where a part rounds to nothing though the pour needs some.
 */
export function formatPart(
  mix: Pick<MixAmounts, 'perLayer' | 'exactPerLayer' | 'total' | 'exactTotal'>,
  of: 'perLayer' | 'total',
  which: 'A' | 'B',
  steps: { readonly scaleResolutionG: number; readonly cupResolutionMl?: number },
  units: { readonly mass: MassUnit; readonly volume: VolumeUnit },
): { readonly mass: string; readonly volume: string } {
  const [shown, exact] = of === 'perLayer' ? [mix.perLayer, mix.exactPerLayer] : [mix.total, mix.exactTotal];
  const [shownG, exactG, shownMl, exactMl] =
    which === 'A'
      ? [shown.partAG, exact.partAG, shown.partAMl, exact.partAMl]
      : [shown.partBG, exact.partBG, shown.partBMl, exact.partBMl];
  return {
    mass: formatWeighed(shownG, steps.scaleResolutionG, units.mass, exactG),
    volume: formatCupped(shownMl, steps.cupResolutionMl ?? 1, units.volume, exactMl),
  };
}

/** Percent, to one decimal below 10 so a 2.4 % shift does not read as the 2 % allowed. */
function percent(value: number): string {
  return `${value < 10 ? Math.round(value * 10) / 10 : Math.round(value)} %`;
}

/** How far part B per unit of part A, as shown, strays from the exact one, in percent. */
function ratioShiftPercent(exactA: number, exactB: number, shownA: number, shownB: number): number {
  if (shownA === 0) return 100;
  // A part B too small to be a number at all: the mix is right only if none is shown either.
  if (exactB === 0 || exactA === 0) return shownB === 0 ? 0 : 100;
  return Math.abs(shownB / shownA / (exactB / exactA) - 1) * 100;
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
  // M = V / (wA/rhoA + wB/rhoB) (ideal mixing, as above), then split by weight fractions.
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
