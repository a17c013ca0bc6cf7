import { computed, inject, Injectable, type Injector, type Signal } from '@angular/core';
import {
  may,
  type containerPatchSchema,
  type materialPatchSchema,
  type NewContainer,
  type NewMaterial,
} from '@benchtide/shared';
import type * as z from 'zod';
import { AccountSession } from '../core/account-session';
import { BenchDb } from '../sync/bench-db';
import { remainingOnDevice } from '../sync/device-stock';
import { liveSignalOf } from '../sync/live-signal';
import { OfflineStore } from '../sync/offline-store';
import type { MaterialStock } from './container-row';

const NO_WORKSHOP = 'Choose a workshop before changing the shelf. Nothing was saved.';
/** The currency a first container starts from, until the shelf holds one. */
export const FIRST_CURRENCY = 'EUR';

/**
 * The workshop's shelf as this device's records hold it (materials, their containers and what each has
 * left by the stock book), and the writes the Shelf makes, each saved here and queued for the server.
 */
@Injectable({ providedIn: 'root' })
export class ShelfStock {
  private readonly db = inject(BenchDb);
  private readonly store = inject(OfflineStore);
  private readonly session = inject(AccountSession);

  readonly workshop = this.session.currentWorkshop;
  readonly signedIn = this.session.signedIn;
  /** Viewers follow the shelf; owners and builders change it. */
  readonly canWrite = computed(() => may(this.workshop()?.role, 'write-builds'));

  /** Materials by name, each with its live containers oldest first; null while the records are being read. */
  shelf(injector?: Injector): Signal<MaterialStock[] | null> {
    return liveSignalOf<string | null, MaterialStock[] | null>(
      this.session.currentWorkshopId,
      async (workshopId) => {
        if (workshopId === null) return [];
        const materials = await this.db.materials
          .where('workshopId')
          .equals(workshopId)
          .filter((material) => material.deletedAt === null)
          .toArray();
        const containers = await this.db.containers
          .where('workshopId')
          .equals(workshopId)
          .filter((container) => container.deletedAt === null)
          .toArray();
        const remaining = await remainingOnDevice(
          this.db,
          containers.map((container) => container.id),
        );
        return materials
          .sort((a, b) => a.name.localeCompare(b.name))
          .map((material) => ({
            material,
            containers: containers
              .filter((container) => container.materialId === material.id)
              .sort(
                (a, b) =>
                  a.boughtOn.localeCompare(b.boughtOn) ||
                  a.createdAt.localeCompare(b.createdAt) ||
                  a.id.localeCompare(b.id),
              )
              .map((container) => ({ container, remainingQty: remaining[container.id] ?? 0 })),
          }));
      },
      null,
      injector,
    );
  }

  addMaterial(material: Omit<NewMaterial, 'id'>): Promise<string> {
    return this.write((workshopId) => this.store.create('material', workshopId, material));
  }

  editMaterial(id: string, patch: z.input<typeof materialPatchSchema>): Promise<void> {
    return this.write((workshopId) => this.store.patch('material', workshopId, id, patch));
  }

  /** Takes the material off the shelf with the containers still on it; logged pours keep their records. */
  deleteMaterial(id: string): Promise<void> {
    return this.write(async (workshopId) => {
      const containers = await this.db.containers
        .where('materialId')
        .equals(id)
        .filter((container) => container.deletedAt === null)
        .primaryKeys();
      for (const containerId of containers) await this.store.remove('container', workshopId, containerId);
      await this.store.remove('material', workshopId, id);
    });
  }

  /** A new container, full: its purchase goes into the stock book with it. */
  addContainer(container: Omit<NewContainer, 'id'>): Promise<string> {
    return this.write((workshopId) => this.store.create('container', workshopId, container));
  }

  editContainer(id: string, patch: z.input<typeof containerPatchSchema>): Promise<void> {
    return this.write((workshopId) => this.store.patch('container', workshopId, id, patch));
  }

  deleteContainer(id: string): Promise<void> {
    return this.write((workshopId) => this.store.remove('container', workshopId, id));
  }

  /** Spilled, skinned over or gone off: `quantity` (in the container's unit) comes off its stock. */
  recordWaste(containerId: string, quantity: number, note: string): Promise<string> {
    return this.write((workshopId) => this.store.recordWaste(workshopId, containerId, { quantity, note }));
  }

  /** What is really left: the stock book records the difference from what it expected. */
  recordStocktake(containerId: string, countedQty: number): Promise<string> {
    return this.write((workshopId) => this.store.recordStocktake(workshopId, containerId, { countedQty }));
  }

  private write<T>(change: (workshopId: string) => Promise<T>): Promise<T> {
    const workshopId = this.session.currentWorkshopId();
    return workshopId === null ? Promise.reject(new Error(NO_WORKSHOP)) : change(workshopId);
  }
}
