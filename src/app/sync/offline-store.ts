import { inject, Injectable } from '@angular/core';
import type {
  buildPatchSchema,
  containerPatchSchema,
  materialPatchSchema,
  photoPatchSchema,
  stepPatchSchema,
  stocktakeSchema,
  wasteSchema,
} from '@benchtide/shared';
import {
  costOfUseMinor,
  drawForPour,
  stockShortMessage,
  stocktakeAdjustment,
  type FieldError,
  type Mutation,
  type NewBuild,
  type NewContainer,
  type NewMaterial,
  type NewPour,
  type NewStep,
  type PourShortfall,
  type ShelfContainer,
} from '@benchtide/shared';
import { Subject } from 'rxjs';
import { v7 } from 'uuid';
import type * as z from 'zod';
import { BenchDb } from './bench-db';
import { remainingOnDevice } from './device-stock';
import { discardChange } from './discard-change';
import { insertRecords, ledgerEntry, patchRecord, softDelete, type NewFields } from './record-writes';
import type { RecordUndo, SyncedTableName } from './synced-records';
import { writeChecks } from './write-checks';

/** A new record as a form gives it: the id is made here unless the caller made it already. */
type Draft<T> = Omit<T, 'id'> & { id?: string };
type Input<T extends z.ZodType> = z.input<T>;

const MATERIAL_NOT_HERE =
  'The material of this pour is not on this device. Sync this workshop, then log the pour again; nothing was saved.';
