import { csvTable, type CsvCell } from '../core/csv-table.js';
import { eq } from 'drizzle-orm';
import { RECORD_KINDS, type ExportTableName } from '../../shared/record-kinds.js';
import type { ServerContext } from '../context.js';
import { AppError } from '../core/app-error.js';
import { workshops } from '../db/schema/index.js';
import type { SyncedTable } from '../records/synced-records.js';
import { RECORD_SERVICES } from '../sync/record-services.js';
import { authorize } from '../workshops/workshop-service.js';

/**
 * The tables a workshop's record is made of, by the name they carry in an export. The photos' rows keep
 * the keys that name their files in the photo store, for a backup kept beside it.
 */
export const EXPORT_TABLES: Readonly<Record<ExportTableName, SyncedTable>> = Object.fromEntries(
  RECORD_SERVICES.map(({ kind, table }) => [RECORD_KINDS[kind].export.name, table]),
) as Record<ExportTableName, SyncedTable>;
export type ExportTable = ExportTableName;

async function rowsOf(ctx: ServerContext, workshopId: string, name: ExportTable) {
  const table = EXPORT_TABLES[name];
  return ctx.db.select().from(table).where(eq(table.workshopId, workshopId)).orderBy(table.changeNumber);
}

/** Everything the workshop recorded, tombstones included, for a backup or for leaving. Owners only. */
export async function exportJson(ctx: ServerContext, userId: string, workshopId: string) {
  await authorize(ctx.db, userId, workshopId, 'export');
  const [workshop] = await ctx.db.select().from(workshops).where(eq(workshops.id, workshopId));
  const tables: Record<string, unknown[]> = {};
  for (const name of Object.keys(EXPORT_TABLES) as ExportTable[]) tables[name] = await rowsOf(ctx, workshopId, name);
  return {
    format: 'benchtide-workshop-export',
    version: 1,
    exportedAt: ctx.clock.now().toISOString(),
    workshop,
    tables,
  };
}

export async function exportCsv(ctx: ServerContext, userId: string, workshopId: string, name: string): Promise<string> {
  await authorize(ctx.db, userId, workshopId, 'export');
  if (!(name in EXPORT_TABLES)) {
    throw new AppError(
      404,
      'not_found',
      `There is no table "${name}"; choose one of ${Object.keys(EXPORT_TABLES).join(', ')}.`,
    );
  }
  const rows = await rowsOf(ctx, workshopId, name as ExportTable);
  const columns = Object.keys(EXPORT_TABLES[name as ExportTable]).filter(
    (key) => !key.startsWith('_') && key !== 'enableRLS',
  );
  const cell = (value: unknown): CsvCell =>
    value === null || value === undefined
      ? null
      : value instanceof Date
        ? value.toISOString()
        : typeof value === 'number'
          ? value
          : typeof value === 'object'
            ? JSON.stringify(value)
            : String(value);
  return csvTable(
    columns,
    rows.map((row) => columns.map((column) => cell((row as Record<string, unknown>)[column]))),
  );
}
