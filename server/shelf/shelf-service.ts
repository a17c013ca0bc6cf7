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
import { containerUnitProblem, materialMeasureProblem } from '../../shared/domain-schemas.js';
import { costOfUseMinor, stocktakeAdjustment } from '../../shared/ledger.js';
import { AppError } from '../core/app-error.js';
import type { ServerContext } from '../context.js';
import { containers, ledgerEntries, materials } from '../db/schema/index.js';
import { insertRecord, liveRecord, patchRecord, tombstone, type RecordKind } from '../records/synced-records.js';
import { served } from '../records/served-kind.js';
import type { UnitOfWork } from '../records/unit-of-work.js';
import { remainingOf } from './stock.js';

export const MATERIAL: RecordKind<typeof materials> = { table: materials, noun: 'material' };
export const CONTAINER: RecordKind<typeof containers> = { table: containers, noun: 'container' };
export const LEDGER_ENTRY: RecordKind<typeof ledgerEntries> = { table: ledgerEntries, noun: 'ledger entry' };

export function createMaterial(
  { tx, workshopId, changeNumber }: UnitOfWork,
  input: z.output<typeof newMaterialSchema>,
) {
  return insertRecord(tx, MATERIAL, { ...input, workshopId, changeNumber });
}

/** A material edited; what it becomes must still hold together, and fit the containers it already has. */
export async function updateMaterial(
  { tx, workshopId, changeNumber }: UnitOfWork,
  id: string,
  patch: z.output<typeof materialPatchSchema>,
) {
  const material = { ...(await liveRecord(tx, workshopId, MATERIAL, id)), ...patch };
  const problem = materialMeasureProblem(material);
  if (problem)
    throw new AppError(400, 'invalid', 'Some values need another look.', { [problem.path]: problem.message });
  const held = await tx
    .select({ unit: containers.unit })
    .from(containers)
    .where(and(eq(containers.materialId, id), isNull(containers.deletedAt)));
  const misfit = held.map(({ unit }) => containerUnitProblem(material, unit)).find((words) => words !== null);
  if (misfit) {
    throw new AppError(400, 'invalid', `Its containers on the shelf no longer fit: ${misfit}`, {
      measure: misfit,
    });
  }
  return patchRecord(tx, workshopId, MATERIAL, id, patch, changeNumber);
}

export function deleteMaterial({ tx, workshopId, changeNumber }: UnitOfWork, id: string) {
  return tombstone(tx, workshopId, MATERIAL, id, changeNumber);
}

/**
 * A new container arrives full: its purchase is the first entry in its stock book. The purchase can be
 * refused after the container is written (its id taken), so a push runs this in a savepoint of its own.
 */
export async function createContainer(
  { tx, workshopId, changeNumber }: UnitOfWork,
  input: z.output<typeof newContainerSchema>,
) {
  const material = await liveRecord(tx, workshopId, MATERIAL, input.materialId);
  const misfit = containerUnitProblem(material, input.unit);
  if (misfit) throw new AppError(400, 'invalid', 'Some values need another look.', { unit: misfit });
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
}

export function updateContainer(
  { tx, workshopId, changeNumber }: UnitOfWork,
  id: string,
  patch: z.output<typeof containerPatchSchema>,
) {
  return patchRecord(tx, workshopId, CONTAINER, id, patch, changeNumber);
}

export function deleteContainer({ tx, workshopId, changeNumber }: UnitOfWork, id: string) {
  return tombstone(tx, workshopId, CONTAINER, id, changeNumber);
}

/** Spilled, skinned over or gone off: taken off the stock, costed, but charged to no build. */
export async function recordWaste(
  { tx, workshopId, changeNumber, clock }: UnitOfWork,
  containerId: string,
  input: z.output<typeof wasteSchema>,
) {
  const container = await liveRecord(tx, workshopId, CONTAINER, containerId);
  return insertRecord(tx, LEDGER_ENTRY, {
    id: input.id,
    workshopId,
    changeNumber,
    containerId,
    kind: 'waste',
    quantity: -input.quantity,
    costMinor: costOfUseMinor(input.quantity, container),
    at: clock.now(),
    note: input.note,
  });
}

/** A count of what is really left: recorded as the difference, so remaining stays a plain sum. */
export async function recordStocktake(
  { tx, workshopId, changeNumber, clock }: UnitOfWork,
  containerId: string,
  input: z.output<typeof stocktakeSchema>,
) {
  await liveRecord(tx, workshopId, CONTAINER, containerId);
  const expected = (await remainingOf(tx, [containerId])).get(containerId) ?? 0;
  return insertRecord(tx, LEDGER_ENTRY, {
    id: input.id,
    workshopId,
    changeNumber,
    containerId,
    kind: 'stocktake',
    quantity: stocktakeAdjustment(input.countedQty, expected),
    at: clock.now(),
  });
}

export async function containersOf(ctx: ServerContext, workshopId: string) {
  return ctx.db
    .select()
    .from(containers)
    .where(and(eq(containers.workshopId, workshopId), isNull(containers.deletedAt)));
}

export const materialRecords = served({
  kind: 'material',
  table: materials,
  changes: {
    create: (work, m) => createMaterial(work, m.data),
    patch: (work, m) => updateMaterial(work, m.recordId, m.data),
    delete: (work, m) => deleteMaterial(work, m.recordId),
  },
});

export const containerRecords = served({
  kind: 'container',
  table: containers,
  changes: {
    create: (work, m) => createContainer(work, m.data),
    patch: (work, m) => updateContainer(work, m.recordId, m.data),
    delete: (work, m) => deleteContainer(work, m.recordId),
    waste: (work, m) => recordWaste(work, m.recordId, m.data),
    stocktake: (work, m) => recordStocktake(work, m.recordId, m.data),
  },
  mayRefuseAfterWriting: ['create'],
});

/** Written only by the services of containers and pours. */
export const ledgerRecords = served({ kind: 'ledgerEntry', table: ledgerEntries, changes: {} });
