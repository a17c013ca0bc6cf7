import { and, eq, isNull, sql } from 'drizzle-orm';
import type { ServerContext } from '../context.js';
import { builds, costTotals, materials } from '../db/schema/index.js';
import { authorize } from '../workshops/workshop-service.js';
import { summariseCosts, type CostReport } from '../../shared/cost-summary.js';

export type { CostLine, CostReport } from '../../shared/cost-summary.js';

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

  // Waste (no build) and uses of builds since deleted count for materials and months, not for a build.
  return summariseCosts(
    rows.map((row) => ({ ...row, buildId: row.buildId === NO_BUILD || row.buildName === null ? null : row.buildId })),
  );
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
