import { date, numeric, pgTable, primaryKey, text, uuid } from 'drizzle-orm/pg-core';

/**
 * Running sums of the stock book, kept by database triggers on ledger_entries (see the
 * ledger_rollups migration) so the shelf and the cost report read a few rows instead of
 * summing every entry. They are an index of the ledger, never synced and never written by
 * the app; the ledger stays the truth and a spec checks the sums agree.
 */
export const containerStock = pgTable('container_stock', {
  containerId: uuid('container_id').primaryKey(),
  workshopId: uuid('workshop_id').notNull(),
  remaining: numeric('remaining', { precision: 16, scale: 3, mode: 'number' }).notNull(),
});

/** Cost of uses and waste per workshop, build (or none, for waste), material, month and currency. */
export const costTotals = pgTable(
  'cost_totals',
  {
    workshopId: uuid('workshop_id').notNull(),
    /** The nil UUID for waste, which belongs to no build. */
    buildId: uuid('build_id').notNull(),
    materialId: uuid('material_id').notNull(),
    month: date('month').notNull(),
    currency: text('currency').notNull(),
    /** Exact sum, in minor units to the millionth. */
    costMinor: numeric('cost_minor', { precision: 24, scale: 6, mode: 'number' }).notNull(),
  },
  (table) => [
    primaryKey({ columns: [table.workshopId, table.buildId, table.materialId, table.month, table.currency] }),
  ],
);
