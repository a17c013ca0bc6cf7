import { ChangeDetectionStrategy, Component, computed, input, signal, untracked } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  baseForFootprint,
  formatLength,
  formatNumber,
  STANDARD_SCALES,
  toMm,
  type LengthUnit,
} from '@benchtide/shared';
import { inputText, lengthText, parseDecimal } from '../core/decimal-input';

const DRAWING_WIDTH = 360;
const DRAWING_GAP = 16;
const LABEL_SPACE = 34;

/** One real scene, the base it needs at several scales, in a table and drawn to relative size. */
@Component({
  selector: 'bt-footprint-comparison',
  imports: [MatCardModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  templateUrl: './footprint-comparison.html',
  styleUrl: './footprint-comparison.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FootprintComparison {
  readonly realUnit = input.required<LengthUnit>();
  readonly modelUnit = input.required<LengthUnit>();

  protected readonly scales = STANDARD_SCALES;
  protected readonly chosenIds = signal<string[]>(['n', 'ho', 'o-na', 'fig-35']);
  protected readonly realWidthMm = signal<number | null>(40_000);
  protected readonly realDepthMm = signal<number | null>(12_000);
  // Rewritten only when the units change, to the same real size in the new unit; typing never rewrites them.
  protected readonly realWidthText = computed(() => lengthText(untracked(this.realWidthMm), this.realUnit()));
  protected readonly realDepthText = computed(() => lengthText(untracked(this.realDepthMm), this.realUnit()));

  protected readonly bases = computed(() => {
    const width = this.realWidthMm();
    const depth = this.realDepthMm();
    if (width === null || depth === null) return [];
    const chosen = STANDARD_SCALES.filter((scale) => this.chosenIds().includes(scale.id)).sort(
      (a, b) => a.ratio - b.ratio,
    );
    const sizes = baseForFootprint(
      { realWidthMm: width, realDepthMm: depth },
      chosen.map((scale) => scale.ratio),
    );
    return chosen.map((scale, index) => ({ scale, ...sizes[index]! }));
  });

  protected readonly rows = computed(() =>
    this.bases().map((base) => ({
      id: base.scale.id,
      name: base.scale.name,
      // Figure scales are named by their ratio already.
      showRatio: !base.scale.name.startsWith('1:'),
      ratio: formatNumber(base.scale.ratio, { significant: 4, maxDecimals: 1 }),
      size: `${formatLength(base.widthMm, this.modelUnit())} × ${formatLength(base.depthMm, this.modelUnit())}`,
    })),
  );

  /** Every base at the same drawing scale, side by side, standing on one line. */
  protected readonly drawing = computed(() => {
    const bases = this.bases();
    const totalMm = bases.reduce((sum, base) => sum + base.widthMm, 0);
    if (totalMm <= 0) return null;
    const pxPerMm = (DRAWING_WIDTH - DRAWING_GAP * (bases.length - 1)) / totalMm;
    const tallest = Math.max(...bases.map((base) => base.depthMm * pxPerMm));
    let x = 0;
    const rects = bases.map((base) => {
      const rect = {
        id: base.scale.id,
        x,
        y: tallest - base.depthMm * pxPerMm,
        width: base.widthMm * pxPerMm,
        height: base.depthMm * pxPerMm,
        label: base.scale.name,
      };
      x += rect.width + DRAWING_GAP;
      return rect;
    });
    return { rects, height: tallest + LABEL_SPACE, labelY: tallest + 22 };
  });

  protected typeReal(which: 'width' | 'depth', event: Event): void {
    const value = parseDecimal(inputText(event));
    const mm = value === null || value <= 0 ? null : toMm(value, this.realUnit());
    (which === 'width' ? this.realWidthMm : this.realDepthMm).set(mm);
  }
}
