import { inject, Injectable } from '@angular/core';
import {
  buildPatchSchema,
  containerPatchSchema,
  costOfUseMinor,
  materialPatchSchema,
  newBuildSchema,
  newContainerSchema,
  newMaterialSchema,
  newPourSchema,
  newStepSchema,
  remainingByContainer,
  stepPatchSchema,
  stocktakeAdjustment,
  stocktakeSchema,
  wasteSchema,
  type Mutation,
  type NewBuild,
  type NewContainer,
  type NewMaterial,
  type NewPour,
  type NewStep,
} from '@benchtide/shared';
import { Subject } from 'rxjs';
import { v7 } from 'uuid';
import type { z } from 'zod';
import { BenchDb } from './bench-db';
import { discardChange } from './discard-change';
import { insertRecords, ledgerEntry, patchRecord, softDelete, type NewFields } from './record-writes';
import type { RecordUndo, SyncedTableName } from './synced-records';

/** A new record as a form gives it: the id is made here unless the caller made it already. */
type Draft<T> = Omit<T, 'id'> & { id?: string };
type Input<T extends z.ZodType> = z.input<T>;

/**
 * Every change the bench makes: written to this device's records and queued for the server in one
 * transaction, so a change is never stored without being queued nor queued without being stored.
 * Input is checked with the shared schemas first, so a bad value throws before anything is written.
 */
@Injectable({ providedIn: 'root' })
export class OfflineStore {
  private readonly db = inject(BenchDb);
  private readonly queued = new Subject<string>();

  /** The workshop of each change just queued, for the sync engine to push. */
  readonly changes = this.queued.asObservable();

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
    const data = newBuildSchema.parse(withId(draft));
    return this.create(workshopId, { type: 'build.create', mutationId: v7(), data }, [['builds', data]]);
  }
  async patchBuild(workshopId: string, id: string, patch: Input<typeof buildPatchSchema>): Promise<void> {
    const data = buildPatchSchema.parse(patch);
    return this.patch(workshopId, 'builds', { type: 'build.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteBuild(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'builds', { type: 'build.delete', mutationId: v7(), recordId: id });
  }

  async createStep(workshopId: string, draft: Draft<NewStep>): Promise<string> {
    const data = newStepSchema.parse(withId(draft));
    return this.create(workshopId, { type: 'step.create', mutationId: v7(), data }, [['steps', data]]);
  }
  async patchStep(workshopId: string, id: string, patch: Input<typeof stepPatchSchema>): Promise<void> {
    const data = stepPatchSchema.parse(patch);
    return this.patch(workshopId, 'steps', { type: 'step.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteStep(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'steps', { type: 'step.delete', mutationId: v7(), recordId: id });
  }

  async createMaterial(workshopId: string, draft: Draft<NewMaterial>): Promise<string> {
    const data = newMaterialSchema.parse(withId(draft));
    return this.create(workshopId, { type: 'material.create', mutationId: v7(), data }, [['materials', data]]);
  }
  async patchMaterial(workshopId: string, id: string, patch: Input<typeof materialPatchSchema>): Promise<void> {
    const data = materialPatchSchema.parse(patch);
    return this.patch(workshopId, 'materials', { type: 'material.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteMaterial(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'materials', { type: 'material.delete', mutationId: v7(), recordId: id });
  }

  /** A new container arrives full: its purchase entry shares its id, as on the server. */
  async createContainer(workshopId: string, draft: Draft<NewContainer>): Promise<string> {
    const data = newContainerSchema.parse(withId(draft));
    const purchase = ledgerEntry(data.id, 'purchase', data.sizeQty, { at: `${data.boughtOn}T12:00:00Z` });
    const mutation: Mutation = { type: 'container.create', mutationId: v7(), data };
    return this.create(workshopId, mutation, [
      ['containers', data],
      ['ledgerEntries', purchase],
    ]);
  }
  async patchContainer(workshopId: string, id: string, patch: Input<typeof containerPatchSchema>): Promise<void> {
    const data = containerPatchSchema.parse(patch);
    return this.patch(workshopId, 'containers', { type: 'container.patch', mutationId: v7(), recordId: id, data });
  }
  async deleteContainer(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'containers', { type: 'container.delete', mutationId: v7(), recordId: id });
  }

  /** Shown at once, costed from this device's copy of the container; the server's entry replaces it on pull. */
  async recordWaste(workshopId: string, containerId: string, draft: Draft<Input<typeof wasteSchema>>): Promise<string> {
    const data = wasteSchema.parse(withId(draft));
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
    const data = stocktakeSchema.parse(withId(draft));
    const mutation: Mutation = { type: 'container.stocktake', mutationId: v7(), recordId: containerId, data };
    await this.apply(workshopId, mutation, async (now) => {
      const entries = await this.db.ledgerEntries
        .where({ containerId })
        .filter((entry) => entry.deletedAt === null)
        .toArray();
      const sums = remainingByContainer(entries.map((entry) => ({ ...entry, atMs: Date.parse(entry.at) })));
      const quantity = stocktakeAdjustment(data.countedQty, sums[containerId] ?? 0);
      return insertRecords(this.db, workshopId, now, [
        ['ledgerEntries', ledgerEntry(containerId, 'stocktake', quantity, { id: data.id, at: now })],
      ]);
    });
    return data.id;
  }

  /** Only the pour is written here: the server plans it and draws the stock, and both arrive by pull. */
  async logPour(workshopId: string, draft: Draft<NewPour>): Promise<string> {
    const data = newPourSchema.parse(withId(draft));
    const { id, buildId, materialId, startAt, note } = data;
    const pour = { id, buildId, stepId: data.stepId ?? null, materialId, startAt, note };
    return this.create(workshopId, { type: 'pour.create', mutationId: v7(), data }, [
      ['pours', { ...pour, request: null, plan: null, shortfall: [], logged: data }],
    ]);
  }
  async deletePour(workshopId: string, id: string): Promise<void> {
    return this.remove(workshopId, 'pours', { type: 'pour.delete', mutationId: v7(), recordId: id });
  }

  /** Throws a rejected change away and puts back what it changed on this device, where nothing newer did. */
  discard(seq: number): Promise<void> {
    return discardChange(this.db, seq);
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
