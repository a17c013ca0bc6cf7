import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';

const WIDTH = 320;
const HEIGHT = 120;
const BASE = 18;

/** The pour seen from the side: its layers stacked in the order they go on. */
@Component({
  selector: 'bt-layer-diagram',
  template: `
    <svg [attr.viewBox]="'0 0 ' + width + ' ' + height" role="img" [attr.aria-label]="description()">
      <rect class="base" x="0" [attr.y]="height - base" [attr.width]="width" [attr.height]="base" />
      @for (layer of layers(); track layer.index) {
        <rect
          class="layer"
          [class.top]="layer.top"
          x="24"
          [attr.y]="layer.y"
          width="272"
          [attr.height]="layer.height"
        />
      }
      <line class="bank" x1="24" [attr.y1]="height - base" x2="24" [attr.y2]="8" />
      <line class="bank" x1="296" [attr.y1]="height - base" x2="296" [attr.y2]="8" />
    </svg>
  `,
  styles: `
    svg {
      width: 100%;
      max-width: 420px;
      display: block;
    }
    .base {
      fill: var(--mat-sys-outline);
    }
    .layer {
      fill: color-mix(in srgb, var(--mat-sys-primary) 45%, transparent);
      stroke: var(--mat-sys-surface);
      stroke-width: 1.5;
    }
    .layer.top {
      fill: color-mix(in srgb, var(--mat-sys-primary) 70%, transparent);
    }
    .bank {
      stroke: var(--mat-sys-on-surface-variant);
      stroke-width: 3;
      stroke-linecap: round;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LayerDiagram {
  readonly layerCount = input.required<number>();
  /** The whole depth as the modeller reads it, in their units. */
  readonly depth = input.required<string>();

  protected readonly width = WIDTH;
  protected readonly height = HEIGHT;
  protected readonly base = BASE;

  protected readonly layers = computed(() => {
    const count = Math.max(1, Math.min(this.layerCount(), 40));
    const available = HEIGHT - BASE - 12;
    const layerHeight = available / count;
    return Array.from({ length: count }, (_, index) => ({
      index,
      y: HEIGHT - BASE - layerHeight * (index + 1),
      height: layerHeight,
      top: index === count - 1,
    }));
  });

  protected readonly description = computed(
    () =>
      `Side view: ${this.layerCount()} ${this.layerCount() === 1 ? 'layer' : 'layers'} filling ${this.depth()} of depth`,
  );
}
