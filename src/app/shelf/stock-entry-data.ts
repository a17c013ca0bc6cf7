import type { LocalContainer, LocalMaterial } from '../sync/synced-records';

/** The container a waste or stocktake entry is for, with what the stock book here says is left. */
export interface StockEntryData {
  readonly material: LocalMaterial;
  readonly container: LocalContainer;
  readonly remainingQty: number;
}
