/**
 * A two-part kit bought as one: one size and one price on the label, split into its part A and part B
 * containers by the data sheet's ratio and densities, so each part can still be drawn and counted.
 */
import { mixAmounts, mixedDensityGPerMl, isSinglePart } from './mix.js';
import type { MaterialDataSheet } from './schemas.js';
import { convertAmount, unitDimension, type StockUnit } from './stock-units.js';

export interface KitPurchase {
  /** The whole kit, A and B together, in the unit on its label. */
  readonly sizeQty: number;
  readonly unit: StockUnit;
  /** The kit's one price, in integer minor units. */
  readonly priceMinor: number;
  readonly sheet: Pick<MaterialDataSheet, 'mixRatio' | 'densityAGPerMl' | 'densityBGPerMl'>;
}

export interface KitPart {
  readonly part: 'A' | 'B';
  readonly sizeQty: number;
  readonly priceMinor: number;
}

/**
 * Each part's share of the kit in the kit's own unit, and of its price in proportion to the part's
 * weight (what the maker fills by). The two prices add up to the kit's price to the minor unit.
 */
export function splitKit(kit: KitPurchase): readonly [KitPart, KitPart] {
  const { sizeQty, unit, priceMinor, sheet } = kit;
  if (!Number.isFinite(sizeQty) || sizeQty <= 0) {
    throw new RangeError(`A kit's size must be more than 0, got ${sizeQty}`);
  }
  if (!Number.isInteger(priceMinor) || priceMinor < 0) {
    throw new RangeError(`A kit's price must be a whole number of minor units, 0 or more, got ${priceMinor}`);
  }
  if (isSinglePart(sheet.mixRatio)) throw new RangeError('A single-part medium is not a kit of two parts');
  const dimension = unitDimension(unit);
  if (dimension !== 'mass' && dimension !== 'volume') {
    throw new RangeError(`A kit is sold by weight or volume, not in ${unit}`);
  }
  const density = mixedDensityGPerMl(sheet.mixRatio, sheet.densityAGPerMl, sheet.densityBGPerMl);
  const volumeMl =
    dimension === 'volume' ? convertAmount(sizeQty, unit, 'mL') : convertAmount(sizeQty, unit, 'g') / density;
  const parts = mixAmounts({
    volumeMl,
    ratio: sheet.mixRatio,
    densityAGPerMl: sheet.densityAGPerMl,
    densityBGPerMl: sheet.densityBGPerMl,
    scaleResolutionG: 0.001,
  }).exactTotal;
  const inUnit = (ml: number, g: number) =>
    dimension === 'volume' ? convertAmount(ml, 'mL', unit) : convertAmount(g, 'g', unit);
  const priceA = Math.round((priceMinor * parts.partAG) / (parts.partAG + parts.partBG));
  return [
    { part: 'A', sizeQty: inUnit(parts.partAMl, parts.partAG), priceMinor: priceA },
    { part: 'B', sizeQty: inUnit(parts.partBMl, parts.partBG), priceMinor: priceMinor - priceA },
  ];
}
