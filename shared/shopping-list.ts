/**
 * What to buy: every material whose containers together hold its low mark or less, and what the
 * builds' pours were short of when the shelf could not cover them, each with how much to buy.
 */
import { convertAmount, formatStock, unitDimension, type StockUnit } from './stock-units.js';

export interface MarkedMaterial {
  readonly id: string;
  readonly name: string;
  readonly lowMarkQty?: number | null;
  readonly lowMarkUnit?: StockUnit | null;
  /** A pour material's densities, to count grams against a mark in millilitres and back. */
  readonly dataSheet?: { readonly densityAGPerMl: number; readonly densityBGPerMl?: number } | null;
}

export interface HeldContainer {
  readonly id: string;
  readonly materialId: string;
  readonly part: 'A' | 'B' | 'single';
  readonly unit: StockUnit;
}

/** A part a logged pour still lacks, in grams, for a build not yet finished. */
export interface PourShort {
  readonly materialId: string;
  readonly part: 'A' | 'B' | 'single';
  readonly quantityG: number;
}

export interface ShoppingItem {
  readonly materialId: string;
  readonly name: string;
  readonly unit: StockUnit;
  readonly onHandQty: number;
  readonly lowMarkQty: number | null;
  /** What pours still lack, in unit. */
  readonly shortQty: number;
  /** Enough to cover what pours lack and to bring the shelf back above its mark. */
  readonly buyQty: number;
}

function densityOf(material: MarkedMaterial, part: HeldContainer['part']): number | null {
  const sheet = material.dataSheet;
  if (!sheet) return null;
  return part === 'B' ? (sheet.densityBGPerMl ?? sheet.densityAGPerMl) : sheet.densityAGPerMl;
}

/** An amount in another unit of the material: within its dimension, or across g and mL by the part's density. */
function inUnit(
  quantity: number,
  from: StockUnit,
  to: StockUnit,
  material: MarkedMaterial,
  part: HeldContainer['part'],
): number | null {
  const source = unitDimension(from);
  const target = unitDimension(to);
  if (source === target) return convertAmount(quantity, from, to);
  const density = densityOf(material, part);
  if (density === null) return null;
  if (source === 'mass' && target === 'volume')
    return convertAmount(convertAmount(quantity, from, 'g') / density, 'mL', to);
  if (source === 'volume' && target === 'mass')
    return convertAmount(convertAmount(quantity, from, 'mL') * density, 'g', to);
  return null;
}

export function shoppingList(
  materials: readonly MarkedMaterial[],
  containers: readonly HeldContainer[],
  remaining: Readonly<Record<string, number>>,
  shorts: readonly PourShort[] = [],
): ShoppingItem[] {
  const items: ShoppingItem[] = [];
  for (const material of materials) {
    const mark = material.lowMarkQty ?? null;
    if (mark !== null && (!Number.isFinite(mark) || mark < 0)) {
      throw new RangeError(`The low mark of ${material.name} must be 0 or more, got ${mark}`);
    }
    const held = containers.filter((container) => container.materialId === material.id);
    const unit: StockUnit = material.lowMarkUnit ?? held[0]?.unit ?? 'g';
    let onHandQty = 0;
    for (const container of held) {
      const left = Math.max(0, remaining[container.id] ?? 0);
      onHandQty += inUnit(left, container.unit, unit, material, container.part) ?? 0;
    }
    let shortQty = 0;
    for (const short of shorts) {
      if (short.materialId !== material.id) continue;
      if (!Number.isFinite(short.quantityG) || short.quantityG < 0) {
        throw new RangeError(`What a pour lacks must be 0 g or more, got ${short.quantityG}`);
      }
      shortQty += inUnit(short.quantityG, 'g', unit, material, short.part) ?? 0;
    }
    const underMark = mark !== null && onHandQty <= mark;
    if (!underMark && shortQty === 0) continue;
    const topUp = underMark ? mark - onHandQty : 0;
    items.push({
      materialId: material.id,
      name: material.name,
      unit,
      onHandQty,
      lowMarkQty: mark,
      shortQty,
      buyQty: topUp + shortQty,
    });
  }
  return items.sort((a, b) => a.name.localeCompare(b.name));
}

/** One line per item, to tick off: the plain-text list a phone shares or copies. */
export function shoppingListText(items: readonly ShoppingItem[], imperial = false): string {
  const lines = items.map((item) => {
    const why = [
      item.lowMarkQty !== null
        ? `${formatStock(item.onHandQty, item.unit, imperial)} left, mark ${formatStock(item.lowMarkQty, item.unit, imperial)}`
        : null,
      item.shortQty > 0 ? `pours lack ${formatStock(item.shortQty, item.unit, imperial)}` : null,
    ].filter((part): part is string => part !== null);
    const buy = item.buyQty > 0 ? `at least ${formatStock(item.buyQty, item.unit, imperial)}` : 'some';
    return `[ ] ${item.name}: buy ${buy} (${why.join('; ')})`;
  });
  return ['Benchtide shopping list', ...lines].join('\n');
}
