import { ChangeDetectionStrategy, Component, computed, input, linkedSignal, model, signal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { customScale, isValidRatio, STANDARD_SCALES, type ScaleEntry } from '@benchtide/shared';
import { inputText, parseDecimal } from '../core/decimal-input';

const CUSTOM = 'custom';

/** Choose a standard scale, or type 1:N for any other. */
@Component({
  selector: 'bt-scale-picker',
  imports: [MatFormFieldModule, MatSelectModule, MatInputModule],
  templateUrl: './scale-picker.html',
  styles: `
    :host {
      display: flex;
      flex-wrap: wrap;
      gap: 0 12px;
    }
    mat-form-field {
      flex: 1 1 160px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScalePicker {
  readonly label = input('Scale');
  /** Null while the modeller's own 1:N cannot be read, so that no number is worked from it. */
  readonly scale = model.required<ScaleEntry | null>();

  protected readonly railway = STANDARD_SCALES.filter((entry) => entry.family === 'railway');
  protected readonly militaryFigure = STANDARD_SCALES.filter((entry) => entry.family === 'military-figure');
  protected readonly custom = CUSTOM;
  protected readonly selectedId = computed(() => {
    const scale = this.scale();
    return scale === null || scale.family === 'custom' ? CUSTOM : scale.id;
  });
  /** Follows the scale, but keeps the last readable ratio so the field never overwrites what is being typed. */
  protected readonly ratioText = linkedSignal<ScaleEntry | null, string>({
    source: this.scale,
    computation: (scale, previous) => (scale === null ? (previous?.value ?? '') : String(scale.ratio)),
  });
  protected readonly customError = signal<string | null>(null);

  protected choose(id: string): void {
    const standard = STANDARD_SCALES.find((entry) => entry.id === id);
    const current = this.scale();
    // Other 1:N starts from the scale chosen before.
    const next = standard ?? (current && customScale(current.ratio));
    if (!next) return;
    this.customError.set(null);
    this.scale.set(next);
  }

  protected typeRatio(event: Event): void {
    const ratio = parseDecimal(inputText(event));
    if (ratio === null || !isValidRatio(ratio)) {
      this.customError.set('Type N of 1:N, a number above 0 (for example 100 for 1:100)');
      this.scale.set(null);
      return;
    }
    this.customError.set(null);
    this.scale.set(customScale(ratio));
  }
}
