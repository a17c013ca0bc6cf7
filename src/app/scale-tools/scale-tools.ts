import { ChangeDetectionStrategy, Component, computed, inject, signal, untracked } from '@angular/core';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  compareScales,
  findScale,
  formatLength,
  formatNumber,
  gaugeAtScaleMm,
  modelToRealMm,
  PROTOTYPE_GAUGES,
  realToModelMm,
  toMm,
  type ScaleEntry,
} from '@benchtide/shared';
import { inputText, lengthText, parseDecimal } from '../core/decimal-input';
import { DevicePreferences } from '../core/device-preferences';
import { UnitSystemToggle } from '../core/unit-system-toggle';
import { FootprintComparison } from './footprint-comparison';
import { ScalePicker } from './scale-picker';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

type Side = 'real' | 'model';

@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-scale-tools',
  imports: [
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ScalePicker,
    FootprintComparison,
    UnitSystemToggle,
  ],
  templateUrl: './scale-tools.html',
  styleUrl: './scale-tools.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScaleTools {
  private readonly preferences = inject(DevicePreferences);

  protected readonly realUnit = computed(() => (this.preferences.values().unitSystem === 'imperial' ? 'ft' : 'm'));
  protected readonly modelUnit = computed(() => (this.preferences.values().unitSystem === 'imperial' ? 'in' : 'mm'));

  protected readonly scale = signal<ScaleEntry | null>(findScale('ho')!);
  private readonly realMm = signal<number | null>(10_000);
  private readonly modelMm = computed(() => {
    const realMm = this.realMm();
    const scale = this.scale();
    return realMm === null || scale === null ? null : realToModelMm(realMm, scale.ratio);
  });
  /** The field being typed in keeps the modeller's own text; the other one follows. */
  private readonly editing = signal<{ side: Side; text: string } | null>(null);

  protected readonly realText = computed(() => this.fieldText('real'));
  protected readonly modelText = computed(() => this.fieldText('model'));

  protected readonly realFigureMm = signal<number | null>(1750);
  /** Rewritten only when the units change, to the same height in the new unit; typing never rewrites it. */
  protected readonly realFigureText = computed(() => lengthText(untracked(this.realFigureMm), this.realUnit()));
  protected readonly figureAtScale = computed(() => {
    const realMm = this.realFigureMm();
    const scale = this.scale();
    return realMm === null || scale === null ? '—' : formatLength(realToModelMm(realMm, scale.ratio), this.modelUnit());
  });

  protected readonly prototypeGauges = PROTOTYPE_GAUGES;
  protected readonly prototypeGaugeId = signal('standard');
  protected readonly gauge = computed(() => {
    const prototype = PROTOTYPE_GAUGES.find((entry) => entry.id === this.prototypeGaugeId()) ?? PROTOTYPE_GAUGES[0]!;
    const scale = this.scale();
    if (scale === null) return { trueScale: '—', standardTrack: null, source: prototype.source };
    return {
      trueScale: formatLength(gaugeAtScaleMm(prototype.gaugeMm, scale.ratio), this.modelUnit()),
      standardTrack:
        prototype.id === 'standard' && scale.gaugeMm !== undefined
          ? formatLength(scale.gaugeMm, this.modelUnit())
          : null,
      source: prototype.source,
    };
  });

  protected readonly largerScale = signal<ScaleEntry | null>(findScale('fig-35')!);
  protected readonly smallerScale = signal<ScaleEntry | null>(findScale('n')!);
  protected readonly comparison = computed(() => {
    const larger = this.largerScale();
    const smaller = this.smallerScale();
    if (larger === null || smaller === null) return null;
    const { lengthFactor, volumeFactor } = compareScales(larger.ratio, smaller.ratio);
    return {
      larger: larger.name,
      smaller: smaller.name,
      length: formatNumber(lengthFactor, { significant: 3 }),
      volume: formatNumber(volumeFactor, { significant: 3 }),
    };
  });

  protected typeLength(side: Side, event: Event): void {
    const text = inputText(event);
    const value = parseDecimal(text);
    this.editing.set({ side, text });
    if (value === null || value < 0) {
      this.realMm.set(null);
      return;
    }
    if (side === 'real') {
      this.realMm.set(toMm(value, this.realUnit()));
      return;
    }
    // Without a readable scale a model length says nothing about the real one.
    const scale = this.scale();
    if (scale !== null) this.realMm.set(modelToRealMm(toMm(value, this.modelUnit()), scale.ratio));
  }

  protected stopEditing(): void {
    this.editing.set(null);
  }

  protected typeFigure(event: Event): void {
    const value = parseDecimal(inputText(event));
    this.realFigureMm.set(value === null || value <= 0 ? null : toMm(value, this.realUnit()));
  }

  protected readonly lengthError = computed(() =>
    this.realMm() === null && this.editing() !== null ? 'Type a length of 0 or more' : null,
  );

  private fieldText(side: Side): string {
    const editing = this.editing();
    if (editing?.side === side) return editing.text;
    return side === 'real' ? lengthText(this.realMm(), this.realUnit()) : lengthText(this.modelMm(), this.modelUnit());
  }
}
