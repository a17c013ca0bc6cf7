import { addDays, differenceInCalendarDays, formatISO, parseISO } from 'date-fns';
import { and, eq, isNull } from 'drizzle-orm';
import { USE_BY_NOTICE_DAYS } from '../../shared/shelf-warnings.js';
import type { StockUnit } from '../../shared/stock-units.js';
import type { ServerContext } from '../context.js';
import { containers, containerStock, materials } from '../db/schema/index.js';
import { authorize } from '../workshops/workshop-service.js';

export interface ContainerOnShelf {
  id: string;
  part: 'A' | 'B' | 'single';
  unit: StockUnit;
  sizeQty: number;
  remainingQty: number;
  priceMinor: number;
  currency: string;
  boughtOn: string;
  openedOn: string | null;
  /** The earlier of the printed use-by and the shelf life counted from opening. */
  useBy: string | null;
  lowStock: boolean;
  useBySoon: boolean;
  expired: boolean;
  lot: string | null;
}

/** Every live material with its containers and what is left in each (the ledger's running sums), in one query. */
export async function shelfOf(ctx: ServerContext, userId: string, workshopId: string) {
  await authorize(ctx.db, userId, workshopId, 'view');
  const rows = await ctx.db
    .select({ material: materials, container: containers, qty: containerStock.remaining })
    .from(materials)
    .leftJoin(containers, and(eq(containers.materialId, materials.id), isNull(containers.deletedAt)))
    .leftJoin(containerStock, eq(containerStock.containerId, containers.id))
    .where(and(eq(materials.workshopId, workshopId), isNull(materials.deletedAt)))
    .orderBy(materials.name, containers.boughtOn);
  const today = ctx.clock.now();
  const shelf = new Map<string, { material: typeof materials.$inferSelect; containers: ContainerOnShelf[] }>();
  for (const row of rows) {
    const entry = shelf.get(row.material.id) ?? { material: row.material, containers: [] };
    shelf.set(row.material.id, entry);
    if (!row.container) continue;
    const remainingQty = Number(row.qty ?? 0);
    const useBy = effectiveUseBy(row.container.useBy, row.container.openedOn, row.material.shelfLifeOpenedDays);
    const daysLeft = useBy === null ? null : differenceInCalendarDays(parseISO(useBy), today);
    entry.containers.push({
      id: row.container.id,
      part: row.container.part,
      unit: row.container.unit,
      sizeQty: row.container.sizeQty,
      remainingQty,
      priceMinor: row.container.priceMinor,
      currency: row.container.currency,
      boughtOn: row.container.boughtOn,
      openedOn: row.container.openedOn,
      useBy,
      lowStock: row.container.lowStockQty !== null && remainingQty <= row.container.lowStockQty,
      useBySoon: daysLeft !== null && daysLeft >= 0 && daysLeft <= USE_BY_NOTICE_DAYS,
      expired: daysLeft !== null && daysLeft < 0,
      lot: row.container.lot,
    });
  }
  return [...shelf.values()].map(({ material, containers: held }) => ({
    ...material,
    containers: held,
    /** What is left in each unit its containers are kept in, summed to the thousandth. */
    remainingByUnit: Object.fromEntries(
      [...new Set(held.map((c) => c.unit))].map((unit) => [
        unit,
        held.filter((c) => c.unit === unit).reduce((sum, c) => sum + Math.round(c.remainingQty * 1000), 0) / 1000,
      ]),
    ),
  }));
}

function effectiveUseBy(
  printed: string | null,
  openedOn: string | null,
  shelfLifeOpenedDays: number | null,
): string | null {
  const afterOpening =
    openedOn !== null && shelfLifeOpenedDays !== null
      ? formatISO(addDays(parseISO(openedOn), shelfLifeOpenedDays), { representation: 'date' })
      : null;
  if (printed === null) return afterOpening;
  if (afterOpening === null) return printed;
  return printed < afterOpening ? printed : afterOpening;
}
