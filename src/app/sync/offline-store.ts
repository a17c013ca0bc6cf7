import { inject, Injectable } from '@angular/core';
import type { stocktakeSchema, wasteSchema } from '@benchtide/shared';
import {
  changeType,
  costOfUseMinor,
  DEVICE_TABLE_OF,
  drawForPour,
  firstLayer,
  layerCountProblem,
  layerProblem,
  pouredLayerOf,
  stockShortMessage,
  stocktakeAdjustment,
  type ChangeData,
  type FieldError,
  type KindWith,
  type Mutation,
  type NewContainer,
  type NewPour,
  type PourLayerPatch,
  type PourPlan,
  type PourShortfall,
} from '@benchtide/shared';
import { Subject } from 'rxjs';
import { v7 } from 'uuid';
import type * as z from 'zod';
import { BenchDb } from './bench-db';
import { remainingOnDevice, shelfOnDevice } from './device-stock';
import { discardChange } from './discard-change';
import { followLocalPour, layersOfPours } from './followed-pour';
import {
  correctionProblem,
  LayerRefusedError,
  layerOnDevice,
  localMoment,
  pourOnDevice,
  redrawPour,
  refuseHalfWeighed,
  refuseZeroWeighed,
} from './pour-layer-writes';
import { insertRecords, ledgerEntry, patchRecord, softDelete, type NewFields } from './record-writes';
import type { LocalPourLayer, RecordUndo, SyncedTableName } from './synced-records';
import { writeChecks } from './write-checks';

/** A new record as a form gives it: the id is made here unless the caller made it already. */
type Draft<T> = Omit<T, 'id'> & { id?: string };
type Input<T extends z.ZodType> = z.input<T>;

const MATERIAL_NOT_HERE =
  'The material of this pour is not on this device. Sync this workshop, then log the pour again; nothing was saved.';

export { LayerRefusedError } from './pour-layer-writes';

/** The shelf holds less than a pour needs and the modeller asked to refuse it: nothing was saved. */
export class StockShortError extends Error {
  constructor(
    message: string,
    readonly shortfall: readonly PourShortfall[],
  ) {
    super(message);
    this.name = 'StockShortError';
  }
}

/** The pour cannot be planned with the material's data sheet: nothing was saved. */
export class PourPlanError extends Error {
  /** Each message by its path in the plan request ("material.densityBGPerMl"). */
  readonly fields: Readonly<Record<string, string>>;

  constructor(errors: readonly FieldError[]) {
    super(`This pour cannot be planned: ${errors.map((error) => error.message).join('; ')}. Nothing was saved.`);
    this.name = 'PourPlanError';
    this.fields = Object.fromEntries(errors.map((error) => [error.path, error.message]));
  }
}

/**
 * Every change the bench makes: written to this device's records and queued for the server in one
 * transaction, so a change is never stored without being queued nor queued without being stored.
 * Input is checked with the shared schemas first, so a bad value throws before anything is written.
 * A caller that runs one of these writes inside a transaction of its own awaits `ready()` before opening it.
 */
@Injectable({ providedIn: 'root' })
export class OfflineStore {
  private readonly db = inject(BenchDb);
  private readonly queued = new Subject<string>();

  /** The workshop of each change just queued, for the sync engine to push. */
  readonly changes = this.queued.asObservable();

  /** Loads what the writes are checked with, for a caller about to open a transaction around one. */
  ready(): Promise<unknown> {
    return writeChecks();
  }

  /** Runs `change` on the local records and queues `mutation`, atomically; `change` says how to undo itself. */
  async apply(workshopId: string, mutation: Mutation, change: (now: string) => Promise<RecordUndo[]>): Promise<void> {
    const { db } = this;
    const now = new Date().toISOString();
    await db.transaction('rw', [...db.syncedTables, db.outbox], async () => {
      const undo = await change(now);
      const row = { mutationId: mutation.mutationId, workshopId, mutation, queuedAt: now, attempts: 0, undo };
      await db.outbox.add({ ...row, state: 'waiting' });
    });
    this.queued.next(workshopId);
  }

