import { inject, Injectable } from '@angular/core';
import {
  followedMilestones,
  shelfWarnings,
  type FollowedPour,
  type MixAmounts,
  type PourMilestone,
  type PourPlan,
  type ShelfWarning,
  type StockUnit,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { AccountSession } from '../core/account-session';
import { BenchDb } from '../sync/bench-db';
import { remainingOnDevice } from '../sync/device-stock';
import { followLocalPour, layersOfPours } from '../sync/followed-pour';
import { liveSignalOf } from '../sync/live-signal';
import type { LocalPour, LocalPourLayer } from '../sync/synced-records';

/** A pour on the bench whose cure is still running (or finished within the last hours). */
export interface PourOnBench {
  readonly id: string;
  readonly buildId: string;
  readonly buildName: string;
  readonly materialName: string;
  readonly note: string;
  readonly startMs: number;
  readonly layerCount: number;
  /** As it stood when the records were read: layers to come are re-projected from the bench's clock by `followAt`. */
  readonly followed: FollowedPour;
  readonly milestones: readonly PourMilestone[];
  readonly mix: MixAmounts;
  readonly plan: PourPlan;
  /** What the pour is followed from: its record and the layers recorded so far. */
  readonly record: Pick<LocalPour, 'request' | 'plan' | 'layerCount'>;
  readonly layers: readonly LocalPourLayer[];
}

/** The pour as really poured, layers still to come projected no earlier than `nowMs`. */
export function followAt(pour: Pick<PourOnBench, 'record' | 'layers'>, nowMs: number): FollowedPour {
  return followLocalPour(pour.record, pour.layers, nowMs);
}

export interface ShelfNotice extends ShelfWarning {
  readonly materialName: string;
  readonly unit: StockUnit;
}

/** A fully cured pour stays on the bench this long, so the modeller sees it done. */
const KEEP_AFTER_CURE_MS = 12 * 3_600_000;

/** What the bench shows for the current workshop: the pours curing now and the shelf's warnings. */
@Injectable({ providedIn: 'root' })
export class BenchToday {
  private readonly db = inject(BenchDb);
  private readonly session = inject(AccountSession);

  readonly pours = liveSignalOf(
    this.session.currentWorkshopId,
    (workshopId) => (workshopId === null ? [] : this.runningPours(workshopId)),
    [] as PourOnBench[],
  );
  readonly shelf = liveSignalOf(
    this.session.currentWorkshopId,
    (workshopId) => (workshopId === null ? [] : this.shelfNotices(workshopId)),
    [] as ShelfNotice[],
  );

  private async runningPours(workshopId: string): Promise<PourOnBench[]> {
    const nowMs = Date.now();
    const live = await this.db.pours
      .where('workshopId')
      .equals(workshopId)
      .filter((pour) => pour.deletedAt === null && pour.plan !== null)
      .toArray();
    const layers = await layersOfPours(
      this.db,
      live.map((pour) => pour.id),
    );
    const followed = new Map(live.map((pour) => [pour.id, followLocalPour(pour, layers.get(pour.id) ?? [], nowMs)]));
    const pours = live.filter((pour) => followed.get(pour.id)!.fullCureAtMs > nowMs - KEEP_AFTER_CURE_MS);
    const builds = await this.names(
      this.db.builds,
      pours.map((pour) => pour.buildId),
    );
    const materials = await this.names(
      this.db.materials,
      pours.map((pour) => pour.materialId),
    );
    return pours
      .map((pour) => {
        const now = followed.get(pour.id)!;
        return {
          id: pour.id,
          buildId: pour.buildId,
          buildName: builds.get(pour.buildId) ?? 'A build not on this device',
          materialName: materials.get(pour.materialId) ?? 'a material not on this device',
          note: pour.note,
          startMs: Date.parse(pour.startAt),
          layerCount: now.layerCount,
          followed: now,
          milestones: followedMilestones(now),
          mix: pour.plan.mix,
          plan: { ...pour.plan, request: pour.request } as PourPlan,
          record: pour,
          layers: layers.get(pour.id) ?? [],
        };
      })
      .sort((a, b) => a.startMs - b.startMs);
  }

  private async shelfNotices(workshopId: string): Promise<ShelfNotice[]> {
    const containers = await this.db.containers
      .where('workshopId')
      .equals(workshopId)
      .filter((container) => container.deletedAt === null)
      .toArray();
    const materials = new Map(
      (await this.db.materials.where('workshopId').equals(workshopId).toArray()).map((material) => [
        material.id,
        material,
      ]),
    );
    const remaining = await remainingOnDevice(
      this.db,
      containers.map((container) => container.id),
    );
    const units = new Map(containers.map((container) => [container.id, container.unit]));
    return shelfWarnings(
      containers,
      remaining,
      format(new Date(), 'yyyy-MM-dd'),
      (id) => materials.get(id)?.shelfLifeOpenedDays,
    ).map((warning) => ({
      ...warning,
      materialName: materials.get(warning.materialId)?.name ?? 'A material',
      unit: units.get(warning.containerId) ?? 'g',
    }));
  }

  private async names(
    table: { bulkGet(ids: string[]): Promise<({ id: string; name: string } | undefined)[]> },
    ids: readonly string[],
  ): Promise<Map<string, string>> {
    const found = await table.bulkGet([...new Set(ids)]);
    return new Map(found.filter((row) => row !== undefined).map((row) => [row.id, row.name]));
  }
}
