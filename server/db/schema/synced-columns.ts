import { bigint, timestamp, uuid } from 'drizzle-orm/pg-core';
import { workshops } from './workshops.js';

/**
 * Columns every synced record has: its own device-made id, the workshop it belongs to, times,
 * a tombstone for deletes, and the workshop change number of its last write (for pulling).
 */
export function syncedColumns() {
  return {
    id: uuid('id').primaryKey(),
    workshopId: uuid('workshop_id')
      .notNull()
      .references(() => workshops.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
    deletedAt: timestamp('deleted_at', { withTimezone: true }),
    changeNumber: bigint('change_number', { mode: 'number' }).notNull(),
  };
}
