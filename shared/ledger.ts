/**
 * The stock book. Stock on hand is never a stored counter: it is the sum of ledger
 * entries, so pours logged offline on two phones both count, in whatever order they sync.
 */
import type { StockUnit } from './stock-units.js';

export const LEDGER_KINDS = ['purchase', 'pour-use', 'step-use', 'waste', 'stocktake'] as const;
export type LedgerKind = (typeof LEDGER_KINDS)[number];
/** The entries that take stock away and carry its cost: a pour's or a step's use, and waste. */
export const COSTED_KINDS: readonly LedgerKind[] = ['pour-use', 'step-use', 'waste'];
export type ContainerPart = 'A' | 'B' | 'single';

export interface LedgerEntry {
  readonly containerId: string;
  readonly kind: LedgerKind;
  /**
   * Signed, in the container's unit: purchase +, pour or step use and waste -, stocktake the
   * adjustment (counted - expected), so remaining is always a plain sum.
   */
  readonly quantity: number;
  readonly atMs: number;
}

export interface Container {
  readonly id: string;
  readonly materialId: string;
  readonly part: ContainerPart;
  readonly sizeQty: number;
  readonly unit: StockUnit;
  /** Price paid, in integer minor units of the currency (cents, pence). */
  readonly priceMinor: number;
  readonly currency: string;
  readonly boughtAtMs: number;
  readonly openedAtMs?: number;
  readonly useByMs?: number;
  readonly lot?: string;
}

// Quantities are summed in thousandths of a gram or millilitre: exact integers, and far
// finer than any bench scale reads, so 100 - 12.3 - 45.6 is 42.1 and not 42.099999999999994.
const MILLI = 1000;

function toMilli(quantity: number): number {
  return Math.round(quantity * MILLI);
}

/**
 * Plain words for a stock-book entry that cannot be summed, or null: a quantity that is not a number,
 * a purchase that takes stock away, a use or waste that adds it.
 */
export function ledgerEntryProblem(entry: Pick<LedgerEntry, 'kind' | 'quantity'>): string | null {
  const { kind, quantity } = entry;
  if (typeof quantity !== 'number' || !Number.isFinite(quantity)) {
    return `A stock-book entry (${kind}) has a quantity that is not a number (${String(quantity)}).`;
  }
  if (kind === 'purchase' && quantity <= 0) {
    return `A purchase must add stock: its quantity must be above 0, got ${quantity}.`;
  }
  if (COSTED_KINDS.includes(kind) && quantity >= 0) {
    return `A ${KIND_WORDS[kind]} must take stock away: its quantity must be below 0, got ${quantity}.`;
  }
  return null;
}

const KIND_WORDS: Readonly<Record<LedgerKind, string>> = {
  purchase: 'purchase',
  'pour-use': 'pour use',
  'step-use': 'step use',
  waste: 'waste',
  stocktake: 'stocktake',
};

/** What is left in each container: the sum of its entries. Refuses an entry that cannot be summed. */
export function remainingByContainer(entries: readonly LedgerEntry[]): Record<string, number> {
  const milli = new Map<string, number>();
  for (const entry of entries) {
    const problem = ledgerEntryProblem(entry);
    if (problem !== null) throw new RangeError(`${problem} Container ${entry.containerId}.`);
    milli.set(entry.containerId, (milli.get(entry.containerId) ?? 0) + toMilli(entry.quantity));
  }
  return Object.fromEntries([...milli].map(([containerId, sum]) => [containerId, sum / MILLI]));
}

/** The stocktake entry to record when a container is counted. */
export function stocktakeAdjustment(countedQty: number, expectedQty: number): number {
  return (toMilli(countedQty) - toMilli(expectedQty)) / MILLI;
}

export interface StockOnHand {
  readonly containerId: string;
  readonly boughtAtMs: number;
  readonly remainingQty: number;
}

export interface Allocation {
  readonly containerId: string;
  readonly quantity: number;
}

export interface FifoAllocation {
  readonly allocations: readonly Allocation[];
  readonly allocatedQty: number;
  /** What the shelf could not cover; 0 when the need is met. */
  readonly shortfallQty: number;
}

/**
 * Takes a pour's use from the oldest container first (by purchase time, then id), or
 * from the chosen container first. All quantities in one unit: convert with
 * massToVolumeMl / volumeToMassG before calling.
 */
