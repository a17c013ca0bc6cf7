import { csvTable, type CsvCell } from '../core/csv-table.js';
import { majorAmount, type CostReport } from './cost-service.js';

/** The cost report as one CSV table: one row per line, grouped by what it sums. */
export function costReportCsv(report: CostReport): string {
  const rows: CsvCell[][] = [];
  const groups: [string, keyof CostReport][] = [
    ['build', 'byBuild'],
    ['material', 'byMaterial'],
    ['month', 'byMonth'],
    ['total', 'total'],
  ];
  for (const [group, key] of groups) {
    for (const line of report[key]) {
      rows.push([
        group,
        line.key,
        line.label,
        line.currency,
        line.costMinor,
        majorAmount(line.costMinor, line.currency),
      ]);
    }
  }
  return csvTable(['group', 'key', 'label', 'currency', 'cost_minor', 'cost'], rows);
}
