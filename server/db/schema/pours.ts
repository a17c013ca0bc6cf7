import { sql } from 'drizzle-orm';
import {
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import type { PourPlan, PourPlanRequest } from '../../../shared/index.js';
import { builds, buildSteps } from './builds.js';
import { materials } from './shelf.js';
import { syncedColumns } from './synced-columns.js';
import { users } from './users.js';

/** What a pour drew that the shelf did not hold: "I used another bottle". */
export interface PourShortfall {
  part: 'A' | 'B' | 'single';
  quantityG: number;
}

export const pours = pgTable(
  'pours',
  {
    ...syncedColumns(),
    buildId: uuid('build_id')
      .notNull()
      .references(() => builds.id, { onDelete: 'cascade' }),
    stepId: uuid('step_id').references(() => buildSteps.id, { onDelete: 'set null' }),
    materialId: uuid('material_id')
      .notNull()
      .references(() => materials.id, { onDelete: 'restrict' }),
    startAt: timestamp('start_at', { withTimezone: true }).notNull(),
    /** The request as planned, with the material's data sheet as it was that day. */
    request: jsonb('request').$type<PourPlanRequest>().notNull(),
    /** Volume, layers, amounts and due times, computed on the server with the shared maths. */
    plan: jsonb('plan').$type<Omit<PourPlan, 'request'>>().notNull(),
    shortfall: jsonb('shortfall').$type<PourShortfall[]>().notNull().default([]),
    note: text('note').notNull().default(''),
    /** The containers the modeller chose to draw from, or null for the shelf's oldest first. */
    chosenContainerIds: jsonb('chosen_container_ids').$type<string[]>(),
    /** The layers now planned: the plan's own until a layer is added, skipped or the rest re-split. */
    layerCount: integer('layer_count').notNull(),
    loggedBy: uuid('logged_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (table) => [
    index('pours_build').on(table.buildId),
    index('pours_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);

/**
 * A layer as really poured: when, in what room, what it was planned to take and what was weighed.
 * Layer 1 is written with its pour and shares its id; a layer not yet poured has no row.
 */
export const pourLayers = pgTable(
  'pour_layers',
  {
    ...syncedColumns(),
    pourId: uuid('pour_id')
      .notNull()
      .references(() => pours.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    pouredAt: timestamp('poured_at', { withTimezone: true }).notNull(),
    roomTempC: doublePrecision('room_temp_c').notNull(),
    /** The plan for this layer when it went on, kept whatever is re-planned after. */
    depthMm: doublePrecision('depth_mm').notNull(),
    partAG: doublePrecision('part_a_g').notNull(),
    partBG: doublePrecision('part_b_g').notNull(),
    weighedAG: doublePrecision('weighed_a_g'),
    weighedBG: doublePrecision('weighed_b_g'),
    note: text('note').notNull().default(''),
    recordedBy: uuid('recorded_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (table) => [
    uniqueIndex('pour_layers_pour_number')
      .on(table.pourId, table.number)
      .where(sql`deleted_at IS NULL`),
    index('pour_layers_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);
