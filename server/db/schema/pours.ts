import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
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
    loggedBy: uuid('logged_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (table) => [
    index('pours_build').on(table.buildId),
    index('pours_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);
