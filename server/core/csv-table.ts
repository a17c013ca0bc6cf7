import { stringify } from 'csv-stringify/sync';

/** A cell as it is written: text, a number (never neutralised, so -49 stays a number) or nothing. */
export type CsvCell = string | number | null;

/**
 * A CSV table for a spreadsheet. Text a member typed that a spreadsheet would run as a formula (starting
 * with =, +, -, @, a tab or a carriage return) is written with a leading apostrophe, csv-stringify's
 * `escape_formulas`, so opening one member's export cannot run what another member wrote.
 */
export function csvTable(columns: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return stringify(
    rows.map((row) => [...row]),
    { header: true, columns: [...columns], escape_formulas: true },
  );
}
