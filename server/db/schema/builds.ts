import { doublePrecision, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { BUILD_STATUSES, STEP_KINDS } from '../../../shared/domain-schemas.js';
import { syncedColumns } from './synced-columns.js';
import { users } from './users.js';

export const builds = pgTable(
  'builds',
  {
    ...syncedColumns(),
    name: text('name').notNull(),
    scaleRatio: doublePrecision('scale_ratio').notNull(),
    scaleId: text('scale_id'),
    baseWidthMm: doublePrecision('base_width_mm'),
    baseDepthMm: doublePrecision('base_depth_mm'),
    realWidthMm: doublePrecision('real_width_mm'),
    realDepthMm: doublePrecision('real_depth_mm'),
    status: text('status', { enum: BUILD_STATUSES }).notNull(),
    notes: text('notes').notNull().default(''),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    /** A live photo of this build, checked on every write; deleting that photo clears it. */
    coverPhotoId: uuid('cover_photo_id'),
  },
  (table) => [index('builds_workshop_change').on(table.workshopId, table.changeNumber)],
);

export const buildSteps = pgTable(
  'build_steps',
  {
    ...syncedColumns(),
    buildId: uuid('build_id')
      .notNull()
      .references(() => builds.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: STEP_KINDS }).notNull(),
    title: text('title').notNull(),
    notes: text('notes').notNull().default(''),
    happenedAt: timestamp('happened_at', { withTimezone: true }).notNull(),
    loggedBy: uuid('logged_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (table) => [
    index('build_steps_build').on(table.buildId),
    index('build_steps_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);
