import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
  type OnInit,
} from '@angular/core';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  TEMPERATURE_LABELS,
  UNIT_LABELS,
  displayUnitsFor,
  fromCelsius,
  fromG,
  pourLayerPatchSchema,
  toCelsius,
  toG,
  type DisplayUnits,
  type PourLayerPatch,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { DevicePreferences } from '../core/device-preferences';
import { parseDecimal } from '../core/decimal-input';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { Submission } from '../core/submission';
import { LayerRefusedError } from '../sync/offline-store';
import type { LocalPourLayer } from '../sync/synced-records';
import { BuildLog } from './build-log';

const LOCAL_MINUTE = "yyyy-MM-dd'T'HH:mm";
type LayerField = 'pouredAt' | 'roomTemp' | 'weighedA' | 'weighedB' | 'note';
/** The store's and the schema's names for the fields, as this form names them. */
const FIELD_OF: Readonly<Record<string, LayerField>> = {
  pouredAt: 'pouredAt',
  roomTempC: 'roomTemp',
  weighedAG: 'weighedA',
  weighedBG: 'weighedB',
  note: 'note',
};

function text(value: string): FormControl<string> {
  return new FormControl(value, { nonNullable: true });
}

function number(typed: string): number {
  return parseDecimal(typed) ?? Number.NaN;
}

/**
 * Corrects a pour after it was poured: its note, and for each layer on, the time it really went on, the
 * room, what was weighed and its note. Only what was changed is saved; every later moment is re-timed.
 */
@Component({
  selector: 'bt-pour-correction',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatInputModule],
  providers: [ROOMY_FORM_FIELDS],
  templateUrl: './pour-correction.html',
  styles: `
    :host {
      display: block;
    }
    fieldset {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 8px;
      margin: 0 0 12px;
      padding: 8px 12px;
    }
    legend {
      font-weight: 600;
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
    .field-error,
    .problem {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourCorrection implements OnInit {
  private readonly log = inject(BuildLog);
  private readonly preferences = inject(DevicePreferences);

  readonly pourId = input.required<string>();
  readonly note = input.required<string>();
  /** The layers on, lowest first. */
  readonly layers = input.required<readonly LocalPourLayer[]>();
  readonly singlePart = input(false);
  readonly done = output<void>();

  protected readonly units = computed<DisplayUnits>(() => {
    const { unitSystem, temperatureUnit } = this.preferences.values();
    return { ...displayUnitsFor(unitSystem), temperature: temperatureUnit };
  });
  protected readonly labels = computed(() => ({
    temperature: TEMPERATURE_LABELS[this.units().temperature],
    mass: UNIT_LABELS[this.units().mass],
  }));
  protected readonly form = new FormGroup({
    note: text(''),
    layers: new FormArray<FormGroup<Record<LayerField, FormControl<string>>>>([]),
  });
  /** Each layer's fields as first shown: only a field typed over is saved. */
  private shown: Record<LayerField, string>[] = [];
  protected readonly errors = signal<ReadonlyMap<string, string>>(new Map());
  private readonly submission = new Submission();
  protected readonly saving = this.submission.sending;
  protected readonly problem = this.submission.problemText;

  ngOnInit(): void {
    this.form.controls.note.setValue(this.note());
    this.shown = this.layers().map((layer) => this.fieldsOf(layer));
    for (const fields of this.shown) {
      const group = new FormGroup({
        pouredAt: text(fields.pouredAt),
        roomTemp: text(fields.roomTemp),
        weighedA: text(fields.weighedA),
        weighedB: text(fields.weighedB),
        note: text(fields.note),
      });
      this.form.controls.layers.push(group);
    }
  }

  protected error(index: number, field: LayerField): string | undefined {
    return this.errors().get(`${index}.${field}`);
  }

  protected async save(): Promise<void> {
    const patches: { layer: LocalPourLayer; index: number; patch: PourLayerPatch }[] = [];
    const errors = new Map<string, string>();
    this.layers().forEach((layer, index) => {
      const patch = this.patchOf(index);
      if (Object.keys(patch).length === 0) return;
      const checked = pourLayerPatchSchema.safeParse(patch);
      if (!checked.success) {
        for (const issue of checked.error.issues) {
          const field = FIELD_OF[String(issue.path[0] ?? '')];
          if (field !== undefined && !errors.has(`${index}.${field}`)) errors.set(`${index}.${field}`, issue.message);
        }
        return;
      }
      patches.push({ layer, index, patch });
    });
    this.errors.set(errors);
    const note = this.form.controls.note.value;
    const saved = await this.submission.save(
      async () => {
        for (const { layer, index, patch } of patches) {
          try {
            await this.log.correctLayer(layer.id, patch);
          } catch (error) {
            const field = error instanceof LayerRefusedError ? FIELD_OF[error.field] : undefined;
            if (field !== undefined) this.errors.set(new Map([[`${index}.${field}`, (error as Error).message]]));
            throw error;
          }
        }
        if (note !== this.note()) await this.log.correctPourNote(this.pourId(), note);
      },
      {
        refused:
          errors.size > 0 ? 'Some values need another look: see the notes under the fields. Nothing was saved.' : null,
        failed: 'This device could not save the correction. Nothing was lost from the form: try again.',
      },
    );
    if (saved) this.done.emit();
  }

  private fieldsOf(layer: LocalPourLayer): Record<LayerField, string> {
    const units = this.units();
    const trimmed = (value: number) => String(Math.round(value * 1000) / 1000);
    const grams = (g: number | null) => (g === null ? '' : trimmed(fromG(g, units.mass)));
    return {
      pouredAt: format(Date.parse(layer.pouredAt), LOCAL_MINUTE),
      roomTemp: trimmed(fromCelsius(layer.roomTempC, units.temperature)),
      weighedA: grams(layer.weighedAG),
      weighedB: grams(layer.weighedBG),
      note: layer.note,
    };
  }

  /** What was typed over, as the store takes it (SI, ISO times, null for a weighed amount cleared). */
  private patchOf(index: number): PourLayerPatch {
    const typed = this.form.controls.layers.at(index).getRawValue();
    const shown = this.shown[index]!;
    const units = this.units();
    const changed = (field: LayerField) => typed[field] !== shown[field];
    const grams = (value: string) => (value.trim() === '' ? null : toG(number(value), units.mass));
    const patch: PourLayerPatch = {};
    if (changed('pouredAt')) {
      const atMs = new Date(typed.pouredAt).getTime();
      patch.pouredAt = Number.isFinite(atMs) ? new Date(atMs).toISOString() : typed.pouredAt;
    }
    if (changed('roomTemp')) patch.roomTempC = toCelsius(number(typed.roomTemp), units.temperature);
    // Both parts go together: the store refuses a two-part mix weighed for one part only.
    if (changed('weighedA') || changed('weighedB')) {
      patch.weighedAG = grams(typed.weighedA);
      patch.weighedBG = this.singlePart() ? null : grams(typed.weighedB);
    }
    if (changed('note')) patch.note = typed.note;
    return patch;
  }
}