  /**
   * A new record of a kind the device creates as it is (a pour is logged with `logPour`). A new container
   * arrives full: its purchase entry shares its id, as on the server.
   */
  async create<K extends Exclude<KindWith<'create'>, 'pour'>>(
    kind: K,
    workshopId: string,
    draft: Draft<ChangeData<K, 'create'>>,
  ): Promise<string> {
    const data = (await writeChecks()).checkChangeData(kind, 'create', withId(draft));
    const mutation = { type: changeType(kind, 'create'), mutationId: v7(), data } as Mutation;
    const records: (readonly [SyncedTableName, NewFields])[] = [[DEVICE_TABLE_OF[kind], data as NewFields]];
    if (kind === 'container') records.push(purchaseOf(data as NewContainer & { id: string }));
    await this.apply(workshopId, mutation, (now) => insertRecords(this.db, workshopId, now, records));
    return (data as NewFields).id;
  }

  /** Changes the fields given, last write wins per field. */
  async patch<K extends KindWith<'patch'>>(
    kind: K,
    workshopId: string,
    id: string,
    patch: ChangeData<K, 'patch'>,
  ): Promise<void> {
    const data = (await writeChecks()).checkChangeData(kind, 'patch', patch);
    const mutation = { type: changeType(kind, 'patch'), mutationId: v7(), recordId: id, data } as Mutation;
    const table = DEVICE_TABLE_OF[kind];
    return this.apply(workshopId, mutation, (now) => patchRecord(this.db, table, id, data as object, now));
  }

  /** A soft delete until the server's tombstone arrives; a pour takes the stock it drew with it. */
  async remove(kind: KindWith<'delete'>, workshopId: string, id: string): Promise<void> {
    const mutation = { type: changeType(kind, 'delete'), mutationId: v7(), recordId: id } as Mutation;
    const table = DEVICE_TABLE_OF[kind];
    return this.apply(workshopId, mutation, (now) => softDelete(this.db, table, id, now));
  }

  /** Shown at once, costed from this device's copy of the container; the server's entry replaces it on pull. */
  async recordWaste(workshopId: string, containerId: string, draft: Draft<Input<typeof wasteSchema>>): Promise<string> {
    const data = (await writeChecks()).checkChangeData('container', 'waste', withId(draft));
    const mutation = { type: changeType('container', 'waste'), mutationId: v7(), recordId: containerId, data } as const;
    await this.apply(workshopId, mutation, async (now) => {
      const container = await this.db.containers.get(containerId);
      const costMinor = container ? costOfUseMinor(data.quantity, container) : 0;
      const more = { id: data.id, costMinor, note: data.note, at: now };
      return insertRecords(this.db, workshopId, now, [
        ['ledgerEntries', ledgerEntry(containerId, 'waste', -data.quantity, more)],
      ]);
    });
    return data.id;
  }

  /** Recorded as the difference from this device's sum; the server works it out again from its own. */
  async recordStocktake(
    workshopId: string,
    containerId: string,
    draft: Draft<Input<typeof stocktakeSchema>>,
  ): Promise<string> {
    const data = (await writeChecks()).checkChangeData('container', 'stocktake', withId(draft));
    const mutation = {
      type: changeType('container', 'stocktake'),
      mutationId: v7(),
      recordId: containerId,
      data,
    } as const;
    await this.apply(workshopId, mutation, async (now) => {
      const sums = await remainingOnDevice(this.db, [containerId]);
      const quantity = stocktakeAdjustment(data.countedQty, sums[containerId] ?? 0);
      return insertRecords(this.db, workshopId, now, [
        ['ledgerEntries', ledgerEntry(containerId, 'stocktake', quantity, { id: data.id, at: now })],
      ]);
    });
    return data.id;
  }

