import { index, integer, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { builds, buildSteps } from './builds.js';
import { pours } from './pours.js';
import { syncedColumns } from './synced-columns.js';
import { users } from './users.js';

/**
 * Bench photos. The bytes live in the photo store (disk or S3) under keys that name the photo and
 * the hash of what was uploaded; the row is written only once both copies are stored.
 */
export const photos = pgTable(
  'photos',
  {
    ...syncedColumns(),
    buildId: uuid('build_id')
      .notNull()
      .references(() => builds.id, { onDelete: 'cascade' }),
    stepId: uuid('step_id').references(() => buildSteps.id, { onDelete: 'set null' }),
    pourId: uuid('pour_id').references(() => pours.id, { onDelete: 'set null' }),
    caption: text('caption').notNull().default(''),
    takenAt: timestamp('taken_at', { withTimezone: true }),
    /** Of the display copy, upright. */
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    /** SHA-256 of the bytes uploaded, hex. */
    contentHash: text('content_hash').notNull(),
    displayKey: text('display_key').notNull(),
    displayBytes: integer('display_bytes').notNull(),
    thumbKey: text('thumb_key').notNull(),
    thumbBytes: integer('thumb_bytes').notNull(),
    uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (table) => [
    index('photos_build').on(table.buildId),
    index('photos_workshop_change').on(table.workshopId, table.changeNumber),
  ],
);