export function allocateFifo(
  needQty: number,
  stock: readonly StockOnHand[],
  chosenContainerId?: string,
): FifoAllocation {
  if (!Number.isFinite(needQty) || needQty < 0) {
    throw new RangeError(`Quantity needed must be a finite number of 0 or more, got ${needQty}`);
  }
  const order = [...stock].sort(
    (a, b) =>
      rank(a, chosenContainerId) - rank(b, chosenContainerId) ||
      a.boughtAtMs - b.boughtAtMs ||
      (a.containerId < b.containerId ? -1 : a.containerId > b.containerId ? 1 : 0),
  );
  let leftMilli = toMilli(needQty);
  const allocations: Allocation[] = [];
  for (const item of order) {
    const availableMilli = toMilli(item.remainingQty);
    if (leftMilli === 0) {
      break;
    }
    if (availableMilli <= 0) {
      continue;
    }
    const takeMilli = Math.min(availableMilli, leftMilli);
    allocations.push({ containerId: item.containerId, quantity: takeMilli / MILLI });
    leftMilli -= takeMilli;
  }
  return {
    allocations,
    allocatedQty: (toMilli(needQty) - leftMilli) / MILLI,
    shortfallQty: leftMilli / MILLI,
  };
}

function rank(item: StockOnHand, chosenContainerId: string | undefined): number {
  return item.containerId === chosenContainerId ? 0 : 1;
}

export function massToVolumeMl(g: number, densityGPerMl: number): number {
  assertDensity(densityGPerMl);
  if (!Number.isFinite(g)) throw new RangeError(`A mass must be a finite number of grams, got ${g}`);
  return g / densityGPerMl;
}

export function volumeToMassG(ml: number, densityGPerMl: number): number {
  assertDensity(densityGPerMl);
  if (!Number.isFinite(ml)) throw new RangeError(`A volume must be a finite number of millilitres, got ${ml}`);
  return ml * densityGPerMl;
}

// Costs are kept to the millionth of a minor unit (a cent, a penny) and rounded to whole ones only
// once per line of a report, so a hundred uses of a fraction of a cent each still cost something.
const MICRO = 1_000_000;

function toMicro(costMinor: number): number {
  return Math.round(costMinor * MICRO);
}

/**
 * amount x (price / size) in minor units, to the millionth (rounded half up there): the exact cost of
 * one stock-book entry. Worked in integers (BigInt) so no binary rounding creeps in. Round it to whole
 * minor units with `wholeMinor` only where a line of money is shown.
 */
export function costOfUseMinor(quantity: number, container: Pick<Container, 'sizeQty' | 'priceMinor'>): number {
  if (!Number.isFinite(quantity) || quantity < 0) {
    throw new RangeError(`Quantity used must be a finite number of 0 or more, got ${quantity}`);
  }
  if (!Number.isInteger(container.priceMinor) || container.priceMinor < 0) {
    throw new RangeError(`Price must be a whole number of minor units, got ${container.priceMinor}`);
  }
  const sizeMilli = BigInt(toMilli(container.sizeQty));
  if (sizeMilli <= 0n) {
    throw new RangeError(`Container size must be above 0, got ${container.sizeQty}`);
  }
  const numerator = BigInt(toMilli(quantity)) * BigInt(container.priceMinor) * BigInt(MICRO);
  return Number((2n * numerator + sizeMilli) / (2n * sizeMilli)) / MICRO;
}

/** Exact costs added up without binary residue (to the millionth of a minor unit). */
export function sumCostsMinor(costsMinor: Iterable<number>): number {
  let micro = 0;
  for (const cost of costsMinor) {
    if (!Number.isFinite(cost)) throw new RangeError(`A cost must be a finite number, got ${cost}`);
    micro += toMicro(cost);
  }
  return micro / MICRO;
}

/** An exact cost as whole minor units, half away from zero: the one rounding a line of money gets. */
export function wholeMinor(costMinor: number): number {
  if (!Number.isFinite(costMinor)) throw new RangeError(`A cost must be a finite number, got ${costMinor}`);
  const micro = toMicro(costMinor);
  return Math.sign(micro) * Math.floor((Math.abs(micro) + MICRO / 2) / MICRO);
}

export interface Use {
  readonly quantity: number;
  readonly container: Pick<Container, 'sizeQty' | 'priceMinor' | 'currency'>;
}

/** Total cost per currency in whole minor units: the uses summed exactly, rounded once. Currencies never mix. */
export function costOfUses(uses: readonly Use[]): Record<string, number> {
  const exact = new Map<string, number[]>();
  for (const use of uses) {
    const { currency } = use.container;
    exact.set(currency, [...(exact.get(currency) ?? []), costOfUseMinor(use.quantity, use.container)]);
  }
  return Object.fromEntries([...exact].map(([currency, costs]) => [currency, wholeMinor(sumCostsMinor(costs))]));
}

function assertDensity(densityGPerMl: number): void {
  if (!Number.isFinite(densityGPerMl) || densityGPerMl <= 0) {
    throw new RangeError(`Density must be a finite number above 0 g/mL, got ${densityGPerMl}`);
  }
}
