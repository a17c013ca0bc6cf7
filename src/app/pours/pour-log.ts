import { inject, Injectable, type Injector, type Signal } from '@angular/core';
import { type NewPour, type ShelfContainer } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { BenchDb } from '../sync/bench-db';
import { remainingOnDevice } from '../sync/device-stock';
import { liveSignalOf } from '../sync/live-signal';
import { OfflineStore } from '../sync/offline-store';
import type { LocalBuild, LocalContainer, LocalPour, PourMaterial } from '../sync/synced-records';

/** A container of the chosen material, with what is left in it by this device's stock book. */
export type ContainerWithStock = ShelfContainer & Pick<LocalContainer, 'lot' | 'currency' | 'useBy'>;

/**
 * What the pour screen needs from this device's records (the workshop's builds and materials, the last
 * pour to repeat, a material's containers with their stock) and the one write it makes.
 */
@Injectable({ providedIn: 'root' })
export class PourLog {
  private readonly db = inject(BenchDb);
  private readonly store = inject(OfflineStore);
  private readonly session = inject(AccountSession);

  readonly workshop = this.session.currentWorkshop;

  builds(injector?: Injector): Signal<LocalBuild[]> {
    return this.workshopQuery(
      async (workshopId) =>
        (await this.live(this.db.builds.where('workshopId').equals(workshopId))).sort((a, b) =>
          b.updatedAt.localeCompare(a.updatedAt),
        ),
      injector,
    );
  }

  /** The workshop's pour materials: those with a data sheet to plan from; foam, paint and figures are not poured. */
  materials(injector?: Injector): Signal<PourMaterial[]> {
    return this.workshopQuery(
      async (workshopId) =>
        (await this.live(this.db.materials.where('workshopId').equals(workshopId)))
          .filter(
            (material): material is PourMaterial => material.dataSheet !== null && material.dataSheet !== undefined,
          )
          .sort((a, b) => a.name.localeCompare(b.name)),
      injector,
    );
  }

  /** The latest pour of the workshop, by its start: the one "repeat" copies. */
  lastPour(injector?: Injector): Signal<LocalPour | null> {
    return liveSignalOf(
      this.session.currentWorkshopId,
      async (workshopId) => {
        if (workshopId === null) return null;
        const pours = await this.live(this.db.pours.where('workshopId').equals(workshopId));
        return pours.reduce<LocalPour | null>(
          (last, pour) => (last && last.startAt >= pour.startAt ? last : pour),
          null,
        );
      },
      null,
      injector,
    );
  }

  /** The material's containers, oldest first, each with its remaining stock. */
  stockOf(materialId: Signal<string | null>, injector?: Injector): Signal<ContainerWithStock[]> {
    return liveSignalOf(
      materialId,
      async (id) => {
        if (id === null) return [];
        const containers = await this.live(this.db.containers.where('materialId').equals(id));
        const remaining = await remainingOnDevice(
          this.db,
          containers.map((container) => container.id),
        );
        return containers
          .map((container) => ({
            id: container.id,
            part: container.part,
            unit: container.unit,
            boughtOn: container.boughtOn,
            sizeQty: container.sizeQty,
            priceMinor: container.priceMinor,
            currency: container.currency,
            lot: container.lot,
            useBy: container.useBy,
            remainingQty: remaining[container.id] ?? 0,
          }))
          .sort((a, b) => a.boughtOn.localeCompare(b.boughtOn));
      },
      [],
      injector,
    );
  }

  /** Logs the pour on this device (planned, stock drawn) and queues it for the server. */
  log(pour: Omit<NewPour, 'id'>): Promise<string> {
    const workshopId = this.session.currentWorkshopId();
    if (workshopId === null) return Promise.reject(new Error('Choose a workshop before logging a pour.'));
    return this.store.logPour(workshopId, pour);
  }

  private workshopQuery<T>(query: (workshopId: string) => Promise<T[]>, injector?: Injector): Signal<T[]> {
    return liveSignalOf(
      this.session.currentWorkshopId,
      (workshopId) => (workshopId === null ? [] : query(workshopId)),
      [] as T[],
      injector,
    );
  }

  private live<T extends { deletedAt: string | null }>(collection: {
    filter(fn: (row: T) => boolean): { toArray(): Promise<T[]> };
  }) {
    return collection.filter((row) => row.deletedAt === null).toArray();
  }
}