const CONTAINER_NOT_HERE =
  'A container chosen for this pour is not on this device’s shelf for that material. Choose again; nothing was saved.';

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

  async createBuild(workshopId: string, draft: Draft<NewBuild>): Promise<string> {
    const data = (await writeChecks()).newBuildSchema.parse(withId(draft));
    return this.create(workshopId, { type: 'build.create', mutationId: v7(), data }, [['builds', data]]);
  }
  async patchBuild(workshopId: string, id: string, patch: Input<typeof buildPatchSchema>): Promise<void> {
    const data = (await writeChecks()).buildPatchSchema.parse(patch);
    return this.patch(workshopId, 'builds', { type: 'build.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteBuild(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'builds', { type: 'build.delete', mutationId: v7(), recordId: id });
  }

  async createStep(workshopId: string, draft: Draft<NewStep>): Promise<string> {
    const data = (await writeChecks()).newStepSchema.parse(withId(draft));
    return this.create(workshopId, { type: 'step.create', mutationId: v7(), data }, [['steps', data]]);
  }
  async patchStep(workshopId: string, id: string, patch: Input<typeof stepPatchSchema>): Promise<void> {
    const data = (await writeChecks()).stepPatchSchema.parse(patch);
    return this.patch(workshopId, 'steps', { type: 'step.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteStep(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'steps', { type: 'step.delete', mutationId: v7(), recordId: id });
  }

  async createMaterial(workshopId: string, draft: Draft<NewMaterial>): Promise<string> {
    const data = (await writeChecks()).newMaterialSchema.parse(withId(draft));
    return this.create(workshopId, { type: 'material.create', mutationId: v7(), data }, [['materials', data]]);
  }
  async patchMaterial(workshopId: string, id: string, patch: Input<typeof materialPatchSchema>): Promise<void> {
    const data = (await writeChecks()).materialPatchSchema.parse(patch);
    return this.patch(workshopId, 'materials', { type: 'material.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteMaterial(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'materials', { type: 'material.delete', mutationId: v7(), recordId: id });
  }

  /** A new container arrives full: its purchase entry shares its id, as on the server. */
  async createContainer(workshopId: string, draft: Draft<NewContainer>): Promise<string> {
    const data = (await writeChecks()).newContainerSchema.parse(withId(draft));
    const purchase = ledgerEntry(data.id, 'purchase', data.sizeQty, { at: `${data.boughtOn}T12:00:00Z` });
    const mutation: Mutation = { type: 'container.create', mutationId: v7(), data };
    return this.create(workshopId, mutation, [
      ['containers', data],
      ['ledgerEntries', purchase],
    ]);
  }
  async patchContainer(workshopId: string, id: string, patch: Input<typeof containerPatchSchema>): Promise<void> {
    const data = (await writeChecks()).containerPatchSchema.parse(patch);
    return this.patch(workshopId, 'containers', { type: 'container.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteContainer(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'containers', { type: 'container.delete', mutationId: v7(), recordId: id });
  }

  /** Shown at once, costed from this device's copy of the container; the server's entry replaces it on pull. */
  async recordWaste(workshopId: string, containerId: string, draft: Draft<Input<typeof wasteSchema>>): Promise<string> {
    const data = (await writeChecks()).wasteSchema.parse(withId(draft));
    const mutation: Mutation = { type: 'container.waste', mutationId: v7(), recordId: containerId, data };
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
    const data = (await writeChecks()).stocktakeSchema.parse(withId(draft));
    const mutation: Mutation = { type: 'container.stocktake', mutationId: v7(), recordId: containerId, data };
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
    const { newPourSchema, planPour } = await writeChecks();
    const data = newPourSchema.parse(withId(draft));
    const { id, buildId, materialId, startAt, note, containerIds } = data;
    const mutation: Mutation = { type: 'pour.create', mutationId: v7(), data };
    await this.apply(workshopId, mutation, async (now) => {
      const material = await this.db.materials.get(materialId);
      if (material?.workshopId !== workshopId || material.deletedAt !== null) throw new Error(MATERIAL_NOT_HERE);
      const planned = planPour({ ...data, material: material.dataSheet, startAtMs: Date.parse(startAt) });
      if (!planned.ok) throw new PourPlanError(planned.errors);
      const { uses, shortfall } = drawForPour(planned.plan, await this.shelfOf(workshopId, data), containerIds);
      if (shortfall.length > 0 && data.whenShort === 'refuse') {
        throw new StockShortError(stockShortMessage(planned.plan, shortfall), shortfall);
      }
      const { request, ...plan } = planned.plan;
      const pour = { id, buildId, stepId: data.stepId ?? null, materialId, startAt, request, plan, shortfall, note };
      const at = new Date(startAt).toISOString();
      const drawn = uses.map(({ containerId, quantity, costMinor }) => {
        const more = { id: v7(), costMinor, pourId: id, at };
        return ['ledgerEntries', ledgerEntry(containerId, 'pour-use', -quantity, more)] as const;
      });
      return insertRecords(this.db, workshopId, now, [['pours', pour], ...drawn]);
    });
    return id;
  }
  async deletePour(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'pours', { type: 'pour.delete', mutationId: v7(), recordId: id });
  }

  /** For a photo the server holds; one whose upload still waits is changed with its upload instead. */
  async patchPhoto(workshopId: string, id: string, patch: Input<typeof photoPatchSchema>): Promise<void> {
    const data = (await writeChecks()).photoPatchSchema.parse(patch);
    return this.patch(workshopId, 'photos', { type: 'photo.patch', mutationId: v7(), recordId: id, data });
  }
  async deletePhoto(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'photos', { type: 'photo.delete', mutationId: v7(), recordId: id });
  }

  /** Throws a rejected change away and puts back what it changed on this device, where nothing newer did. */
  discard(seq: number): Promise<void> {
    return discardChange(this.db, seq);
  }

  /** The material's live containers on this device, each with what its stock book here says is left. */
  private async shelfOf(
    workshopId: string,
    pour: { materialId: string; containerIds?: readonly string[] },
  ): Promise<ShelfContainer[]> {
    const containers = await this.db.containers
      .where({ materialId: pour.materialId })
      .filter((container) => container.workshopId === workshopId && container.deletedAt === null)
      .toArray();
    if (pour.containerIds?.some((id) => !containers.some((container) => container.id === id))) {
      throw new Error(CONTAINER_NOT_HERE);
    }
    const sums = await remainingOnDevice(
      this.db,
      containers.map((container) => container.id),
    );
    return containers.map((container) => ({ ...container, remainingQty: sums[container.id] ?? 0 }));
  }

  private async create(
    workshopId: string,
    mutation: Mutation,
    records: readonly (readonly [SyncedTableName, NewFields])[],
  ): Promise<string> {
    await this.apply(workshopId, mutation, (now) => insertRecords(this.db, workshopId, now, records));
    return records[0]?.[1].id ?? '';
  }

  private patch(workshopId: string, table: SyncedTableName, mutation: Mutation & { recordId: string }) {
    const data = 'data' in mutation ? mutation.data : {};
    return this.apply(workshopId, mutation, (now) => patchRecord(this.db, table, mutation.recordId, data, now));
  }

  private remove(workshopId: string, table: SyncedTableName, mutation: Mutation & { recordId: string }) {
    return this.apply(workshopId, mutation, (now) => softDelete(this.db, table, mutation.recordId, now));
  }
}

function withId<T>(draft: Draft<T>): Draft<T> & { id: string } {
  return { ...draft, id: draft.id ?? v7() };
}
