import { and, eq, isNull } from 'drizzle-orm';
import type * as z from 'zod';
import type { newPourLayerSchema, pourLayerPatchSchema } from '../../shared/domain-schemas.js';
import { layerProblem, MAX_FUTURE_MS } from '../../shared/pour-layers.js';
import { AppError } from '../core/app-error.js';
import { pourLayers, pours } from '../db/schema/index.js';
import type { Transaction } from '../records/change-stamp.js';
import { served } from '../records/served-kind.js';
import { insertRecord, liveRecord } from '../records/synced-records.js';
import type { UnitOfWork } from '../records/unit-of-work.js';
import { reschedulePourReminders } from '../reminders/pour-reminder-schedule.js';
import { followRow, liveLayersOf, type PourLayerRow, type PourRow } from './followed-pour-row.js';
import { POUR_LAYER } from './pour-service.js';
import { redrawPour } from './pour-stock.js';

type NewLayer = z.output<typeof newPourLayerSchema>;
type LayerPatch = z.output<typeof pourLayerPatchSchema>;

const CODES = { 'already-poured': 'layer_already_poured' } as const;

/** The pour a layer belongs to, locked: plain words when it was deleted or never was. */
async function pourOfLayer(tx: Transaction, workshopId: string, pourId: string): Promise<PourRow> {
  const [pour] = await tx
    .select()
    .from(pours)
    .where(and(eq(pours.id, pourId), eq(pours.workshopId, workshopId)))
    .for('update');
  if (!pour) throw new AppError(404, 'not_found', 'There is no such pour in this workshop.');
  if (pour.deletedAt !== null) {
    throw new AppError(404, 'not_found', 'This pour was deleted, so its layers can no longer be recorded or changed.');
  }
  return pour;
}

/**
 * The stock drawn again from what the layers will take once the change is written: refused, when the
 * shelf falls short, before anything is. `write` then records the layer change.
 */
async function follow<T>(
  work: UnitOfWork,
  pour: PourRow,
  layersAfter: readonly PourLayerRow[],
  write: () => Promise<T>,
): Promise<T> {
  await redrawPour(work, pour, followRow(pour, layersAfter));
  const written = await write();
  await reschedulePourReminders(work.tx, pour.id, work.clock.now());
  return written;
}

/**
 * A layer recorded as poured, with the plan for it kept beside what was weighed. Two devices recording
 * the same layer keep the first; the second is told when it was recorded.
 */
export async function createPourLayer(work: UnitOfWork, input: NewLayer) {
  const { tx, workshopId, changeNumber, userId } = work;
  const pour = await pourOfLayer(tx, workshopId, input.pourId);
  const layers = await liveLayersOf(tx, pour.id);
  const followed = followRow(pour, layers);
  const pouredAt = new Date(input.pouredAt);
  const problem = layerProblem(
    followed,
    { number: input.number, pouredAtMs: pouredAt.getTime() },
    work.clock.now().getTime(),
  );
  if (problem?.code === 'already-poured') throw new AppError(409, CODES[problem.code], problem.message);
  if (problem) throw new AppError(400, 'invalid', problem.message, { [problem.field]: problem.message });
  const planned = followed.next!.planned;
  const values = {
    id: input.id,
    workshopId,
    changeNumber,
    pourId: pour.id,
    number: input.number,
    pouredAt,
    roomTempC: input.roomTempC,
    depthMm: planned.depthMm,
    partAG: planned.partAG,
    partBG: planned.partBG,
    weighedAG: input.weighedAG ?? null,
    weighedBG: input.weighedBG ?? null,
    note: input.note,
    recordedBy: userId,
  };
  const now = work.clock.now();
  const layerAfter = { ...values, createdAt: now, updatedAt: now, deletedAt: null };
  return follow(work, pour, [...layers, layerAfter], () => insertRecord(tx, POUR_LAYER, values));
}

