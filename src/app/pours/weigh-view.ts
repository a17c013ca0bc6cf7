import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  afterNextRender,
  inject,
  input,
  output,
  signal,
  type ElementRef,
  viewChild,
} from '@angular/core';

interface WakeLockHandle {
  release(): Promise<void>;
}

/**
 * What to put on the scale for one layer, in very large type, readable from arm's length with gloves on.
 * The screen is kept awake while it is open (where the browser allows), so it does not dim mid-pour.
 */
@Component({
  selector: 'bt-weigh-view',
  host: { '(document:keydown.escape)': 'close()' },
  template: `
    <div class="weigh" role="dialog" aria-modal="true" aria-labelledby="weigh-title">
      <h2 id="weigh-title">Weigh for each layer{{ layerCount() > 1 ? ' (' + layerCount() + ' layers)' : '' }}</h2>
      <p class="step">1. Tare the cup on the scale.</p>
      <p class="part" data-weigh="a">
        <span class="name">{{ partB() === null ? 'Medium' : 'Part A' }}</span>
        <span class="amount">{{ partA() }}</span>
      </p>
      @if (partB(); as partB) {
        <p class="step">2. Tare again, then add</p>
        <p class="part" data-weigh="b">
          <span class="name">Part B</span>
          <span class="amount">{{ partB }}</span>
        </p>
      }
      <p class="awake" role="status">{{ awake() ? 'The screen stays on while this is open.' : '' }}</p>
      <button #done type="button" class="done" (click)="close()">Done weighing</button>
    </div>
  `,
  styles: `
    .weigh {
      position: fixed;
      inset: 0;
      z-index: 10;
      display: flex;
      flex-direction: column;
      justify-content: center;
      gap: 12px;
      padding: 24px;
      background: var(--mat-sys-surface);
      color: var(--mat-sys-on-surface);
      overflow-y: auto;
    }
    h2 {
      margin: 0;
      font: var(--mat-sys-title-large);
    }
    .step {
      margin: 8px 0 0;
      color: var(--mat-sys-on-surface-variant);
      font-size: 1.25rem;
    }
    .part {
      display: flex;
      flex-direction: column;
      margin: 0;
    }
    .name {
      font-size: 1.5rem;
      font-weight: 600;
    }
    .amount {
      font-size: clamp(3.5rem, 18vw, 7rem);
      font-weight: 700;
      line-height: 1;
      font-variant-numeric: tabular-nums;
    }
    .awake {
      min-height: 1.5em;
      margin: 0;
      color: var(--mat-sys-on-surface-variant);
    }
    .done {
      min-height: 64px;
      border: none;
      border-radius: 32px;
      background: var(--mat-sys-primary);
      color: var(--mat-sys-on-primary);
      font: var(--mat-sys-title-medium);
      cursor: pointer;
    }
    .done:focus-visible {
      outline: 3px solid var(--mat-sys-tertiary);
      outline-offset: 3px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WeighView {
  /** Already formatted to what the modeller's scale can weigh, e.g. "84.2 g". */
  readonly partA = input.required<string>();
  /** Null for a single-part medium. */
  readonly partB = input.required<string | null>();
  readonly layerCount = input.required<number>();
  readonly closed = output<void>();

  private readonly done = viewChild.required<ElementRef<HTMLButtonElement>>('done');
  protected readonly awake = signal(false);
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
