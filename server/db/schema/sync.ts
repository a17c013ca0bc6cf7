import { jsonb, pgTable, timestamp, uuid } from 'drizzle-orm/pg-core';
import type { MutationResult } from '../../../shared/sync-schemas.js';

/** Every pushed mutation, applied or refused, with its answer: a replay answers the same and changes nothing. */
export const pushedMutations = pgTable('pushed_mutations', {
  mutationId: uuid('mutation_id').primaryKey(),
  workshopId: uuid('workshop_id').notNull(),
  userId: uuid('user_id'),
  result: jsonb('result').$type<MutationResult>().notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
});
