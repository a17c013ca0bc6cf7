import { formatISO, getISOWeek, getISOWeekYear } from 'date-fns';
import { and, eq, isNotNull, isNull, or } from 'drizzle-orm';
import { formatNumber } from '../../shared/format.js';
import { shelfWarnings, type ShelfWarning, type WatchedContainer } from '../../shared/shelf-warnings.js';
import type { ServerContext } from '../context.js';
import { containerStock } from '../db/schema/rollups.js';
import { containers, materials } from '../db/schema/shelf.js';
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
  const watched = await ctx.db
    .select({ container: containers, material: materials, remaining: containerStock.remaining })
    .from(containers)
    .innerJoin(materials, eq(materials.id, containers.materialId))
    .leftJoin(containerStock, eq(containerStock.containerId, containers.id))
    .where(
      and(
        isNull(containers.deletedAt),
        isNull(materials.deletedAt),
        or(isNotNull(containers.lowStockQty), isNotNull(containers.useBy), isNotNull(containers.openedOn)),
      ),
    );
  const byWorkshop = new Map<string, WatchedRow[]>();
  for (const row of watched) {
    byWorkshop.set(row.container.workshopId, [...(byWorkshop.get(row.container.workshopId) ?? []), row]);
  }
  let queued = 0;
  for (const [workshopId, rows] of byWorkshop) {
    const lines = warningLines(rows, today);
    if (lines.length === 0) continue;
    const title =
      lines.length === 1 ? 'One thing on the shelf needs a look' : `${lines.length} things on the shelf need a look`;
    queued += await ctx.db.transaction(async (tx) => {
      const people = await recipientsOf(tx, workshopId, 'shelf-digest');
      const message = { title, body: lines.join('\n'), url: '/shelf' };
      await addDeliveries(tx, `digest:${workshopId}:${week}`, people, message, now, now);
      return people.length;
    });
  }
  return queued;
}

interface WatchedRow {
  container: typeof containers.$inferSelect;
  material: typeof materials.$inferSelect;
  remaining: number | null;
}

function warningLines(rows: readonly WatchedRow[], today: string): string[] {
  const remaining = Object.fromEntries(rows.map((row) => [row.container.id, Number(row.remaining ?? 0)]));
  const byId = new Map(rows.map((row) => [row.container.id, row]));
  const shelfLife = new Map(rows.map((row) => [row.material.id, row.material.shelfLifeOpenedDays]));
  const watched: WatchedContainer[] = rows.map(({ container }) => container);
  return shelfWarnings(watched, remaining, today, (id) => shelfLife.get(id)).map((warning) => {
    const { container, material } = byId.get(warning.containerId)!;
    const part = container.part === 'single' ? '' : ` part ${container.part}`;
    return `${material.name}${part}: ${SAYS[warning.kind](warning, container.unit)}`;
  });
}
