/**
 * A workshop's spending on material, summed per build, per material, per month and in all, from the
 * cost fixed on each stock-book entry when it was written. Currencies are never added together.
 * The server sums its running totals this way, and a device its own stock book, offline.
 */
import { sumCostsMinor, wholeMinor } from './ledger.js';

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
  /** Exact minor units (cents, to the millionth); uses and waste are positive. */
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

/** Plain words for a cost row that cannot be summed, or null: not a number, or below 0. */
export function costRowProblem(row: Pick<CostRow, 'costMinor'>): string | null {
  if (typeof row.costMinor !== 'number' || !Number.isFinite(row.costMinor)) {
    return `A cost in the stock book is not a number (${String(row.costMinor)}).`;
  }
  if (row.costMinor < 0) return `A cost of a use or waste must be 0 or more, got ${row.costMinor}.`;
  return null;
}

/** Each line sums its rows' exact costs and is rounded once, to whole minor units. */
function group(rows: readonly CostRow[], keyOf: (row: CostRow) => [string, string] | null): CostLine[] {
  const lines = new Map<string, { line: CostLine; exact: number[] }>();
  for (const row of rows) {
    const keyed = keyOf(row);
    if (!keyed) continue;
    const [key, label] = keyed;
    const id = `${key}|${row.currency}`;
    const found = lines.get(id) ?? { line: { key, label, currency: row.currency, costMinor: 0 }, exact: [] };
    found.exact.push(row.costMinor);
    lines.set(id, found);
  }
  return [...lines.values()]
    .map(({ line, exact }) => ({ ...line, costMinor: wholeMinor(sumCostsMinor(exact)) }))
    .filter((line) => line.costMinor !== 0)
    .sort((a, b) => a.label.localeCompare(b.label));
}

/** The report, every line rounded once from exact sums; refuses a row whose cost cannot be summed. */
export function summariseCosts(rows: readonly CostRow[]): CostReport {
  for (const row of rows) {
    const problem = costRowProblem(row);
    if (problem !== null) throw new RangeError(`${problem} Material ${row.materialName}, ${row.month}.`);
  }
  return {
    byBuild: group(rows, (row) =>
      row.buildId !== null && row.buildName !== null ? [row.buildId, row.buildName] : null,
    ),
    byMaterial: group(rows, (row) => [row.materialId, row.materialName]),
    byMonth: group(rows, (row) => [row.month, row.month]),
    total: group(rows, (row) => [row.currency, row.currency]),
  };
}

/**
 * Money as the reader's locale writes it, from minor units rounded once to whole ones: 1234 EUR cents
 * is "€12.34", 149.95 cents "€1.50". Refuses an amount that is not a number rather than print "€NaN".
 */
export function formatMoney(costMinor: number, currency: string, locale?: string): string {
  const format = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const digits = format.resolvedOptions().maximumFractionDigits ?? 2;
  return format.format(wholeMinor(costMinor) / 10 ** digits);
}
