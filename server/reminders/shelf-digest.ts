import { formatISO, getISOWeek, getISOWeekYear } from 'date-fns';
import { and, eq, isNull } from 'drizzle-orm';
import { formatNumber } from '../../shared/format.js';
import { shelfWarnings, type ShelfWarning, type WatchedContainer } from '../../shared/shelf-warnings.js';
import type { ServerContext } from '../context.js';
import { containerStock } from '../db/schema/rollups.js';
import { containers, materials } from '../db/schema/shelf.js';
import { workshops } from '../db/schema/workshops.js';
import type { Transaction } from '../records/change-stamp.js';
import { addDeliveries } from './reminder-delivery.js';
import { recipientsOf } from './reminder-recipients.js';

const SAYS: Record<ShelfWarning['kind'], (w: ShelfWarning, unit: string) => string> = {
  empty: () => 'empty',
  low: (w, unit) => `low, ${formatNumber(w.remainingQty)} ${unit} left`,
  expired: (w) => `past its use-by day (${w.day})`,
  expiring: (w) => `use by ${w.day}`,
};

/**
 * The weekly word on each workshop's shelf: containers running low or empty and lots near or past
 * their use-by day. One per workshop, member, channel and ISO week, however often it is asked for.
 */
export async function queueShelfDigests(ctx: ServerContext, now: Date): Promise<number> {
  const week = `${getISOWeekYear(now)}-W${String(getISOWeek(now)).padStart(2, '0')}`;
  const today = formatISO(now, { representation: 'date' });
  const all = await ctx.db.select({ id: workshops.id }).from(workshops);
  let queued = 0;
  for (const { id: workshopId } of all) {
    queued += await ctx.db.transaction(async (tx) => {
      const lines = await warningLines(tx, workshopId, today);
      if (lines.length === 0) return 0;
      const people = await recipientsOf(tx, workshopId, 'shelf-digest');
      const title =
        lines.length === 1 ? 'One thing on the shelf needs a look' : `${lines.length} things on the shelf need a look`;
      await addDeliveries(
        tx,
        `digest:${workshopId}:${week}`,
        people,
        { title, body: lines.join('\n'), url: '/shelf' },
        now,
        now,
      );
      return people.length;
    });
  }
  return queued;
}

async function warningLines(tx: Transaction, workshopId: string, today: string): Promise<string[]> {
  const rows = await tx
    .select({ container: containers, material: materials, remaining: containerStock.remaining })
    .from(containers)
    .innerJoin(materials, eq(materials.id, containers.materialId))
    .leftJoin(containerStock, eq(containerStock.containerId, containers.id))
    .where(and(eq(containers.workshopId, workshopId), isNull(containers.deletedAt), isNull(materials.deletedAt)));
  const watched: WatchedContainer[] = rows.map(({ container }) => container);
  const remaining = Object.fromEntries(rows.map((row) => [row.container.id, Number(row.remaining ?? 0)]));
  const byId = new Map(rows.map((row) => [row.container.id, row]));
  const shelfLife = new Map(rows.map((row) => [row.material.id, row.material.shelfLifeOpenedDays]));
  return shelfWarnings(watched, remaining, today, (id) => shelfLife.get(id)).map((warning) => {
    const { container, material } = byId.get(warning.containerId)!;
    const part = container.part === 'single' ? '' : ` part ${container.part}`;
    return `${material.name}${part}: ${SAYS[warning.kind](warning, container.unit)}`;
  });
}
