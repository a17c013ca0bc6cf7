import { and, eq, isNull } from 'drizzle-orm';
import type { z } from 'zod';
import type { newPourSchema } from '../../shared/domain-schemas.js';
import { allocateFifo, costOfUseMinor, massToVolumeMl } from '../../shared/ledger.js';
import { formatMass } from '../../shared/format.js';
import { planPour, type PourPlan } from '../../shared/pour-plan.js';
import { BUILD } from '../builds/build-service.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { ledgerEntries, pours, type PourShortfall } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';
import { insertRecord, liveRecord, tombstone, writeRecords, type RecordKind } from '../records/synced-records.js';
import { CONTAINER, LEDGER_ENTRY, MATERIAL } from '../shelf/shelf-service.js';
import { lockedContainersOf, remainingOf } from '../shelf/stock.js';
import { uuidv7 } from '../records/ids.js';
import type { materials } from '../db/schema/index.js';

export const POUR: RecordKind = { table: pours, noun: 'pour' };

type PourInput = z.output<typeof newPourSchema>;
type Part = PourShortfall['part'];

/** Grams of each part the pour mixes in all, with the density that turns them into a container's unit. */
function partsNeeded(plan: PourPlan): { part: Part; grams: number; density: number }[] {
  const { mix, request } = plan;
  const { densityAGPerMl, densityBGPerMl } = request.material;
  if (mix.singlePart) return [{ part: 'single', grams: mix.total.partAG, density: densityAGPerMl }];
  return [
    { part: 'A', grams: mix.total.partAG, density: densityAGPerMl },
    { part: 'B', grams: mix.total.partBG, density: densityBGPerMl ?? densityAGPerMl },
  ];
}

function plannedOrRefused(input: PourInput, dataSheet: typeof materials.$inferSelect.dataSheet): PourPlan {
  const result = planPour({ ...input, material: dataSheet, startAtMs: Date.parse(input.startAt) });
  if (result.ok) return result.plan;
  const fields = Object.fromEntries(result.errors.map((error) => [error.path, error.message]));
  throw new AppError(400, 'invalid', 'Some values need another look.', fields);
}

/**
 * Takes each part from the shelf, oldest container first (or the chosen ones), under row locks.
 * Short stock is refused, or recorded as a shortfall when the modeller says they used another bottle.
 */
async function drawFromShelf(
  tx: Transaction,
  workshopId: string,
  input: PourInput,
  plan: PourPlan,
  changeNumber: number,
  at: Date,
) {
  const held = await lockedContainersOf(tx, workshopId, input.materialId);
  const remaining = await remainingOf(
    tx,
    held.map((container) => container.id),
  );
  const shortfall: PourShortfall[] = [];
  const uses: Record<string, unknown>[] = [];
  for (const { part, grams, density } of partsNeeded(plan)) {
    const candidates = held.filter(
      (container) => container.part === part && (!input.containerIds || input.containerIds.includes(container.id)),
    );
    const toGrams = (qty: number, unit: string) => (unit === 'g' ? qty : qty * density);
    const allocation = allocateFifo(
      grams,
      candidates.map((container) => ({
        containerId: container.id,
        boughtAtMs: Date.parse(container.boughtOn),
        remainingQty: Math.max(0, toGrams(remaining.get(container.id) ?? 0, container.unit)),
      })),
    );
    if (allocation.shortfallQty > 0) {
      if (input.whenShort === 'refuse') {
        const label = part === 'single' ? 'this material' : `part ${part}`;
        throw new AppError(
          409,
          'stock_short',
          `The shelf holds ${formatMass(allocation.allocatedQty)} of ${label}; this pour needs ${formatMass(grams)}. ` +
            'Add a container, or record the rest as taken from a bottle not on the shelf.',
        );
      }
      shortfall.push({ part, quantityG: allocation.shortfallQty });
    }
    for (const { containerId, quantity: takenG } of allocation.allocations) {
      const container = candidates.find((candidate) => candidate.id === containerId)!;
      const quantity = container.unit === 'g' ? takenG : Math.round(massToVolumeMl(takenG, density) * 1000) / 1000;
      uses.push({
        id: uuidv7(),
        workshopId,
        changeNumber,
        containerId,
        kind: 'pour-use',
        quantity: -quantity,
        costMinor: costOfUseMinor(quantity, container),
        at,
        pourId: input.id,
      });
    }
  }
  return { shortfall, uses };
}

export function createPour(ctx: ServerContext, userId: string, workshopId: string, input: PourInput) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    await liveRecord(tx, workshopId, BUILD, input.buildId);
    const material = (await liveRecord(tx, workshopId, MATERIAL, input.materialId)) as typeof materials.$inferSelect;
    for (const containerId of input.containerIds ?? []) await liveRecord(tx, workshopId, CONTAINER, containerId);
    const plan = plannedOrRefused(input, material.dataSheet);
    const startAt = new Date(input.startAt);
    const { shortfall, uses } = await drawFromShelf(tx, workshopId, input, plan, changeNumber, startAt);
    const { request, ...computed } = plan;
    const pour = await insertRecord(tx, POUR, {
      id: input.id,
      workshopId,
      changeNumber,
      buildId: input.buildId,
      stepId: input.stepId ?? null,
      materialId: input.materialId,
      startAt,
      request,
      plan: computed,
      shortfall,
      note: input.note,
      loggedBy: userId,
    });
    for (const use of uses) await insertRecord(tx, LEDGER_ENTRY, use);
    return pour;
  });
}

/** Deleting a pour puts its stock back: its uses are tombstoned with it. */
export function deletePour(ctx: ServerContext, userId: string, workshopId: string, id: string) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    await tombstone(tx, workshopId, POUR, id, changeNumber);
    const now = new Date();
    await tx
      .update(ledgerEntries)
      .set({ deletedAt: now, updatedAt: now, changeNumber })
      .where(and(eq(ledgerEntries.pourId, id), isNull(ledgerEntries.deletedAt)));
  });
}

export const poursOfBuild = (buildId: string) => and(eq(pours.buildId, buildId), isNull(pours.deletedAt));
