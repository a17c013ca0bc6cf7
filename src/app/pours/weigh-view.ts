import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  afterNextRender,
  computed,
  inject,
  input,
  output,
  signal,
  type ElementRef,
  viewChild,
} from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { weighedRatioProblem, type PourPlan } from '@benchtide/shared';
import { inputText, parseDecimal } from '../core/decimal-input';

/** What the scale showed for a layer; part B is null for a single-part medium. Absent when left empty. */
export interface WeighedLayer {
  readonly partAG?: number;
  readonly partBG?: number;
}

interface WakeLockHandle {
  release(): Promise<void>;
}

/**
 * What to put on the scale for one layer, in very large type, readable from arm's length with gloves on.
 * The screen is kept awake while it is open (where the browser allows), so it does not dim mid-pour.
 * Given a layer and its plan, it also takes what the scale really showed and records the layer with it,
 * saying first when the two parts are off the data sheet's ratio (recording still goes).
 */
@Component({
  selector: 'bt-weigh-view',
  imports: [MatFormFieldModule, MatInputModule],
  host: { '(document:keydown.escape)': 'close()' },
  templateUrl: './weigh-view.html',
  styleUrl: './weigh-view.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WeighView {
  /** Already formatted to what the modeller's scale can weigh, e.g. "84.2 g". */
  readonly partA = input.required<string>();
  /** Null for a single-part medium. */
  readonly partB = input.required<string | null>();
  readonly layerCount = input.required<number>();
  /** The one layer being weighed, when the view records it. */
  readonly layer = input<number | null>(null);
  /** With `layer`: the plan the weighed amounts are judged against; the view then records the layer. */
  readonly plan = input<PourPlan | null>(null);
  /** Why the last recording was refused, in plain words. */
  readonly problem = input<string | null>(null);
  readonly closed = output<void>();
  readonly recorded = output<WeighedLayer>();

  private readonly done = viewChild.required<ElementRef<HTMLButtonElement>>('done');
  protected readonly awake = signal(false);
  protected readonly recording = computed(() => this.layer() !== null && this.plan() !== null);
  protected readonly weighedAText = signal('');
  protected readonly weighedBText = signal('');
  private readonly weighed = computed<WeighedLayer>(() => {
    const partAG = parseDecimal(this.weighedAText());
    const partBG = this.partB() === null ? null : parseDecimal(this.weighedBText());
    return { ...(partAG === null ? {} : { partAG }), ...(partBG === null ? {} : { partBG }) };
  });
  /** Shown once something is typed, before recording: the words say what to add. */
  protected readonly ratioProblem = computed(() => {
    const plan = this.plan();
    const { partAG, partBG } = this.weighed();
    if (plan === null || (partAG === undefined && partBG === undefined)) return null;
    return weighedRatioProblem(plan, { partAG: partAG ?? 0, partBG: partBG ?? 0 });
  });
  protected readonly text = inputText;
  private lock: WakeLockHandle | null = null;
  private gone = false;

  constructor() {
    afterNextRender(() => {
      this.done().nativeElement.focus();
      void this.keepAwake();
    });
    inject(DestroyRef).onDestroy(() => {
      this.gone = true;
      void this.lock?.release();
    });
  }

  protected close(): void {
    this.closed.emit();
  }

  protected record(): void {
    this.recorded.emit(this.weighed());
  }

  private async keepAwake(): Promise<void> {
    const wakeLock = (navigator as { wakeLock?: { request(type: 'screen'): Promise<WakeLockHandle> } }).wakeLock;
    try {
      const lock = await wakeLock?.request('screen');
      if (!lock) return;
      if (this.gone) return void lock.release();
      this.lock = lock;
      this.awake.set(true);
    } catch {
      // Refused (battery saver, a hidden tab): the weights still show; the screen may dim.
    }
  }
}
