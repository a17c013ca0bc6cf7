/**
 * What a pour takes from the shelf: the grams of each part, drawn from that part's containers oldest
 * first (first in, first out: common practice for stock that ages), turned into each container's unit by density and costed from its price.
 * The server draws this way when it records a pour, and a device the same way while offline, so the
 * stock both show agrees.
 */
import { formatMass } from './format.js';
import { allocateFifo, costOfUseMinor, massToVolumeMl, type ContainerPart } from './ledger.js';
import { convertAmount, isPourableUnit, unitDimension, type StockUnit } from './stock-units.js';
import type { PourPlan } from './pour-plan.js';

/** A container on the shelf, with what is left in it. */
export interface ShelfContainer {
  readonly id: string;
  readonly part: ContainerPart;
  readonly unit: StockUnit;
  /** The day it was bought (YYYY-MM-DD): the oldest is used first. */
  readonly boughtOn: string;
  readonly sizeQty: number;
  /** Price paid for the whole container, in integer minor units. */
  readonly priceMinor: number;
  /** What is left, in the container's unit: the sum of its ledger entries. */
  readonly remainingQty: number;
}

/** One container's share of a pour, to be entered in the stock book as a negative pour use. */
export interface PourUse {
  readonly containerId: string;
  readonly part: ContainerPart;
  /** Above 0, in the container's unit; millilitres to the thousandth. */
  readonly quantity: number;
  readonly costMinor: number;
}

/** What a pour took that the shelf did not hold: "I used another bottle". */
export interface PourShortfall {
  readonly part: ContainerPart;
  readonly quantityG: number;
}

export interface PourDraw {
  readonly uses: PourUse[];
  /** One entry per part the shelf could not cover; empty when it covers the whole pour. */
  readonly shortfall: PourShortfall[];
}

export interface PartNeed {
  readonly part: ContainerPart;
  readonly quantityG: number;
  /** Turns the part's grams into millilitres for a container measured by volume. */
  readonly densityGPerMl: number;
}

const MILLI = 1000;

/** Grams of each part, as a pour followed layer by layer needs them (see pour-layers.ts). */
export interface NeedG {
  readonly partA: number;
  readonly partB: number;
}

/**
 * Grams of each part the pour mixes in all (the rounded amounts actually weighed), with their densities:
 * the plan's, or `needG` once layers were weighed or re-planned.
 */
export function partsNeeded(plan: PourPlan, needG?: NeedG): PartNeed[] {
  const { mix, request } = plan;
  const { densityAGPerMl, densityBGPerMl } = request.material;
  const partA = needG?.partA ?? mix.total.partAG;
  const partB = needG?.partB ?? mix.total.partBG;
  if (mix.singlePart) return [{ part: 'single', quantityG: partA, densityGPerMl: densityAGPerMl }];
  return [
    { part: 'A', quantityG: partA, densityGPerMl: densityAGPerMl },
    { part: 'B', quantityG: partB, densityGPerMl: densityBGPerMl ?? densityAGPerMl },
  ];
}

/**
 * Draws each part from the containers of that part, oldest first; with `chosenContainerIds`, only from
 * those (still oldest first among them). What the shelf cannot cover is returned as a shortfall, never
 * overdrawn from a container.
 */
export function drawForPour(
  plan: PourPlan,
  containers: readonly ShelfContainer[],
  chosenContainerIds?: readonly string[],
  needG?: NeedG,
): PourDraw {
  const uses: PourUse[] = [];
  const shortfall: PourShortfall[] = [];
  for (const { part, quantityG, densityGPerMl } of partsNeeded(plan, needG)) {
    // A pour draws by weight or volume; a container kept in pieces or metres is not for pouring.
    const candidates = containers.filter(
      (container) =>
        container.part === part &&
        isPourableUnit(container.unit) &&
        (chosenContainerIds === undefined || chosenContainerIds.includes(container.id)),
    );
    const allocation = allocateFifo(
      quantityG,
      candidates.map((container) => ({
        containerId: container.id,
        boughtAtMs: Date.parse(container.boughtOn),
        remainingQty: Math.max(0, inGrams(container.remainingQty, container.unit, densityGPerMl)),
      })),
    );
    if (allocation.shortfallQty > 0) shortfall.push({ part, quantityG: allocation.shortfallQty });
    for (const { containerId, quantity: takenG } of allocation.allocations) {
      const container = candidates.find((candidate) => candidate.id === containerId)!;
      // Grams back to the container's unit can round a thousandth above what it holds: never more than it holds.
      const quantity = Math.min(
        container.remainingQty,
        Math.round(fromGrams(takenG, container.unit, densityGPerMl) * MILLI) / MILLI,
      );
      // A dense part's last milligram can round to 0 mL: there is then nothing to enter in the stock book.
      if (quantity > 0) uses.push({ containerId, part, quantity, costMinor: costOfUseMinor(quantity, container) });
    }
  }
  return { uses, shortfall };
}

/** An amount in a container's unit as grams: by weight directly, by volume through the part's density. */
function inGrams(quantity: number, unit: StockUnit, densityGPerMl: number): number {
  return unitDimension(unit) === 'mass'
    ? convertAmount(quantity, unit, 'g')
    : convertAmount(quantity, unit, 'mL') * densityGPerMl;
}

function fromGrams(g: number, unit: StockUnit, densityGPerMl: number): number {
  return unitDimension(unit) === 'mass'
    ? convertAmount(g, 'g', unit)
    : convertAmount(massToVolumeMl(g, densityGPerMl), 'mL', unit);
}

/** Plain words for a pour the shelf cannot cover, naming each short part: what the shelf holds and what is needed. */
export function stockShortMessage(plan: PourPlan, shortfall: readonly PourShortfall[], needG?: NeedG): string {
  const sentences = partsNeeded(plan, needG).flatMap(({ part, quantityG }) => {
    const short = shortfall.find((entry) => entry.part === part);
    if (short === undefined) return [];
    const heldG = (Math.round(quantityG * MILLI) - Math.round(short.quantityG * MILLI)) / MILLI;
    const label = part === 'single' ? 'this material' : `part ${part}`;
    return [`The shelf holds ${formatMass(heldG)} of ${label}; this pour needs ${formatMass(quantityG)}.`];
  });
  return [...sentences, 'Add a container, or record the rest as taken from a bottle not on the shelf.'].join(' ');
}
