/**
 * A workshop's spending on material, summed per build, per material, per month and in all, from the
 * cost fixed on each stock-book entry when it was written. Currencies are never added together.
 * The server sums its running totals this way, and a device its own stock book, offline.
 */

/** What one or more stock-book entries cost, with what they belong to. */
export interface CostRow {
  /** Null for waste, and for uses whose build is gone: they count for materials and months only. */
  readonly buildId: string | null;
  readonly buildName: string | null;
  readonly materialId: string;
  readonly materialName: string;
  /** YYYY-MM */
  readonly month: string;
  readonly currency: string;
  /** Integer minor units (cents); uses and waste are positive. */
  readonly costMinor: number;
}

/** One line of a cost report: money in integer minor units of one currency. */
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

function group(rows: readonly CostRow[], keyOf: (row: CostRow) => [string, string] | null): CostLine[] {
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
}

export function summariseCosts(rows: readonly CostRow[]): CostReport {
  return {
    byBuild: group(rows, (row) =>
      row.buildId !== null && row.buildName !== null ? [row.buildId, row.buildName] : null,
    ),
    byMaterial: group(rows, (row) => [row.materialId, row.materialName]),
    byMonth: group(rows, (row) => [row.month, row.month]),
    total: group(rows, (row) => [row.currency, row.currency]),
  };
}

/** Money as the reader's locale writes it, from integer minor units: 1234 EUR cents is "€12.34". */
export function formatMoney(costMinor: number, currency: string, locale?: string): string {
  const format = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const digits = format.resolvedOptions().maximumFractionDigits ?? 2;
  return format.format(costMinor / 10 ** digits);
}