  /**
   * Planned and drawn from this device's shelf at once, with the shared maths the server uses, so the stock
   * and the costs show before the next sync. The server plans and draws again when the change arrives: its
   * pour and stock uses replace these on pull. Throws, saving nothing, when the material is not on this
   * device, the pour cannot be planned, or the shelf is short and `whenShort` is refuse.
   */
  async logPour(workshopId: string, draft: Draft<NewPour>): Promise<string> {
    const { checkChangeData, planPour } = await writeChecks();
    const data = checkChangeData('pour', 'create', withId(draft));
    const { id, buildId, materialId, startAt, note, containerIds } = data;
    const mutation = { type: changeType('pour', 'create'), mutationId: v7(), data } as const;
    await this.apply(workshopId, mutation, async (now) => {
      const material = await this.db.materials.get(materialId);
      if (material?.workshopId !== workshopId || material.deletedAt !== null) throw new Error(MATERIAL_NOT_HERE);
      const planned = planPour({ ...data, material: material.dataSheet, startAtMs: Date.parse(startAt) });
      if (!planned.ok) throw new PourPlanError(planned.errors);
      const shelf = await shelfOnDevice(this.db, workshopId, data);
      const { uses, shortfall } = drawForPour(planned.plan, shelf, containerIds);
      if (shortfall.length > 0 && data.whenShort === 'refuse') {
        throw new StockShortError(stockShortMessage(planned.plan, shortfall), shortfall);
      }
      const { request, ...plan } = planned.plan;
      const layerCount = data.layerCount ?? plan.layers.count;
      const pour = { id, buildId, stepId: data.stepId ?? null, materialId, startAt, request, plan, shortfall, note };
      const at = new Date(startAt).toISOString();
      const layer = { id, pourId: id, ...firstLayer(plan, at, data.roomTempC) };
      const drawn = uses.map(({ containerId, quantity, costMinor }) => {
        const more = { id: v7(), costMinor, pourId: id, at };
        return ['ledgerEntries', ledgerEntry(containerId, 'pour-use', -quantity, more)] as const;
      });
      return insertRecords(this.db, workshopId, now, [
        ['pours', { ...pour, layerCount }],
        ['pourLayers', layer],
        ...drawn,
      ]);
    });
    return id;
  }

  /**
   * The next layer of a pour, recorded as poured: checked against the layers on this device (the next one,
   * not before the layer below, not over an hour ahead), with the plan for it as it stands, and the pour's
   * stock drawn again for what it now needs. Throws LayerRefusedError, saving nothing, when refused.
   */
  async recordLayer(
    workshopId: string,
    draft: {
      id?: string;
      pourId: string;
      number: number;
      pouredAt: string;
      roomTempC: number;
      weighedAG?: number;
      weighedBG?: number;
      note?: string;
    },
  ): Promise<string> {
    const { checkChangeData } = await writeChecks();
    refuseZeroWeighed(draft);
    const data = checkChangeData('pourLayer', 'create', withId(draft));
    const mutation = { type: changeType('pourLayer', 'create'), mutationId: v7(), data } as const;
    await this.apply(workshopId, mutation, async (now) => {
      const pour = await pourOnDevice(this.db, workshopId, data.pourId);
      const layers = await this.layersOf(pour.id);
      const nowMs = Date.now();
      const followed = followLocalPour(pour, layers, nowMs);
      const candidate = { number: data.number, pouredAtMs: Date.parse(data.pouredAt) };
      const problem = layerProblem(followed, candidate, nowMs, (ms) => localMoment(ms, nowMs));
      if (problem) throw new LayerRefusedError(problem.field, problem.message);
      const weighed = { weighedAG: data.weighedAG ?? null, weighedBG: data.weighedBG ?? null };
      refuseHalfWeighed(pour, weighed);
      const { depthMm, partAG, partBG } = followed.next!.planned;
      const { id, pourId, number, pouredAt, roomTempC, note } = data;
      const layer = { id, pourId, number, pouredAt, roomTempC, depthMm, partAG, partBG, ...weighed, note };
      const undo = await insertRecords(this.db, workshopId, now, [['pourLayers', layer]]);
      const { needG } = followLocalPour(pour, [...layers, layer as LocalPourLayer]);
      return [...undo, ...(await redrawPour(this.db, workshopId, pour, needG, now))];
    });
    return data.id;
  }

