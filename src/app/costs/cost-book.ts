import { inject, Injectable } from '@angular/core';
import {
  costRowProblem,
  ledgerEntryProblem,
  sumCostsMinor,
  summariseCosts,
  type CostReport,
  type CostRow,
} from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { BenchDb } from '../sync/bench-db';
import { liveSignalOf } from '../sync/live-signal';

const NO_COSTS: WorkshopCosts = {
  report: { byBuild: [], byMaterial: [], byMonth: [], total: [] },
  byMonthAndMaterial: [],
  unreadable: 0,
};

/** A month's spending on one material, for the chart. */
export interface MonthMaterialCost {
  readonly month: string;
  readonly materialId: string;
  readonly materialName: string;
  readonly currency: string;
  readonly costMinor: number;
}

export interface WorkshopCosts {
  readonly report: CostReport;
  readonly byMonthAndMaterial: MonthMaterialCost[];
  /** Stock-book entries on this device whose quantity or cost is not a number, or has the wrong sign: left out. */
  readonly unreadable: number;
}

/**
 * What the current workshop spent, worked out from this device's stock book: each use and each waste
 * carries the cost fixed when it was written, so the sums agree with the server's and work offline.
 */
@Injectable({ providedIn: 'root' })
export class CostBook {
  private readonly db = inject(BenchDb);
  private readonly session = inject(AccountSession);

  readonly costs = liveSignalOf(
    this.session.currentWorkshopId,
    (workshopId) => (workshopId === null ? NO_COSTS : this.costsOf(workshopId)),
    NO_COSTS,
  );

  private async costsOf(workshopId: string): Promise<WorkshopCosts> {
    const { rows, unreadable } = await this.rows(workshopId);
    const cells = new Map<string, MonthMaterialCost>();
    for (const row of rows) {
      const key = `${row.month}|${row.materialId}|${row.currency}`;
      const cell = cells.get(key) ?? { ...row, costMinor: 0 };
      cells.set(key, { ...cell, costMinor: sumCostsMinor([cell.costMinor, row.costMinor]) });
    }
    return {
      report: summariseCosts(rows),
      byMonthAndMaterial: [...cells.values()].filter((cell) => cell.costMinor !== 0),
      unreadable,
    };
  }

  private async rows(workshopId: string): Promise<{ rows: CostRow[]; unreadable: number }> {
    const { db } = this;
    const live = <T extends { deletedAt: string | null }>(row: T) => row.deletedAt === null;
    const entries = await db.ledgerEntries
      .where('workshopId')
      .equals(workshopId)
      .filter((entry) => live(entry) && (entry.kind === 'pour-use' || entry.kind === 'waste'))
      .toArray();
    const inWorkshop = { workshopId };
    const containers = mapById(await db.containers.where(inWorkshop).toArray());
    const materials = mapById(await db.materials.where(inWorkshop).toArray());
    const pours = mapById(await db.pours.where(inWorkshop).toArray());
    const builds = mapById(await db.builds.where(inWorkshop).toArray());
    const readable = entries.filter((entry) => ledgerEntryProblem(entry) === null && costRowProblem(entry) === null);
    const rows = readable.flatMap((entry) => {
      const container = containers.get(entry.containerId);
      if (container === undefined) return [];
      const pour = entry.pourId === null ? undefined : pours.get(entry.pourId);
      const build = pour === undefined ? undefined : builds.get(pour.buildId);
      const buildAlive = build !== undefined && build.deletedAt === null;
      return [
        {
          buildId: buildAlive ? build.id : null,
          buildName: buildAlive ? build.name : null,
          materialId: container.materialId,
          materialName: materials.get(container.materialId)?.name ?? 'A material not on this device',
          month: entry.at.slice(0, 7),
          currency: container.currency,
          costMinor: entry.costMinor,
        },
      ];
    });
    return { rows, unreadable: entries.length - readable.length };
  }
}

function mapById<T extends { id: string }>(rows: readonly T[]): Map<string, T> {
  return new Map(rows.map((row) => [row.id, row]));
}
