/**
 * The tables a workshop's export is made of, by the names they carry in it (`export.json`'s
 * `tables`, and `export/<name>.csv`), with what each holds in plain words.
 */
export const EXPORT_TABLE_LABELS = {
  builds: 'Builds',
  steps: 'Build steps',
  materials: 'Materials',
  containers: 'Containers',
  ledger: 'Stock book',
  pours: 'Pours',
  photos: 'Photo records',
} as const;
export type ExportTableName = keyof typeof EXPORT_TABLE_LABELS;
