import { and, eq, isNull, sql } from 'drizzle-orm';
import type { ServerContext } from '../context.js';
import { builds, containers, ledgerEntries, materials, pours } from '../db/schema/index.js';
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

/**
 * Sums of the cost fixed on each ledger entry when it was written; currencies are never added
 * together. Plain grouped sums over indexed columns, so the report stays quick with many pours.
 */
export async function costReport(ctx: ServerContext, userId: string, workshopId: string): Promise<CostReport> {
  await authorize(ctx.db, userId, workshopId, 'view');
  const spent = and(
    eq(ledgerEntries.workshopId, workshopId),
    isNull(ledgerEntries.deletedAt),
    sql`${ledgerEntries.kind} IN ('pour-use', 'waste')`,
  );
  const cost = sql<string>`sum(${ledgerEntries.costMinor})`;
  const line = (row: { key: string | null; label: string | null; currency: string; cost: string }): CostLine => ({
    key: row.key ?? '',
    label: row.label ?? '',
    currency: row.currency,
    costMinor: Number(row.cost),
  });

  const [byBuild, byMaterial, byMonth, total] = await Promise.all([
    ctx.db
      .select({ key: builds.id, label: builds.name, currency: containers.currency, cost })
      .from(ledgerEntries)
      .innerJoin(pours, eq(pours.id, ledgerEntries.pourId))
      .innerJoin(builds, eq(builds.id, pours.buildId))
      .innerJoin(containers, eq(containers.id, ledgerEntries.containerId))
      .where(and(spent, eq(ledgerEntries.kind, 'pour-use'), isNull(builds.deletedAt)))
      .groupBy(builds.id, builds.name, containers.currency)
      .orderBy(builds.name),
    ctx.db
      .select({ key: materials.id, label: materials.name, currency: containers.currency, cost })
      .from(ledgerEntries)
      .innerJoin(containers, eq(containers.id, ledgerEntries.containerId))
      .innerJoin(materials, eq(materials.id, containers.materialId))
      .where(spent)
      .groupBy(materials.id, materials.name, containers.currency)
      .orderBy(materials.name),
    ctx.db
      .select({
        key: sql<string>`to_char(${ledgerEntries.at} AT TIME ZONE 'UTC', 'YYYY-MM')`,
        label: sql<string>`to_char(${ledgerEntries.at} AT TIME ZONE 'UTC', 'YYYY-MM')`,
        currency: containers.currency,
        cost,
      })
      .from(ledgerEntries)
      .innerJoin(containers, eq(containers.id, ledgerEntries.containerId))
      .where(spent)
      .groupBy(sql`1`, sql`2`, containers.currency)
      .orderBy(sql`1`),
    ctx.db
      .select({ key: containers.currency, label: containers.currency, currency: containers.currency, cost })
      .from(ledgerEntries)
      .innerJoin(containers, eq(containers.id, ledgerEntries.containerId))
      .where(spent)
      .groupBy(containers.currency),
  ]);
  return {
    byBuild: byBuild.map(line),
    byMaterial: byMaterial.map(line),
    byMonth: byMonth.map(line),
    total: total.map(line),
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
