import {
  bigint,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  numeric,
  pgTable,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';
import { CONTAINER_PARTS, MATERIAL_KINDS } from '../../../shared/domain-schemas.js';
import { STOCK_DIMENSIONS, STOCK_UNITS } from '../../../shared/stock-units.js';
import type { MaterialDataSheet } from '../../../shared/schemas.js';
import { syncedColumns } from './synced-columns.js';

export const materials = pgTable(
  'materials',
  {
    ...syncedColumns(),
    name: text('name').notNull(),
    kind: text('kind', { enum: MATERIAL_KINDS }).notNull(),
    /** Validated with the shared data-sheet schema on the way in; null for what is not poured. */
    dataSheet: jsonb('data_sheet').$type<MaterialDataSheet>(),
    /** How a material without a data sheet is bought and used (weight, volume, pieces, length, area). */
    measure: text('measure', { enum: STOCK_DIMENSIONS }),
    shelfLifeOpenedDays: integer('shelf_life_opened_days'),
    safetySheet: text('safety_sheet').notNull().default(''),
  },
  (table) => [index('materials_workshop_change').on(table.workshopId, table.changeNumber)],
);

export const containers = pgTable(
  'containers',
  {
    ...syncedColumns(),
    materialId: uuid('material_id')
      .notNull()
      .references(() => materials.id, { onDelete: 'cascade' }),
    part: text('part', { enum: CONTAINER_PARTS }).notNull(),
    sizeQty: doublePrecision('size_qty').notNull(),
    unit: text('unit', { enum: STOCK_UNITS }).notNull(),
    priceMinor: bigint('price_minor', { mode: 'number' }).notNull(),
    currency: text('currency').notNull(),
    boughtOn: date('bought_on').notNull(),
    openedOn: date('opened_on'),
    useBy: date('use_by'),
    lowStockQty: doublePrecision('low_stock_qty'),
    lot: text('lot'),
  },
  (table) => [
    index('containers_material').on(table.materialId),
    index('containers_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);

/**
 * The stock book: stock is the sum of a container's entries, never a stored counter. Each use
 * carries its cost, fixed when written from the container's price, so reports are plain sums.
 */
export const ledgerEntries = pgTable(
  'ledger_entries',
  {
    ...syncedColumns(),
    containerId: uuid('container_id')
      .notNull()
      .references(() => containers.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: ['purchase', 'pour-use', 'waste', 'stocktake'] }).notNull(),
    /** Signed, in the container's unit, exact to a thousandth. */
    quantity: numeric('quantity', { precision: 14, scale: 3, mode: 'number' }).notNull(),
    /** Exact, in minor units to the millionth: rounded to whole cents only once per line of a report. */
    costMinor: numeric('cost_minor', { precision: 20, scale: 6, mode: 'number' }).notNull().default(0),
    at: timestamp('at', { withTimezone: true }).notNull(),
    pourId: uuid('pour_id'),
    note: text('note').notNull().default(''),
  },
  (table) => [
    index('ledger_container').on(table.containerId),
    index('ledger_pour').on(table.pourId),
    index('ledger_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);
