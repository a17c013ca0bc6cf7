import { inject, Injectable } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { format } from 'date-fns';
import { AccountSession } from '../core/account-session';
import { refusalWords } from '../core/refusal-words';
import { OfflineStore } from '../sync/offline-store';

export interface LayerAtBench {
  readonly pourId: string;
  readonly number: number;
  readonly pouredAtMs: number;
  readonly roomTempC: number;
  readonly weighedAG?: number;
  readonly weighedBG?: number;
}

/** How long the way to take a layer back stays offered. */
const TAKE_BACK_MS = 12_000;

/**
 * Records a layer poured from the bench in one go, then offers, for a few seconds, to take it back (for a
 * tap made by mistake). Each answers with the refusal in plain words, or null when the layer was saved.
 */
@Injectable({ providedIn: 'root' })
export class LayerRecorder {
  private readonly store = inject(OfflineStore);
  private readonly session = inject(AccountSession);
  private readonly snackBar = inject(MatSnackBar);

  async record(layer: LayerAtBench): Promise<string | null> {
    const workshopId = this.session.currentWorkshopId();
    if (workshopId === null) return 'Open a workshop first: nothing was saved.';
    const { pourId, number, pouredAtMs, roomTempC, weighedAG, weighedBG } = layer;
    try {
      const weighed = weighedAG === undefined ? {} : { weighedAG, ...(weighedBG === undefined ? {} : { weighedBG }) };
      const pouredAt = new Date(pouredAtMs).toISOString();
      const id = await this.store.recordLayer(workshopId, { pourId, number, pouredAt, roomTempC, ...weighed });
      const words = `Layer ${number} recorded at ${format(pouredAtMs, 'HH:mm')}`;
      const offer = this.snackBar.open(words, 'Take back', { duration: TAKE_BACK_MS });
      offer.onAction().subscribe(() => void this.takeBack(workshopId, id, number));
      return null;
    } catch (error) {
      return refusal(error);
    }
  }

  private async takeBack(workshopId: string, layerId: string, number: number): Promise<void> {
    try {
      await this.store.takeBackLayer(workshopId, layerId);
      this.snackBar.open(`Layer ${number} taken back`, undefined, { duration: 4000 });
    } catch (error) {
      this.snackBar.open(refusal(error), 'OK');
    }
  }
}

const refusal = (error: unknown) => refusalWords(error, 'The layer could not be saved on this device.');
