import { Submission } from '../core/submission';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  DEFERENCE_NOTE,
  displayUnitsFor,
  isPourMaterialKind,
  MATERIAL_KINDS,
  MATERIAL_PRESETS,
  materialPatchSchema,
  MEASURE_WORDS,
  newMaterialSchema,
  safetyCautions,
  STOCK_DIMENSIONS,
  type DisplayUnits,
  type NewMaterial,
  type StockDimension,
} from '@benchtide/shared';
import { map, startWith } from 'rxjs';
import { parseDecimal } from '../core/decimal-input';
import { DevicePreferences } from '../core/device-preferences';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { DataSheetFields, dataSheetErrors } from '../pours/data-sheet-fields';
import { dataSheetFields, dataSheetFrom, fieldText, presetFields } from '../pours/pour-form';
import type { LocalMaterial } from '../sync/synced-records';
import { KIND_LABELS } from './container-row';
import { fieldMessages, keptOnceSet } from './field-messages';
import { ShelfStock } from './shelf-stock';

/** The material to edit, or null for a new one. */
export interface MaterialFormData {
  readonly material: LocalMaterial | null;
}

type MaterialKind = LocalMaterial['kind'];
type MaterialFields = Omit<NewMaterial, 'id'>;

/** A stand-in id for checking the fields; the real one is made when the material is saved. */
const CHECKING_ID = '00000000-0000-7000-8000-000000000000';

function text(value = ''): FormControl<string> {
  return new FormControl(value, { nonNullable: true });
}

function createMaterialForm(material: LocalMaterial | null, units: DisplayUnits) {
  const sheet = material?.dataSheet ? dataSheetFields(material.dataSheet, units) : null;
  return new FormGroup({
    name: text(material?.name ?? ''),
    kind: new FormControl<MaterialKind>(material?.kind ?? 'two-part-epoxy', { nonNullable: true }),
    measure: new FormControl<StockDimension>(material?.measure ?? 'count', { nonNullable: true }),
    shelfLifeDays: text(material?.shelfLifeOpenedDays ? fieldText(material.shelfLifeOpenedDays) : ''),
    safetySheet: text(material?.safetySheet ?? ''),
    basis: new FormControl<'volume' | 'weight'>(sheet?.basis ?? 'volume', { nonNullable: true }),
    partA: text(sheet?.partA),
    partB: text(sheet?.partB),
    densityA: text(sheet?.densityA),
    densityB: text(sheet?.densityB),
    maxLayer: text(sheet?.maxLayer),
    potLifeMin: text(sheet?.potLifeMin),
    recoatH: text(sheet?.recoatH),
    recoatMaxH: text(sheet?.recoatMaxH),
    demouldH: text(sheet?.demouldH),
    fullCureH: text(sheet?.fullCureH),
    referenceTemp: text(sheet?.referenceTemp),
    minCureTemp: text(sheet?.minCureTemp),
  });
}

/** Plain JSON compared by content, so an edit sends only the fields the modeller changed. */
function same(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  const keysA = Object.keys(a).filter((key) => (a as Record<string, unknown>)[key] !== undefined);
  const keysB = Object.keys(b).filter((key) => (b as Record<string, unknown>)[key] !== undefined);
  return (
    keysA.length === keysB.length &&
    keysA.every((key) => same((a as Record<string, unknown>)[key], (b as Record<string, unknown>)[key]))
  );
}

/**
 * A material on the shelf: its name and kind, its data sheet (started from typical values if the modeller
 * likes, then checked against the maker's sheet), how long it keeps once opened, and where its safety data
 * sheet is. Saved on this device when every value passes the shared schema; nothing is written before.
 */
