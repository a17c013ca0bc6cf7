import { Submission } from '../core/submission';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import {
  CONTAINER_PARTS,
  containerPatchSchema,
  newContainerSchema,
  containerUnitProblem,
  stockUnitsOf,
  unitLabel,
  type ContainerPart,
  type NewContainer,
  type StockUnit,
} from '@benchtide/shared';
import { map, startWith } from 'rxjs';
import { parseDecimal } from '../core/decimal-input';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { fieldText } from '../pours/pour-form';
import type { LocalContainer, LocalMaterial } from '../sync/synced-records';
import { dayText, localDay, PART_LABELS, quantityText } from './container-row';
import { fieldMessages, keptOnceSet } from './field-messages';
import { ShelfStock } from './shelf-stock';

export interface ContainerFormData {
  readonly material: LocalMaterial;
  /** The container to edit, or null for a new one. */
  readonly container: LocalContainer | null;
  /** Where a new container's currency starts: the last one added, or the usual one. */
  readonly currency: string;
}

type ContainerFields = Omit<NewContainer, 'id'>;
type ContainerPatch = Partial<
  Pick<ContainerFields, 'openedOn' | 'useBy' | 'lot' | 'lowStockQty' | 'priceMinor' | 'currency'>
>;

const PRICE_NEEDED = 'Type the price paid, such as 12.50, or 0 if it cost nothing';

function text(value = ''): FormControl<string> {
  return new FormControl(value, { nonNullable: true });
}

/**
 * Money typed as a decimal, in whole cents. A price finer than a cent is left as it is, for the shared
 * schema to refuse in its own words; null when nothing readable was typed.
 */
function priceMinorOf(typed: string): number | null {
  const price = parseDecimal(typed);
  if (price === null) return null;
  const cents = price * 100;
  const whole = Math.round(cents);
  return Math.abs(cents - whole) < 1e-6 ? whole : cents;
}

function optionalNumber(typed: string): number | undefined {
  return typed.trim() === '' ? undefined : (parseDecimal(typed) ?? Number.NaN);
}

/**
 * A container on the shelf: a new one as bought (part, size, price, dates, lot, low-stock level), or the
 * details of one that change while it stands there (opened, use-by, lot, low-stock level, price).
 */
