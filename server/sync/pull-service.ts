import { and, eq, gt, lte, sql } from 'drizzle-orm';
import type { PulledChange, PullAnswer, SyncedEntity } from '../../shared/sync-schemas.js';
import type { ServerContext } from '../context.js';
import {
  builds,
  buildSteps,
  containers,
  ledgerEntries,
  materials,
  memberships,
  photos,
  pours,
  workshops,
} from '../db/schema/index.js';
import { photoRecord, type PhotoRow } from '../photos/photo-records.js';
import type { SyncedTable } from '../records/synced-records.js';

const TABLES: readonly [SyncedEntity, SyncedTable][] = [
  ['build', builds],
  ['step', buildSteps],
  ['material', materials],
  ['container', containers],
  ['ledgerEntry', ledgerEntries],
  ['pour', pours],
  ['photo', photos],
];

/**
 * A page of a workshop's changes after a cursor, read from one snapshot. Change numbers are
 * handed out in commit order (see stampChange), so nothing committed later can carry a number
 * below the cursor. A page never splits one change number across pages.
 */
export async function pull(
  ctx: ServerContext,
  userId: string,
  workshopId: string,
  after: number,
  limit: number,
): Promise<PullAnswer> {
  return ctx.db.transaction(
    async (tx) => {
      const [membership] = await tx
        .select({ counter: workshops.changeCounter })
        .from(memberships)
        .innerJoin(workshops, eq(workshops.id, memberships.workshopId))
        .where(and(eq(memberships.workshopId, workshopId), eq(memberships.userId, userId)));
      if (!membership) {
        return {
          startOver: true,
          reason: 'You are no longer a member of this workshop, so its records leave this device.',
        };
      }
      if (after > membership.counter) {
        return {
          startOver: true,
          reason: 'The server holds an earlier copy than this device has seen; this device copies everything again.',
        };
      }
      const numbers = sql.join(
        TABLES.map(
          ([, table]) =>
            sql`SELECT change_number FROM ${table} WHERE workshop_id = ${workshopId} AND change_number > ${after}`,
        ),
        sql` UNION ALL `,
      );
      const boundary = await tx.execute<{ change_number: string }>(
        sql`SELECT change_number FROM (${numbers}) AS changes ORDER BY change_number LIMIT 1 OFFSET ${limit - 1}`,
      );
      const upTo = boundary.rows[0] ? Number(boundary.rows[0].change_number) : membership.counter;
      const changes: PulledChange[] = [];
      for (const [entity, table] of TABLES) {
        const rows = await tx
          .select()
          .from(table)
          .where(and(eq(table.workshopId, workshopId), gt(table.changeNumber, after), lte(table.changeNumber, upTo)));
        for (const row of rows as (Record<string, unknown> & {
          id: string;
          changeNumber: number;
          deletedAt: Date | null;
        })[]) {
          const record =
            entity === 'photo'
              ? { ...photoRecord(row as unknown as PhotoRow) }
              : { ...row, deletedAt: row.deletedAt?.toISOString() ?? null };
          changes.push({ entity, changeNumber: row.changeNumber, record });
        }
      }
      changes.sort((a, b) => a.changeNumber - b.changeNumber);
      return { startOver: false, changes, cursor: upTo, more: upTo < membership.counter };
    },
    { isolationLevel: 'repeatable read', accessMode: 'read only' },
  );
}
