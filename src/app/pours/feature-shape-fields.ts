import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { type FormControl, type FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { UNIT_LABELS, type DisplayUnits } from '@benchtide/shared';
import { startWith, switchMap } from 'rxjs';
import { areaUnitFor, type ShapeKind } from './pour-form';

/** The controls that describe the water feature: its shape, size and depth, typed in display units. */
export interface FeatureShapeControls {
  shapeKind: FormControl<ShapeKind>;
  length: FormControl<string>;
  width: FormControl<string>;
  diameter: FormControl<string>;
  area: FormControl<string>;
  outline: FormControl<string>;
  depth: FormControl<string>;
  displaced: FormControl<string>;
  wastePercent: FormControl<string>;
}

const SHAPES: readonly { kind: ShapeKind; label: string }[] = [
  { kind: 'rectangle', label: 'Rectangle' },
  { kind: 'circle', label: 'Circle' },
  { kind: 'ellipse', label: 'Oval' },
  { kind: 'polygon', label: 'Traced outline' },
  { kind: 'area', label: 'Area I know' },
];

const FEATURE_FIELDS = [
  'shapeKind',
  'length',
  'width',
  'diameter',
  'area',
  'outline',
  'depth',
  'displaced',
  'wastePercent',
];

function withFeatureControls(group: FormGroup): FormGroup<FeatureShapeControls> {
  const missing = FEATURE_FIELDS.filter((name) => !group.contains(name));
  if (missing.length > 0) throw new Error(`The feature fields need the controls ${missing.join(', ')}.`);
  return group as FormGroup<FeatureShapeControls>;
}

/** Shape, size and depth of a water feature, with the shared maths' messages beside each field. */
@Component({
  selector: 'bt-feature-shape-fields',
  imports: [ReactiveFormsModule, MatChipsModule, MatFormFieldModule, MatInputModule],
  templateUrl: './feature-shape-fields.html',
  styles: `
    :host {
      display: block;
    }
    .shapes {
      display: block;
      margin-bottom: 16px;
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 12px;
    }
    .row mat-form-field {
      flex: 1 1 140px;
    }
    .wide {
      width: 100%;
    }
    .field-error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FeatureShapeFields {
  /** Any form holding the feature's controls among its own. */
  readonly group = input.required({ transform: withFeatureControls });
  readonly units = input.required<DisplayUnits>();
  /** Messages by the shared request's paths ("shape.lengthMm", "depthMm"...). */
  readonly errors = input.required<ReadonlyMap<string, string>>();

  protected readonly shapes = SHAPES;
  protected readonly shapeKind = toSignal(
    toObservable(this.group).pipe(
      switchMap((group) => group.controls.shapeKind.valueChanges.pipe(startWith(group.controls.shapeKind.value))),
    ),
    { initialValue: 'rectangle' as ShapeKind },
  );
  protected readonly labels = computed(() => ({
    length: UNIT_LABELS[this.units().length],
    volume: UNIT_LABELS[this.units().volume],
    area: areaUnitFor(this.units()).label,
  }));

  protected error(path: string): string | undefined {
    return this.errors().get(path);
  }
}
