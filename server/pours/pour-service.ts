import { and, eq, isNull } from 'drizzle-orm';
import type * as z from 'zod';
import type { newPourSchema, pourPatchSchema } from '../../shared/domain-schemas.js';
import { firstLayer, layerCountProblem } from '../../shared/pour-layers.js';
import { planPour, type PourPlan } from '../../shared/pour-plan.js';
import { BUILD } from '../builds/build-service.js';
import { AppError } from '../core/app-error.js';
import { ledgerEntries, pourLayers, pours } from '../db/schema/index.js';
import type { materials } from '../db/schema/index.js';
import { insertRecord, liveRecord, tombstone, type RecordKind } from '../records/synced-records.js';
import { served } from '../records/served-kind.js';
import type { UnitOfWork } from '../records/unit-of-work.js';
import { reschedulePourReminders } from '../reminders/pour-reminder-schedule.js';
import { CONTAINER, LEDGER_ENTRY, MATERIAL } from '../shelf/shelf-service.js';
import { followRow, liveLayersOf } from './followed-pour-row.js';
import { drawFromShelf, ledgerEntriesOf, redrawPour, refuseShort } from './pour-stock.js';

export const POUR: RecordKind<typeof pours> = { table: pours, noun: 'pour' };
export const POUR_LAYER: RecordKind<typeof pourLayers> = { table: pourLayers, noun: 'layer' };

type PourInput = z.output<typeof newPourSchema>;
type PourPatch = z.output<typeof pourPatchSchema>;

function plannedOrRefused(input: PourInput, dataSheet: typeof materials.$inferSelect.dataSheet): PourPlan {
  if (dataSheet === null) {
    throw new AppError(400, 'invalid', 'Some values need another look.', {
      materialId: 'This material has no data sheet, so it cannot be poured: choose a pour material.',
    });
  }
  const result = planPour({ ...input, material: dataSheet, startAtMs: Date.parse(input.startAt) });
  if (result.ok) return result.plan;
  const fields = Object.fromEntries(result.errors.map((error) => [error.path, error.message]));
  throw new AppError(400, 'invalid', 'Some values need another look.', fields);
}

/**
 * A pour with its layer 1 (same id), drawn from the shelf oldest container first (or from the chosen
 * ones) under row locks. Short stock is refused, or recorded as a shortfall when the modeller says they
 * used another bottle.
 */
export async function createPour(work: UnitOfWork, input: PourInput) {
  const { tx, workshopId, changeNumber, userId } = work;
  await liveRecord(tx, workshopId, BUILD, input.buildId);
  const material = await liveRecord(tx, workshopId, MATERIAL, input.materialId);
  for (const containerId of input.containerIds ?? []) await liveRecord(tx, workshopId, CONTAINER, containerId);
  const plan = plannedOrRefused(input, material.dataSheet);
  const startAt = new Date(input.startAt);
  const drawRequest = {
    workshopId,
    pourId: input.id,
    materialId: input.materialId,
    plan,
    chosenContainerIds: input.containerIds ?? null,
  };
  const { uses, shortfall } = await drawFromShelf(tx, drawRequest);
  if (shortfall.length > 0 && input.whenShort === 'refuse') refuseShort(drawRequest, shortfall);
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
    chosenContainerIds: input.containerIds ?? null,
    layerCount: input.layerCount ?? plan.layers.count,
    loggedBy: userId,
  });
  const layer = firstLayer(plan, input.startAt, input.roomTempC);
  await insertRecord(tx, POUR_LAYER, {
    ...layer,
    id: input.id,
    workshopId,
    changeNumber,
    pourId: input.id,
    pouredAt: startAt,
    recordedBy: userId,
  });
  const where = { workshopId, pourId: input.id, changeNumber, at: startAt };
  for (const entry of ledgerEntriesOf(uses, where)) await insertRecord(tx, LEDGER_ENTRY, entry);
  await reschedulePourReminders(tx, input.id, work.clock.now());
  return pour;
}

/** A note corrected, or the layers still to come re-planned (added, skipped or re-split): stock and reminders follow. */
export async function patchPour(work: UnitOfWork, id: string, patch: PourPatch) {
  const { tx, workshopId, changeNumber } = work;
  const pour = await liveRecord(tx, workshopId, POUR, id);
  const layers = await liveLayersOf(tx, id);
  const layerCount = patch.layerCount ?? pour.layerCount;
  const problem = layerCountProblem({ request: pour.request, ...pour.plan }, layerCount, layers);
  if (problem !== null) throw new AppError(400, 'invalid', problem, { layerCount: problem });
  const followed = followRow(pour, layers, { layerCount });
  const redrawn = await redrawPour(work, pour, followed);
  const [row] = await tx
    .update(pours)
    .set({ note: patch.note ?? pour.note, layerCount, updatedAt: redrawn.updatedAt, changeNumber })
    .where(eq(pours.id, id))
    .returning();
  await reschedulePourReminders(tx, id, work.clock.now());
  return row!;
}

/** Deleting a pour puts its stock back: its uses and layers are tombstoned with it, its reminders cancelled. */
export async function deletePour({ tx, workshopId, changeNumber, clock }: UnitOfWork, id: string) {
  await tombstone(tx, workshopId, POUR, id, changeNumber);
  const now = clock.now();
  await tx
    .update(ledgerEntries)
    .set({ deletedAt: now, updatedAt: now, changeNumber })
    .where(and(eq(ledgerEntries.pourId, id), isNull(ledgerEntries.deletedAt)));
  await tx
    .update(pourLayers)
    .set({ deletedAt: now, updatedAt: now, changeNumber })
    .where(and(eq(pourLayers.pourId, id), isNull(pourLayers.deletedAt)));
  await reschedulePourReminders(tx, id, now);
}

export const poursOfBuild = (buildId: string) => and(eq(pours.buildId, buildId), isNull(pours.deletedAt));

export const pourRecords = served({
  kind: 'pour',
  table: pours,
  changes: {
    create: (work, m) => createPour(work, m.data),
    patch: (work, m) => patchPour(work, m.recordId, m.data),
    delete: (work, m) => deletePour(work, m.recordId),
  },
});
