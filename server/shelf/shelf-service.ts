import { and, eq, isNull } from 'drizzle-orm';
import type * as z from 'zod';
import type {
  containerPatchSchema,
  materialPatchSchema,
  newContainerSchema,
  newMaterialSchema,
  stocktakeSchema,
  wasteSchema,
} from '../../shared/domain-schemas.js';
import { costOfUseMinor, stocktakeAdjustment } from '../../shared/ledger.js';
import type { ServerContext } from '../context.js';
import { containers, ledgerEntries, materials } from '../db/schema/index.js';
import {
  insertRecord,
  liveRecord,
  writeRecords,
  type RecordKind,
  recordEditor,
  recordRemover,
} from '../records/synced-records.js';
import { remainingOf, type ContainerRow } from './stock.js';

export const MATERIAL: RecordKind = { table: materials, noun: 'material' };
export const CONTAINER: RecordKind = { table: containers, noun: 'container' };
export const LEDGER_ENTRY: RecordKind = { table: ledgerEntries, noun: 'ledger entry' };

export function createMaterial(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  input: z.output<typeof newMaterialSchema>,
) {
  return writeRecords(ctx, userId, workshopId, (tx, changeNumber) =>
    insertRecord(tx, MATERIAL, { ...input, workshopId, changeNumber }),
  );
}

export const updateMaterial = recordEditor<z.output<typeof materialPatchSchema>>(MATERIAL);

export const deleteMaterial = recordRemover(MATERIAL);

/** A new container arrives full: its purchase is the first entry in its stock book. */
export function createContainer(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  input: z.output<typeof newContainerSchema>,
) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    await liveRecord(tx, workshopId, MATERIAL, input.materialId);
    const container = await insertRecord(tx, CONTAINER, { ...input, workshopId, changeNumber });
    // The purchase shares the container's id: one per container, and a replayed write makes no second one.
    await insertRecord(tx, LEDGER_ENTRY, {
      id: input.id,
      workshopId,
      changeNumber,
      containerId: input.id,
      kind: 'purchase',
      quantity: input.sizeQty,
      at: new Date(`${input.boughtOn}T12:00:00Z`),
    });
    return container;
  });
}

export const updateContainer = recordEditor<z.output<typeof containerPatchSchema>>(CONTAINER);

export const deleteContainer = recordRemover(CONTAINER);

/** Spilled, skinned over or gone off: taken off the stock, costed, but charged to no build. */
export function recordWaste(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  containerId: string,
  input: z.output<typeof wasteSchema>,
) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    const container = (await liveRecord(tx, workshopId, CONTAINER, containerId)) as ContainerRow;
    return insertRecord(tx, LEDGER_ENTRY, {
      id: input.id,
      workshopId,
      changeNumber,
      containerId,
      kind: 'waste',
      quantity: -input.quantity,
      costMinor: costOfUseMinor(input.quantity, container),
      at: ctx.clock.now(),
      note: input.note,
    });
  });
}

/** A count of what is really left: recorded as the difference, so remaining stays a plain sum. */
export function recordStocktake(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  containerId: string,
  input: z.output<typeof stocktakeSchema>,
) {
  return writeRecords(ctx, userId, workshopId, async (tx, changeNumber) => {
    await liveRecord(tx, workshopId, CONTAINER, containerId);
    const expected = (await remainingOf(tx, [containerId])).get(containerId) ?? 0;
    return insertRecord(tx, LEDGER_ENTRY, {
      id: input.id,
      workshopId,
      changeNumber,
      containerId,
      kind: 'stocktake',
      quantity: stocktakeAdjustment(input.countedQty, expected),
      at: ctx.clock.now(),
    });
  });
}

export async function containersOf(ctx: ServerContext, workshopId: string) {
  return ctx.db
    .select()
    .from(containers)
    .where(and(eq(containers.workshopId, workshopId), isNull(containers.deletedAt)));
}
