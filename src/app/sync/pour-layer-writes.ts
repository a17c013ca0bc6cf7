import { drawForPour, MAX_FUTURE_MS, type NeedG, type PourLayerPatch, type PourPlan } from '@benchtide/shared';
import { format, isSameDay } from 'date-fns';
import { v7 } from 'uuid';
import type { BenchDb } from './bench-db';
import { shelfOnDevice } from './device-stock';
import { insertRecords, ledgerEntry, patchRecord, softDelete } from './record-writes';
import type { LocalPour, LocalPourLayer, RecordUndo } from './synced-records';

/** A layer that cannot be recorded, corrected or taken back as asked: nothing was saved. */
export class LayerRefusedError extends Error {
  constructor(
    /** The field the modeller should change: number, pouredAt, weighedAG, weighedBG, layerCount. */
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'LayerRefusedError';
  }
}

const POUR_NOT_HERE =
  'This pour is not on this device (or was deleted). Sync this workshop and try again; nothing was saved.';
const LAYER_NOT_HERE =
  'This layer is not on this device (or was taken back). Sync this workshop and try again; nothing was saved.';

/** A moment in this device's own time zone: "08:40" today, "Sat 1 Mar 08:40" another day. */
export function localMoment(ms: number, nowMs = Date.now()): string {
  return format(ms, isSameDay(ms, nowMs) ? 'HH:mm' : 'EEE d MMM HH:mm');
}

export async function pourOnDevice(db: BenchDb, workshopId: string, pourId: string): Promise<LocalPour> {
  const pour = await db.pours.get(pourId);
  if (pour?.workshopId !== workshopId || pour.deletedAt !== null) throw new Error(POUR_NOT_HERE);
  return pour;
}

export async function layerOnDevice(db: BenchDb, workshopId: string, layerId: string): Promise<LocalPourLayer> {
  const layer = await db.pourLayers.get(layerId);
  if (layer?.workshopId !== workshopId || layer.deletedAt !== null) throw new Error(LAYER_NOT_HERE);
  return layer;
}

/** A weighed amount of 0 is a slip: the schema would refuse it too, but this says which part. */
export function refuseZeroWeighed(amounts: { weighedAG?: number | null; weighedBG?: number | null }): void {
  for (const [field, part] of [
    ['weighedAG', 'A'],
    ['weighedBG', 'B'],
  ] as const) {
    if (amounts[field] === 0) {
      throw new LayerRefusedError(
        field,
        `Weighed part ${part} must be more than 0 g; leave it empty if it was not weighed.`,
      );
    }
  }
}

/** A two-part mix weighed for one part only would count the other as nothing taken from the shelf. */
export function refuseHalfWeighed(
  pour: LocalPour,
  weighed: { weighedAG: number | null; weighedBG: number | null },
): void {
  if (pour.plan.mix.singlePart || (weighed.weighedAG === null) === (weighed.weighedBG === null)) return;
  const field = weighed.weighedAG === null ? 'weighedAG' : 'weighedBG';
  throw new LayerRefusedError(field, 'Record what was weighed of both parts, or of neither.');
}

/**
 * Why a correction would put a layer out of order, or null: its time stays between the layers below and
 * above it and not more than an hour ahead of now.
 */
export function correctionProblem(
  layers: readonly LocalPourLayer[],
  layer: LocalPourLayer,
  patch: PourLayerPatch,
  nowMs: number,
): string | null {
  if (patch.pouredAt === undefined) return null;
  const atMs = Date.parse(patch.pouredAt);
  const below = layers.find((other) => other.number === layer.number - 1);
  const above = layers.find((other) => other.number === layer.number + 1);
  if (below && atMs < Date.parse(below.pouredAt)) {
    const when = localMoment(Date.parse(below.pouredAt), nowMs);
    return `Layer ${layer.number} cannot go on before layer ${below.number}, which was poured at ${when}.`;
  }
  if (above && atMs > Date.parse(above.pouredAt)) {
    const when = localMoment(Date.parse(above.pouredAt), nowMs);
    return `Layer ${layer.number} cannot go on after layer ${above.number}, which was poured at ${when}.`;
  }
  if (atMs > nowMs + MAX_FUTURE_MS) return 'That time is more than an hour from now. Record a layer when it is poured.';
  return null;
}

/**
 * Draws the pour's stock again on this device for what it now needs: its pour uses here go (soft-deleted,
 * so a refused change puts them back) and new ones are drawn oldest first. A short shelf only records the
 * shortfall on the pour: the server draws again and decides.
 */
export async function redrawPour(
  db: BenchDb,
  workshopId: string,
  pour: LocalPour,
  needG: NeedG,
  now: string,
): Promise<RecordUndo[]> {
  const undo: RecordUndo[] = [];
  const uses = db.ledgerEntries
    .where({ pourId: pour.id })
    .filter((entry) => entry.kind === 'pour-use' && entry.deletedAt === null);
  for (const id of await uses.primaryKeys()) undo.push(...(await softDelete(db, 'ledgerEntries', id, now)));
  const plan = { ...pour.plan, request: pour.request } as PourPlan;
  const drawn = drawForPour(plan, await shelfOnDevice(db, workshopId, pour), undefined, needG);
  const at = new Date(pour.startAt).toISOString();
  const entries = drawn.uses.map(({ containerId, quantity, costMinor }) => {
    const more = { id: v7(), costMinor, pourId: pour.id, at };
    return ['ledgerEntries', ledgerEntry(containerId, 'pour-use', -quantity, more)] as const;
  });
  undo.push(...(await insertRecords(db, workshopId, now, entries)));
  if (JSON.stringify(drawn.shortfall) !== JSON.stringify(pour.shortfall)) {
    undo.push(...(await patchRecord(db, 'pours', pour.id, { shortfall: drawn.shortfall }, now)));
  }
  return undo;
}
