import { and, eq, isNull, sql } from 'drizzle-orm';
import type { ServerContext } from '../context.js';
import { builds, costTotals, materials } from '../db/schema/index.js';
import { authorize } from '../workshops/workshop-service.js';

/** One line of the cost report: money in integer minor units of one currency. */
export interface CostLine {
  key: string;
  label: string;
  currency: string;
  costMinor: number;
}

export interface CostReport {
  /** What the builds used, per build. */
  byBuild: CostLine[];
  /** What was used and wasted, per material. */
  byMaterial: CostLine[];
  /** What was used and wasted, per calendar month (YYYY-MM). */
  byMonth: CostLine[];
  /** Everything used and wasted, per currency. */
  total: CostLine[];
}

const NO_BUILD = '00000000-0000-0000-0000-000000000000';

/**
 * Sums of the cost fixed on each ledger entry when it was written, read from the running totals
 * the database keeps per build, material and month; currencies are never added together.
 */
export async function costReport(ctx: ServerContext, userId: string, workshopId: string): Promise<CostReport> {
  await authorize(ctx.db, userId, workshopId, 'view');
  const rows = await ctx.db
    .select({
      buildId: costTotals.buildId,
      buildName: builds.name,
      materialId: costTotals.materialId,
      materialName: materials.name,
      month: sql<string>`to_char(${costTotals.month}, 'YYYY-MM')`,
      currency: costTotals.currency,
      costMinor: costTotals.costMinor,
    })
    .from(costTotals)
    .leftJoin(builds, and(eq(builds.id, costTotals.buildId), isNull(builds.deletedAt)))
    .innerJoin(materials, eq(materials.id, costTotals.materialId))
    .where(and(eq(costTotals.workshopId, workshopId), sql`${costTotals.costMinor} <> 0`));

  const group = (keyOf: (row: (typeof rows)[number]) => [string, string] | null): CostLine[] => {
    const lines = new Map<string, CostLine>();
    for (const row of rows) {
      const keyed = keyOf(row);
      if (!keyed) continue;
      const [key, label] = keyed;
      const line = lines.get(`${key}|${row.currency}`) ?? { key, label, currency: row.currency, costMinor: 0 };
      line.costMinor += row.costMinor;
      lines.set(`${key}|${row.currency}`, line);
    }
    return [...lines.values()].filter((line) => line.costMinor !== 0).sort((a, b) => a.label.localeCompare(b.label));
  };
  return {
    // Waste (no build) and uses of builds since deleted count for materials and months, not for a build.
    byBuild: group((row) => (row.buildId !== NO_BUILD && row.buildName !== null ? [row.buildId, row.buildName] : null)),
    byMaterial: group((row) => [row.materialId, row.materialName]),
    byMonth: group((row) => [row.month, row.month]),
    total: group((row) => [row.currency, row.currency]),
  };
}

/** Minor units as the currency writes them: 1234 EUR cents is "12.34", 500 JPY is "500". */
export function majorAmount(costMinor: number, currency: string): string {
  const digits =
    new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
  const sign = costMinor < 0 ? '-' : '';
  const abs = Math.abs(costMinor)
    .toString()
    .padStart(digits + 1, '0');
  return digits === 0 ? `${sign}${abs}` : `${sign}${abs.slice(0, -digits)}.${abs.slice(-digits)}`;
}
