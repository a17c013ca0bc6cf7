import type { LocalContainer, LocalMaterial } from '../sync/synced-records';
import { dayText, PART_LABELS } from './container-row';

/** The container a waste or stocktake entry is for, with what the stock book here says is left. */
export interface StockEntryData {
  readonly material: LocalMaterial;
  readonly container: LocalContainer;
  readonly remainingQty: number;
}

/** "Clear resin: Part A bought 3 Mar 2026", the heading of a waste or stocktake form. */
export function entryTitle({ material, container }: StockEntryData): string {
  return `${material.name}: ${PART_LABELS[container.part]} bought ${dayText(container.boughtOn)}`;
}