/** Plain words when a corrected time would put a layer before the one below it, after the one above, or ahead of now. */
function pouredAtProblem(layers: readonly PourLayerRow[], layer: PourLayerRow, pouredAtMs: number, nowMs: number) {
  const below = layers.find((other) => other.number === layer.number - 1);
  const above = layers.find((other) => other.number === layer.number + 1);
  if (layer.number === 1) return 'Layer 1 goes on when the pour starts; change the pour to move it.';
  if (below && pouredAtMs < below.pouredAt.getTime()) {
    return `Layer ${layer.number} cannot go on before layer ${below.number}, which was poured at ${isoMinute(below.pouredAt)}.`;
  }
  if (above && pouredAtMs > above.pouredAt.getTime()) {
    return `Layer ${layer.number} cannot go on after layer ${above.number}, which was poured at ${isoMinute(above.pouredAt)}.`;
  }
  if (pouredAtMs > nowMs + MAX_FUTURE_MS)
    return 'That time is more than an hour from now. Record a layer when it is poured.';
  return null;
}

const isoMinute = (at: Date) => `${at.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

/** A layer corrected: its time, room, what was weighed (null clears it) or its note. */
export async function patchPourLayer(work: UnitOfWork, id: string, patch: LayerPatch) {
  const { tx, workshopId, changeNumber } = work;
  const found = await liveRecord(tx, workshopId, POUR_LAYER, id);
  const pour = await pourOfLayer(tx, workshopId, found.pourId);
  const layers = await liveLayersOf(tx, pour.id);
  if (patch.pouredAt !== undefined) {
    const problem = pouredAtProblem(layers, found, Date.parse(patch.pouredAt), work.clock.now().getTime());
    if (problem) throw new AppError(400, 'invalid', problem, { pouredAt: problem });
  }
  const { pouredAt, ...rest } = patch;
  const changes = { ...rest, ...(pouredAt === undefined ? {} : { pouredAt: new Date(pouredAt) }) };
  const layersAfter = layers.map((layer) => (layer.id === id ? { ...layer, ...changes } : layer));
  return follow(work, pour, layersAfter, async () => {
    const [layer] = await tx
      .update(pourLayers)
      .set({ ...changes, updatedAt: work.clock.now(), changeNumber })
      .where(eq(pourLayers.id, id))
      .returning();
    return layer!;
  });
}

/** Only the topmost layer can be taken back, and never layer 1 (delete the pour instead). */
export async function deletePourLayer(work: UnitOfWork, id: string) {
  const { tx, workshopId, changeNumber } = work;
  const layer = await liveRecord(tx, workshopId, POUR_LAYER, id);
  const pour = await pourOfLayer(tx, workshopId, layer.pourId);
  const layers = await liveLayersOf(tx, pour.id);
  if (layer.number === 1) {
    throw new AppError(409, 'first_layer', 'Layer 1 goes with its pour: delete the pour to take it back.');
  }
  const top = layers.at(-1)!;
  if (top.id !== layer.id) {
    throw new AppError(
      409,
      'not_top_layer',
      `Layer ${top.number} is on top of layer ${layer.number}: take back layer ${top.number} first.`,
    );
  }
  const now = work.clock.now();
  await follow(
    work,
    pour,
    layers.filter((other) => other.id !== id),
    () =>
      tx
        .update(pourLayers)
        .set({ deletedAt: now, updatedAt: now, changeNumber })
        .where(and(eq(pourLayers.id, id), isNull(pourLayers.deletedAt))),
  );
}

export const layersOfPour = (pourId: string) => and(eq(pourLayers.pourId, pourId), isNull(pourLayers.deletedAt));

export const pourLayerRecords = served({
  kind: 'pourLayer',
  table: pourLayers,
  changes: {
    create: (work, m) => createPourLayer(work, m.data),
    patch: (work, m) => patchPourLayer(work, m.recordId, m.data),
    delete: (work, m) => deletePourLayer(work, m.recordId),
  },
});
