import type { StockUnit } from './stock-units.js';

/**
 * What on the shelf needs the modeller's eye: containers running low (at or below the level they set)
 * and containers past, or near, their use-by day, including the shelf life that starts once opened.
 * The bench shows these; the weekly digest sends them.
 */

export interface WatchedContainer {
  readonly id: string;
  readonly materialId: string;
  readonly part: 'A' | 'B' | 'single';
  readonly unit: StockUnit;
  /** YYYY-MM-DD */
  readonly openedOn?: string | null;
  readonly useBy?: string | null;
  readonly lowStockQty?: number | null;
}

export type ShelfWarningKind = 'empty' | 'low' | 'expired' | 'expiring';

export interface ShelfWarning {
  readonly kind: ShelfWarningKind;
  readonly containerId: string;
  readonly materialId: string;
  readonly remainingQty: number;
  /** The day it goes off, for the use-by kinds (YYYY-MM-DD). */
  readonly day?: string;
}

/** Warn this many days before a use-by day. */
export const USE_BY_NOTICE_DAYS = 14;

const DAY_MS = 86_400_000;

/** Adds whole days to a YYYY-MM-DD day, in UTC so that no clock change moves it. */
export function addDays(day: string, days: number): string {
  return new Date(Date.parse(`${day}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

/** The earlier of the printed use-by day and the opened day plus the material's shelf life once opened. */
export function effectiveUseBy(container: WatchedContainer, shelfLifeOpenedDays?: number | null): string | null {
  const opened = container.openedOn && shelfLifeOpenedDays ? addDays(container.openedOn, shelfLifeOpenedDays) : null;
  const days = [container.useBy ?? null, opened].filter((day): day is string => day !== null);
  return days.length === 0 ? null : days.sort()[0]!;
}

export function shelfWarnings(
  containers: readonly WatchedContainer[],
  remaining: Readonly<Record<string, number>>,
  today: string,
  shelfLifeOpenedDaysOf: (materialId: string) => number | null | undefined = () => undefined,
): ShelfWarning[] {
  const warnings: ShelfWarning[] = [];
  for (const container of containers) {
    const remainingQty = remaining[container.id] ?? 0;
    const base = { containerId: container.id, materialId: container.materialId, remainingQty };
    // An empty container is only worth a word while someone still counts on it (a low-stock level is set).
    if (remainingQty <= 0 && container.lowStockQty != null) warnings.push({ kind: 'empty', ...base });
    else if (remainingQty > 0 && container.lowStockQty != null && remainingQty <= container.lowStockQty) {
      warnings.push({ kind: 'low', ...base });
    }
    if (remainingQty <= 0) continue;
    const day = effectiveUseBy(container, shelfLifeOpenedDaysOf(container.materialId));
    if (day === null) continue;
    if (day < today) warnings.push({ kind: 'expired', ...base, day });
    else if (day <= addDays(today, USE_BY_NOTICE_DAYS)) warnings.push({ kind: 'expiring', ...base, day });
  }
  return warnings;
}
