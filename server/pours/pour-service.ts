import { and, eq, isNull } from 'drizzle-orm';
import type * as z from 'zod';
import type { newPourSchema } from '../../shared/domain-schemas.js';
import { drawForPour, stockShortMessage } from '../../shared/pour-draw.js';
import { planPour, type PourPlan } from '../../shared/pour-plan.js';
import { BUILD } from '../builds/build-service.js';
import { AppError } from '../core/app-error.js';
import { ledgerEntries, pours } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';
import { insertRecord, liveRecord, tombstone, type RecordKind } from '../records/synced-records.js';
import { served } from '../records/served-kind.js';
import type { UnitOfWork } from '../records/unit-of-work.js';
import { CONTAINER, LEDGER_ENTRY, MATERIAL } from '../shelf/shelf-service.js';
import { lockedContainersOf, remainingOf } from '../shelf/stock.js';
import { uuidv7 } from '../records/ids.js';
import { cancelReminders, scheduleReminders } from '../reminders/pour-reminder-schedule.js';
import type { materials } from '../db/schema/index.js';

export const POUR: RecordKind<typeof pours> = { table: pours, noun: 'pour' };

type PourInput = z.output<typeof newPourSchema>;

function plannedOrRefused(input: PourInput, dataSheet: typeof materials.$inferSelect.dataSheet): PourPlan {
  const result = planPour({ ...input, material: dataSheet, startAtMs: Date.parse(input.startAt) });
  if (result.ok) return result.plan;
  const fields = Object.fromEntries(result.errors.map((error) => [error.path, error.message]));
  throw new AppError(400, 'invalid', 'Some values need another look.', fields);
}

/**
 * Takes each part from the shelf, oldest container first (or from the chosen ones), under row locks.
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
  const shelf = held.map((container) => ({ ...container, remainingQty: remaining.get(container.id) ?? 0 }));
  const { uses, shortfall } = drawForPour(plan, shelf, input.containerIds);
  if (shortfall.length > 0 && input.whenShort === 'refuse') {
    throw new AppError(409, 'stock_short', stockShortMessage(plan, shortfall));
  }
  const entries = uses.map(({ containerId, quantity, costMinor }) => ({
    id: uuidv7(),
    workshopId,
    changeNumber,
    containerId,
    kind: 'pour-use' as const,
    quantity: -quantity,
    costMinor,
    at,
    pourId: input.id,
  }));
  return { shortfall, entries };
}

export async function createPour({ tx, workshopId, changeNumber, userId }: UnitOfWork, input: PourInput) {
  await liveRecord(tx, workshopId, BUILD, input.buildId);
  const material = await liveRecord(tx, workshopId, MATERIAL, input.materialId);
  for (const containerId of input.containerIds ?? []) await liveRecord(tx, workshopId, CONTAINER, containerId);
  const plan = plannedOrRefused(input, material.dataSheet);
  const startAt = new Date(input.startAt);
  const { shortfall, entries } = await drawFromShelf(tx, workshopId, input, plan, changeNumber, startAt);
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
  for (const entry of entries) await insertRecord(tx, LEDGER_ENTRY, entry);
  await scheduleReminders(tx, { id: input.id, workshopId, buildId: input.buildId, note: input.note, plan: computed });
  return pour;
}

/** Deleting a pour puts its stock back: its uses are tombstoned with it. */
export async function deletePour({ tx, workshopId, changeNumber }: UnitOfWork, id: string) {
  await tombstone(tx, workshopId, POUR, id, changeNumber);
  const now = new Date();
  await cancelReminders(tx, id, now);
  await tx
    .update(ledgerEntries)
    .set({ deletedAt: now, updatedAt: now, changeNumber })
    .where(and(eq(ledgerEntries.pourId, id), isNull(ledgerEntries.deletedAt)));
}

export const poursOfBuild = (buildId: string) => and(eq(pours.buildId, buildId), isNull(pours.deletedAt));

export const pourRecords = served({
  kind: 'pour',
  table: pours,
  changes: {
    create: (work, m) => createPour(work, m.data),
    delete: (work, m) => deletePour(work, m.recordId),
  },
});