  /** A poured layer's time, room or weighed amounts corrected, kept in order with the layers around it. */
  async correctLayer(workshopId: string, layerId: string, patch: PourLayerPatch): Promise<void> {
    const { checkChangeData } = await writeChecks();
    refuseZeroWeighed(patch);
    const data = checkChangeData('pourLayer', 'patch', patch);
    const mutation = { type: changeType('pourLayer', 'patch'), mutationId: v7(), recordId: layerId, data } as const;
    await this.apply(workshopId, mutation, async (now) => {
      const layer = await layerOnDevice(this.db, workshopId, layerId);
      const pour = await pourOnDevice(this.db, workshopId, layer.pourId);
      const layers = await this.layersOf(pour.id);
      const problem = correctionProblem(layers, layer, data, Date.now());
      if (problem) throw new LayerRefusedError('pouredAt', problem);
      const corrected = { ...layer, ...data };
      refuseHalfWeighed(pour, { weighedAG: corrected.weighedAG ?? null, weighedBG: corrected.weighedBG ?? null });
      const undo = await patchRecord(this.db, 'pourLayers', layerId, data, now);
      if (data.weighedAG === undefined && data.weighedBG === undefined) return undo;
      const { needG } = followLocalPour(
        pour,
        layers.map((other) => (other.id === layerId ? corrected : other)),
      );
      return [...undo, ...(await redrawPour(this.db, workshopId, pour, needG, now))];
    });
  }

  /** Takes back a layer recorded by mistake: only the top one, never layer 1 (delete the pour for that). */
  async takeBackLayer(workshopId: string, layerId: string): Promise<void> {
    const mutation = { type: changeType('pourLayer', 'delete'), mutationId: v7(), recordId: layerId } as const;
    await this.apply(workshopId, mutation, async (now) => {
      const layer = await layerOnDevice(this.db, workshopId, layerId);
      if (layer.number === 1) {
        throw new LayerRefusedError('number', 'Layer 1 goes with its pour: delete the pour to take it back.');
      }
      const pour = await pourOnDevice(this.db, workshopId, layer.pourId);
      const layers = await this.layersOf(pour.id);
      const top = layers.at(-1)!;
      if (top.id !== layerId) {
        throw new LayerRefusedError(
          'number',
          `Only the top layer can be taken back: take back layer ${top.number} first.`,
        );
      }
      const undo = await softDelete(this.db, 'pourLayers', layerId, now);
      const { needG } = followLocalPour(pour, layers.slice(0, -1));
      return [...undo, ...(await redrawPour(this.db, workshopId, pour, needG, now))];
    });
  }

  /** The number of layers now planned (add, skip, re-split the depth left), with the stock drawn again. */
  async replanPour(workshopId: string, pourId: string, layerCount: number): Promise<void> {
    const refuseCount = async (): Promise<void> => {
      const pour = await pourOnDevice(this.db, workshopId, pourId);
      const poured = (await this.layersOf(pourId)).map(pouredLayerOf);
      const problem = layerCountProblem({ ...pour.plan, request: pour.request } as PourPlan, layerCount, poured);
      if (problem) throw new LayerRefusedError('layerCount', problem);
    };
    await refuseCount();
    const data = (await writeChecks()).checkChangeData('pour', 'patch', { layerCount });
    const mutation = { type: changeType('pour', 'patch'), mutationId: v7(), recordId: pourId, data } as const;
    await this.apply(workshopId, mutation, async (now) => {
      await refuseCount();
      const pour = await pourOnDevice(this.db, workshopId, pourId);
      const undo = await patchRecord(this.db, 'pours', pourId, { layerCount }, now);
      const { needG } = followLocalPour({ ...pour, layerCount }, await this.layersOf(pourId));
      return [...undo, ...(await redrawPour(this.db, workshopId, { ...pour, layerCount }, needG, now))];
    });
  }

  /** Throws a rejected change away and puts back what it changed on this device, where nothing newer did. */
  discard(seq: number): Promise<void> {
    return discardChange(this.db, seq);
  }

  private async layersOf(pourId: string): Promise<LocalPourLayer[]> {
    return (await layersOfPours(this.db, [pourId])).get(pourId) ?? [];
  }
}

/** A new container's purchase: the first entry in its stock book, under the container's own id. */
function purchaseOf(data: NewContainer & { id: string }): readonly [SyncedTableName, NewFields] {
  return ['ledgerEntries', ledgerEntry(data.id, 'purchase', data.sizeQty, { at: `${data.boughtOn}T12:00:00Z` })];
}

function withId<T>(draft: Draft<T>): Draft<T> & { id: string } {
  return { ...draft, id: draft.id ?? v7() };
}