@Component({
  selector: 'bt-material-form',
  providers: [ROOMY_FORM_FIELDS],
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    DataSheetFields,
  ],
  templateUrl: './material-form.html',
  styleUrl: './shelf-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MaterialForm {
  private readonly stock = inject(ShelfStock);
  private readonly dialogRef = inject<MatDialogRef<MaterialForm, boolean>>(MatDialogRef);
  private readonly preferences = inject(DevicePreferences);
  private readonly original = inject<MaterialFormData>(MAT_DIALOG_DATA).material;

  protected readonly editing = this.original !== null;
  protected readonly kinds = MATERIAL_KINDS.map((kind) => ({ kind, label: KIND_LABELS[kind] }));
  protected readonly measures = STOCK_DIMENSIONS.map((measure) => ({ measure, label: MEASURE_WORDS[measure] }));
  protected readonly presets = MATERIAL_PRESETS;
  protected readonly deference = DEFERENCE_NOTE;
  protected readonly units: DisplayUnits = {
    ...displayUnitsFor(this.preferences.values().unitSystem),
    temperature: this.preferences.values().temperatureUnit,
  };
  protected readonly form = createMaterialForm(this.original, this.units);
  protected readonly presetId = signal('');

  private readonly value = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  /** What is poured keeps its data sheet; an "other" material that had one keeps it too. */
  protected readonly poured = computed(
    () => isPourMaterialKind(this.value().kind) || (this.value().kind === 'other' && !!this.original?.dataSheet),
  );
  protected readonly cautions = computed(() => safetyCautions(this.value().kind));
  private readonly fields = computed<MaterialFields>(() => {
    const value = this.value();
    const poured = this.poured();
    const days = value.shelfLifeDays.trim() === '' ? undefined : (parseDecimal(value.shelfLifeDays) ?? Number.NaN);
    return {
      name: value.name,
      kind: value.kind,
      dataSheet: poured ? dataSheetFrom(value, this.units) : null,
      measure: poured ? null : value.measure,
      ...(days === undefined ? {} : { shelfLifeOpenedDays: days }),
      safetySheet: value.safetySheet,
    };
  });
  /**
   * For an edit, what changed, so another device's edit of another field is kept. The safety data sheet
   * always goes along: the shared patch schema reads a patch without it as one that empties it.
   */
  private readonly patch = computed(() => {
    const original = this.original;
    if (original === null) return null;
    const { safetySheet, ...fields } = this.fields();
    const changed = Object.entries(fields).filter(([key, value]) => !same(value, original[key as keyof LocalMaterial]));
    return changed.length === 0 && safetySheet === original.safetySheet
      ? {}
      : ({ ...Object.fromEntries(changed), safetySheet } as Partial<MaterialFields>);
  });
  private readonly messages = computed(() => {
    const patch = this.patch();
    const messages = fieldMessages(
      patch === null
        ? newMaterialSchema.safeParse({ id: CHECKING_ID, ...this.fields() })
        : materialPatchSchema.safeParse(patch),
    );
    if (this.original?.shelfLifeOpenedDays && this.value().shelfLifeDays.trim() === '') {
      messages.set('shelfLifeOpenedDays', keptOnceSet('Shelf life once opened', 'type the number of days instead'));
    }
    return messages;
  });
  private readonly submission = new Submission();
  protected readonly attempted = this.submission.attempted;
  protected readonly saving = this.submission.sending;
  protected readonly problem = this.submission.problemText;
  /** The schema's messages show once "Save" was pressed, and follow every change after. */
  protected readonly shown = computed(() => (this.attempted() ? this.messages() : new Map<string, string>()));
  protected readonly sheetErrors = computed(() => dataSheetErrors(this.shown(), 'dataSheet.'));

  protected message(path: string): string | undefined {
    return this.shown().get(path);
  }

  protected choosePreset(presetId: string): void {
    const preset = MATERIAL_PRESETS.find((candidate) => candidate.id === presetId);
    if (!preset) return;
    this.presetId.set(presetId);
    this.form.patchValue({ kind: preset.kind, ...presetFields(presetId, this.units) });
  }

  protected async save(): Promise<void> {
    const refused =
      this.messages().size > 0
        ? 'Some values need another look: see the notes beside the fields. Nothing was saved.'
        : null;
    const saved = await this.submission.save(
      async () => {
        const patch = this.patch();
        if (this.original === null) await this.stock.addMaterial(this.fields());
        else if (patch !== null && Object.keys(patch).length > 0)
          await this.stock.editMaterial(this.original.id, patch);
      },
      { refused, failed: 'The material could not be saved on this device.' },
    );
    if (saved) this.dialogRef.close(true);
  }
}