@Component({
  selector: 'bt-container-form',
  providers: [ROOMY_FORM_FIELDS],
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
  ],
  templateUrl: './container-form.html',
  styleUrl: './shelf-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ContainerForm {
  private readonly stock = inject(ShelfStock);
  private readonly dialogRef = inject<MatDialogRef<ContainerForm, boolean>>(MatDialogRef);
  private readonly data = inject<ContainerFormData>(MAT_DIALOG_DATA);

  protected readonly material = this.data.material;
  protected readonly original = this.data.container;
  protected readonly parts = CONTAINER_PARTS.map((part) => ({ part, label: PART_LABELS[part] }));
  /** The units that fit the material: weight or volume for what is poured, its own measure for the rest. */
  protected readonly stockUnits = this.material.dataSheet
    ? [...stockUnitsOf('mass'), ...stockUnitsOf('volume')]
    : stockUnitsOf(this.material.measure ?? 'count');
  protected readonly unitLabel = unitLabel;
  protected readonly form = new FormGroup({
    part: new FormControl<ContainerPart>(this.material.kind === 'two-part-epoxy' ? 'A' : 'single', {
      nonNullable: true,
    }),
    size: text(),
    unit: new FormControl<StockUnit>(this.stockUnits[0] ?? 'g', { nonNullable: true }),
    price: text(this.original ? fieldText(this.original.priceMinor / 100) : ''),
    currency: text(this.original?.currency ?? this.data.currency),
    boughtOn: text(localDay()),
    openedOn: text(this.original?.openedOn ?? ''),
    useBy: text(this.original?.useBy ?? ''),
    lot: text(this.original?.lot ?? ''),
    lowStock: text(this.original?.lowStockQty == null ? '' : fieldText(this.original.lowStockQty)),
  });
  /** What is being edited, in a line. */
  protected readonly title = this.original
    ? `${PART_LABELS[this.original.part]}, ${quantityText(this.original.sizeQty)} ${unitLabel(this.original.unit)} bought ${dayText(this.original.boughtOn)}`
    : this.material.name;

  private readonly value = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  protected readonly unit = computed(() => unitLabel(this.original?.unit ?? this.value().unit));
  private readonly fields = computed<ContainerFields>(() => {
    const value = this.value();
    const lowStockQty = optionalNumber(value.lowStock);
    return {
      materialId: this.material.id,
      part: value.part,
      sizeQty: parseDecimal(value.size) ?? Number.NaN,
      unit: value.unit,
      priceMinor: priceMinorOf(value.price) ?? Number.NaN,
      currency: value.currency.trim().toUpperCase(),
      boughtOn: value.boughtOn,
      ...(value.openedOn === '' ? {} : { openedOn: value.openedOn }),
      ...(value.useBy === '' ? {} : { useBy: value.useBy }),
      ...(value.lot.trim() === '' ? {} : { lot: value.lot }),
      ...(lowStockQty === undefined ? {} : { lowStockQty }),
    };
  });
  /** For an edit, only what changed: another device's edit of another field is kept. */
  private readonly patch = computed<ContainerPatch | null>(() => {
    const original = this.original;
    if (original === null) return null;
    const fields = this.fields();
    const patch: ContainerPatch = {};
    if (fields.openedOn !== undefined && fields.openedOn !== original.openedOn) patch.openedOn = fields.openedOn;
    if (fields.useBy !== undefined && fields.useBy !== original.useBy) patch.useBy = fields.useBy;
    if ((fields.lot ?? '') !== (original.lot ?? '')) patch.lot = fields.lot ?? '';
    if (fields.lowStockQty !== undefined && fields.lowStockQty !== original.lowStockQty) {
      patch.lowStockQty = fields.lowStockQty;
    }
    if (fields.priceMinor !== original.priceMinor) patch.priceMinor = fields.priceMinor;
    if (fields.currency !== original.currency) patch.currency = fields.currency;
    return patch;
  });
  private readonly messages = computed(() => {
    const patch = this.patch();
    const messages = fieldMessages(
      patch === null
        ? newContainerSchema.omit({ id: true }).safeParse(this.fields())
        : containerPatchSchema.safeParse(patch),
    );
    const value = this.value();
    if (priceMinorOf(value.price) === null) messages.set('priceMinor', PRICE_NEEDED);
    const misfit = this.original ? null : containerUnitProblem(this.material, value.unit);
    if (misfit) messages.set('unit', misfit);
    const original = this.original;
    if (original?.openedOn && value.openedOn === '') {
      messages.set('openedOn', keptOnceSet('Opened on', 'correct the date instead'));
    }
    if (original?.useBy && value.useBy === '') messages.set('useBy', keptOnceSet('Use by', 'correct the date instead'));
    if (original?.lowStockQty != null && value.lowStock.trim() === '') {
      messages.set('lowStockQty', keptOnceSet('Low-stock level', 'type 0 to hear only when it is empty'));
    }
    return messages;
  });
  private readonly submission = new Submission();
  protected readonly attempted = this.submission.attempted;
  protected readonly saving = this.submission.sending;
  protected readonly problem = this.submission.problemText;
  /** The schema's messages show once "Save" was pressed, and follow every change after. */
  private readonly shown = computed(() => (this.attempted() ? this.messages() : new Map<string, string>()));

  protected message(path: string): string | undefined {
    return this.shown().get(path);
  }

  protected async save(): Promise<void> {
    const refused =
      this.messages().size > 0
        ? 'Some values need another look: see the notes beside the fields. Nothing was saved.'
        : null;
    const saved = await this.submission.save(
      async () => {
        const patch = this.patch();
        if (this.original === null) await this.stock.addContainer(this.fields());
        else if (patch !== null && Object.keys(patch).length > 0)
          await this.stock.editContainer(this.original.id, patch);
      },
      { refused, failed: 'The container could not be saved on this device.' },
    );
    if (saved) this.dialogRef.close(true);
  }
}
