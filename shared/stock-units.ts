/**
 * The units stock is bought and used in: mass, volume, count, length and area. A container keeps its
 * amounts in the metric unit it was bought in; imperial units exist only on the way in and out. Units
 * convert only within their dimension; a pour material alone crosses from mass to volume, by its density.
 */
import { formatNumber } from './format.js';
import { G_PER_OUNCE, G_PER_POUND, ML_PER_US_FL_OZ, MM_PER_FOOT } from './units.js';

export const STOCK_DIMENSIONS = ['mass', 'volume', 'count', 'length', 'area'] as const;
export type StockDimension = (typeof STOCK_DIMENSIONS)[number];

/** What a container is kept in: g and mL for pour materials, as before, and the bench's other units. */
export const STOCK_UNITS = ['g', 'kg', 'mL', 'L', 'pcs', 'm', 'm2'] as const;
export type StockUnit = (typeof STOCK_UNITS)[number];

/** What a modeller may type or read an amount in: the stock units and their imperial neighbours. */
export type AmountUnit = StockUnit | 'oz' | 'lb' | 'usFlOz' | 'cm' | 'ft' | 'ft2';

// Exact by definition, NIST Handbook 44 Appendix C: 1 ft = 0.3048 m, so 1 ft² = 0.09290304 m².
const M_PER_FOOT = MM_PER_FOOT / 1000;
const M2_PER_SQUARE_FOOT = M_PER_FOOT * M_PER_FOOT;

interface UnitFacts {
  readonly dimension: StockDimension;
  /** How many of the dimension's base unit (g, mL, pcs, m, m²) one of this unit is. */
  readonly base: number;
  readonly label: string;
}

const UNITS: Readonly<Record<AmountUnit, UnitFacts>> = {
  g: { dimension: 'mass', base: 1, label: 'g' },
  kg: { dimension: 'mass', base: 1000, label: 'kg' },
  oz: { dimension: 'mass', base: G_PER_OUNCE, label: 'oz' },
  lb: { dimension: 'mass', base: G_PER_POUND, label: 'lb' },
  mL: { dimension: 'volume', base: 1, label: 'mL' },
  L: { dimension: 'volume', base: 1000, label: 'L' },
  usFlOz: { dimension: 'volume', base: ML_PER_US_FL_OZ, label: 'fl oz' },
  pcs: { dimension: 'count', base: 1, label: 'pcs' },
  m: { dimension: 'length', base: 1, label: 'm' },
  cm: { dimension: 'length', base: 0.01, label: 'cm' },
  ft: { dimension: 'length', base: M_PER_FOOT, label: 'ft' },
  m2: { dimension: 'area', base: 1, label: 'm²' },
  ft2: { dimension: 'area', base: M2_PER_SQUARE_FOOT, label: 'ft²' },
};

/** How a material is measured, in a few words for the shelf: "by weight", "in pieces". */
export const MEASURE_WORDS: Readonly<Record<StockDimension, string>> = {
  mass: 'by weight',
  volume: 'by volume',
  count: 'in pieces',
  length: 'by length',
  area: 'by area',
};

const DIMENSION_WORDS: Readonly<Record<StockDimension, string>> = {
  mass: 'a weight',
  volume: 'a volume',
  count: 'a count of pieces',
  length: 'a length',
  area: 'an area',
};

function facts(unit: AmountUnit): UnitFacts {
  const found = Object.hasOwn(UNITS, unit) ? UNITS[unit] : undefined;
  if (found === undefined) {
    throw new RangeError(`Unknown unit "${String(unit)}"; use one of ${Object.keys(UNITS).join(', ')}`);
  }
  return found;
}

export function isStockUnit(unit: string): unit is StockUnit {
  return (STOCK_UNITS as readonly string[]).includes(unit);
}

export function unitDimension(unit: AmountUnit): StockDimension {
  return facts(unit).dimension;
}

/** A pour is weighed or measured out: only units of weight or volume hold what is poured. */
export function isPourableUnit(unit: AmountUnit): boolean {
  const dimension = unitDimension(unit);
  return dimension === 'mass' || dimension === 'volume';
}

export function unitLabel(unit: AmountUnit): string {
  return facts(unit).label;
}

/** The stock units of one dimension, smallest first. */
export function stockUnitsOf(dimension: StockDimension): StockUnit[] {
  return STOCK_UNITS.filter((unit) => UNITS[unit].dimension === dimension);
}

/** Plain words for an amount in a unit that does not fit, or null: "a length in grams". */
export function unitMismatch(unit: AmountUnit, wanted: StockDimension): string | null {
  const dimension = unitDimension(unit);
  if (dimension === wanted) return null;
  return `${unitLabel(unit)} is ${DIMENSION_WORDS[dimension]}, but this is measured as ${DIMENSION_WORDS[wanted]}: choose ${stockUnitsOf(
    wanted,
  )
    .map(unitLabel)
    .join(' or ')}.`;
}

/** An amount in another unit of the same dimension; refuses to turn grams into metres. */
export function convertAmount(quantity: number, from: AmountUnit, to: AmountUnit): number {
  if (!Number.isFinite(quantity)) throw new RangeError(`An amount must be a finite number, got ${quantity}`);
  const source = facts(from);
  const target = facts(to);
  if (source.dimension !== target.dimension) {
    throw new RangeError(`Cannot turn ${DIMENSION_WORDS[source.dimension]} (${source.label}) into ${target.label}`);
  }
  return from === to ? quantity : (quantity * source.base) / target.base;
}

/** The unit an imperial device shows a stock unit in (oz for g, fl oz for mL, ft for m, ft² for m²). */
export function imperialUnitFor(unit: StockUnit): AmountUnit {
  switch (unitDimension(unit)) {
    case 'mass':
      return unit === 'kg' ? 'lb' : 'oz';
    case 'volume':
      return 'usFlOz';
    case 'length':
      return 'ft';
    case 'area':
      return 'ft2';
    case 'count':
      return 'pcs';
  }
}

/**
 * An amount of stock as a modeller reads it: in its own metric unit, or its imperial neighbour on an
 * imperial device ("12.5 g", "0.44 oz", "3 pcs", "2.4 m²").
 */
export function formatStock(quantity: number, unit: StockUnit, imperial = false): string {
  const shownIn = imperial ? imperialUnitFor(unit) : unit;
  const shown = convertAmount(quantity, unit, shownIn);
  const options = unitDimension(unit) === 'count' ? { maxDecimals: 0 } : { maxDecimals: 2 };
  return `${formatNumber(shown, { significant: 4, ...options })} ${unitLabel(shownIn)}`;
}
