import { and, eq, gt, lte, sql } from 'drizzle-orm';
import type { PulledChange, PullAnswer } from '../../shared/sync-schemas.js';
import type { ServerContext } from '../context.js';
import { memberships, workshops } from '../db/schema/index.js';
import type { SyncedTable } from '../records/synced-records.js';
import { RECORD_SERVICES } from './record-services.js';

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
        RECORD_SERVICES.map(
          ({ table }) =>
            sql`SELECT change_number FROM ${table} WHERE workshop_id = ${workshopId} AND change_number > ${after}`,
        ),
        sql` UNION ALL `,
      );
      const boundary = await tx.execute<{ change_number: string }>(
        sql`SELECT change_number FROM (${numbers}) AS changes ORDER BY change_number LIMIT 1 OFFSET ${limit - 1}`,
      );
      const upTo = boundary.rows[0] ? Number(boundary.rows[0].change_number) : membership.counter;
      const changes: PulledChange[] = [];
      for (const { kind, table, toRecord } of RECORD_SERVICES) {
        const synced: SyncedTable = table;
        const rows = await tx
          .select()
          .from(synced)
          .where(
            and(eq(synced.workshopId, workshopId), gt(synced.changeNumber, after), lte(synced.changeNumber, upTo)),
          );
        for (const row of rows) {
          const record = toRecord(row) as PulledChange['record'];
          changes.push({ entity: kind, changeNumber: record['changeNumber'] as number, record });
        }
      }
      changes.sort((a, b) => a.changeNumber - b.changeNumber);
      return { startOver: false, changes, cursor: upTo, more: upTo < membership.counter };
    },
    { isolationLevel: 'repeatable read', accessMode: 'read only' },
  );
}
