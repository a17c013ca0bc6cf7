import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject, input, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MAX_LAYERS, type DisplayUnits } from '@benchtide/shared';
import { map, timer } from 'rxjs';
import { refusalWords } from '../core/refusal-words';
import type { LocalPourLayer } from '../sync/synced-records';
import { BuildLog, type PourDraw } from './build-log';
import { deletionWords, pouredLayers } from './poured-layers';
import { PourCorrection } from './pour-correction';
import type { PourRecord } from './pour-recipe';

type Open = 'none' | 'correct' | 'delete';

/**
 * A pour in the build log as it was really poured: each layer with its real time beside the planned one,
 * demould and full cure from the real times; and for builders, correcting it, changing the layers still
 * to come, taking back the top layer and deleting the pour (saying first what goes back to the shelf).
 */
@Component({
  selector: 'bt-pour-entry',
  imports: [MatButtonModule, MatIconModule, PourCorrection],
  templateUrl: './pour-entry.html',
  styleUrl: './pour-entry.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourEntry {
  private readonly log = inject(BuildLog);
  private readonly locale = inject(LOCALE_ID);

  readonly pour = input.required<PourRecord>();
  readonly layers = input.required<readonly LocalPourLayer[]>();
  readonly draw = input<PourDraw | undefined>(undefined);
  readonly units = input.required<DisplayUnits>();
  readonly canWrite = input(false);

  /** Layers still to come are re-projected from now, so the minute is enough. */
  private readonly now = toSignal(timer(0, 60_000).pipe(map(() => Date.now())), { initialValue: Date.now() });
  protected readonly shown = computed(() => pouredLayers(this.pour(), this.layers(), this.units(), this.now()));
  protected readonly open = signal<Open>('none');
  protected readonly problem = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly deletion = computed(() => deletionWords(this.draw(), this.units(), this.locale));
  protected readonly singlePart = computed(() => this.pour().plan?.mix.singlePart ?? false);
  protected readonly topLayer = computed(() => {
    const layers = this.layers();
    const top = layers.at(-1);
    return top !== undefined && top.number > 1 ? top : null;
  });
  protected readonly canAdd = computed(() => (this.shown()?.layerCount ?? MAX_LAYERS) < MAX_LAYERS);
  protected readonly canSkip = computed(() => {
    const shown = this.shown();
    return shown !== null && shown.layerCount > Math.max(1, shown.pouredCount);
  });

  protected toggle(open: Open): void {
    this.problem.set(null);
    this.open.set(this.open() === open ? 'none' : open);
  }

  /** One layer more (thin detail, a tint) or one fewer; the layers on stay as they were. */
  protected async changeLayers(by: 1 | -1): Promise<void> {
    const shown = this.shown();
    if (shown === null) return;
    await this.run(() => this.log.replanPour(this.pour().id, shown.layerCount + by));
  }

  protected async takeBack(layer: LocalPourLayer): Promise<void> {
    await this.run(() => this.log.takeBackLayer(layer.id));
  }

  protected async deletePour(): Promise<void> {
    if (await this.run(() => this.log.deletePour(this.pour().id))) this.open.set('none');
  }

  private async run(action: () => Promise<void>): Promise<boolean> {
    if (this.busy()) return false;
    this.busy.set(true);
    this.problem.set(null);
    try {
      await action();
      return true;
    } catch (error) {
      this.problem.set(refusalWords(error, 'This device could not save the change.'));
      return false;
    } finally {
      this.busy.set(false);
    }
  }
}
