/**
 * The stock book. Stock on hand is never a stored counter: it is the sum of ledger
 * entries, so pours logged offline on two phones both count, in whatever order they sync.
 */

export type LedgerKind = 'purchase' | 'pour-use' | 'waste' | 'stocktake';
export type StockUnit = 'g' | 'mL';
export type ContainerPart = 'A' | 'B' | 'single';

export interface LedgerEntry {
  readonly containerId: string;
  readonly kind: LedgerKind;
  /**
   * Signed, in the container's unit: purchase +, pour use and waste -, stocktake the
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

export function remainingByContainer(entries: readonly LedgerEntry[]): Record<string, number> {
  const milli = new Map<string, number>();
  for (const entry of entries) {
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
  return g / densityGPerMl;
}

export function volumeToMassG(ml: number, densityGPerMl: number): number {
  assertDensity(densityGPerMl);
  return ml * densityGPerMl;
}

/**
 * amount x (price / size), rounded half up to a whole minor unit (design.md section 4).
 * Worked in integers (thousandths of the unit, BigInt) so no rounding surprise at half a cent.
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
  const numerator = BigInt(toMilli(quantity)) * BigInt(container.priceMinor);
  return Number((2n * numerator + sizeMilli) / (2n * sizeMilli));
}

export interface Use {
  readonly quantity: number;
  readonly container: Pick<Container, 'sizeQty' | 'priceMinor' | 'currency'>;
}

/**
 * Total cost per currency. Each use is rounded on its own, so a build's total always
 * equals the sum of the cost lines shown for it. Currencies are never added together.
 */
export function costOfUses(uses: readonly Use[]): Record<string, number> {
  const totals = new Map<string, number>();
  for (const use of uses) {
    const { currency } = use.container;
    totals.set(currency, (totals.get(currency) ?? 0) + costOfUseMinor(use.quantity, use.container));
  }
  return Object.fromEntries(totals);
}

function assertDensity(densityGPerMl: number): void {
  if (!Number.isFinite(densityGPerMl) || densityGPerMl <= 0) {
    throw new RangeError(`Density must be a finite number above 0 g/mL, got ${densityGPerMl}`);
  }
}
