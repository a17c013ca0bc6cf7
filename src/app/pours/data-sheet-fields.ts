import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { type FormControl, type FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { TEMPERATURE_LABELS, UNIT_LABELS, type DisplayUnits } from '@benchtide/shared';
import { map, startWith, switchMap } from 'rxjs';
import { parseDecimal } from '../core/decimal-input';

/** The controls of a material's data sheet, typed in display units (times in minutes and hours). */
export interface DataSheetControls {
  basis: FormControl<'volume' | 'weight'>;
  partA: FormControl<string>;
  partB: FormControl<string>;
  densityA: FormControl<string>;
  densityB: FormControl<string>;
  maxLayer: FormControl<string>;
  potLifeMin: FormControl<string>;
  recoatH: FormControl<string>;
  recoatMaxH: FormControl<string>;
  demouldH: FormControl<string>;
  fullCureH: FormControl<string>;
  referenceTemp: FormControl<string>;
  minCureTemp: FormControl<string>;
}

const DATA_SHEET_FIELDS = [
  'basis',
  'partA',
  'partB',
  'densityA',
  'densityB',
  'maxLayer',
  'potLifeMin',
  'recoatH',
  'recoatMaxH',
  'demouldH',
  'fullCureH',
  'referenceTemp',
  'minCureTemp',
];

function withDataSheetControls(group: FormGroup): FormGroup<DataSheetControls> {
  const missing = DATA_SHEET_FIELDS.filter((name) => !group.contains(name));
  if (missing.length > 0) throw new Error(`The data-sheet fields need the controls ${missing.join(', ')}.`);
  return group as FormGroup<DataSheetControls>;
}

/**
 * The messages about a data sheet, taken from a larger set by their prefix ("material." in a pour plan,
 * "dataSheet." in a material) and keyed by the data sheet's own paths ("mixRatio.partA", "densityAGPerMl").
 */
export function dataSheetErrors(errors: ReadonlyMap<string, string>, prefix: string): Map<string, string> {
  const within = new Map<string, string>();
  for (const [path, message] of errors) {
    if (path.startsWith(prefix)) within.set(path.slice(prefix.length), message);
  }
  return within;
}

/** The data sheet's mix ratio, densities, layer, times and temperatures, with the shared schema's messages. */
@Component({
  selector: 'bt-data-sheet-fields',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  templateUrl: './data-sheet-fields.html',
  styles: `
    :host {
      display: block;
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 12px;
    }
    .row mat-form-field {
      flex: 1 1 140px;
    }
    .field-error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DataSheetFields {
  /** Any form holding the data sheet's controls among its own. */
  readonly group = input.required({ transform: withDataSheetControls });
  readonly units = input.required<DisplayUnits>();
  /** Messages by the data sheet's paths ("mixRatio.partA", "densityAGPerMl"...). */
  readonly errors = input.required<ReadonlyMap<string, string>>();

  /** Part B's density is asked for only when the ratio has a part B. */
  protected readonly twoPart = toSignal(
    toObservable(this.group).pipe(
      switchMap((group) => group.controls.partB.valueChanges.pipe(startWith(group.controls.partB.value))),
      map((partB) => (parseDecimal(partB) ?? 0) > 0),
    ),
    { initialValue: false },
  );
  protected readonly labels = computed(() => ({
    length: UNIT_LABELS[this.units().length],
    temperature: TEMPERATURE_LABELS[this.units().temperature],
  }));

  protected error(path: string): string | undefined {
    return this.errors().get(path);
  }
}
