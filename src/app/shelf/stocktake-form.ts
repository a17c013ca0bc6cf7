import { Submission } from '../core/submission';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { stocktakeAdjustment, stocktakeSchema } from '@benchtide/shared';
import { map, startWith } from 'rxjs';
import { parseDecimal } from '../core/decimal-input';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { quantityText } from './container-row';
import { fieldMessages } from './field-messages';
import { ShelfStock } from './shelf-stock';
import { entryTitle, type StockEntryData } from './stock-entry-data';

/** "−5.5 g", "+2 g": the sign always shown, a true minus sign for the eye. */
function signedQuantity(quantity: number, unit: string): string {
  const sign = quantity > 0 ? '+' : quantity < 0 ? '−' : '';
  return `${sign}${quantityText(Math.abs(quantity))} ${unit}`;
}

/** What is really left in a container, weighed or read off the side: the stock book takes the difference. */
@Component({
  selector: 'bt-stocktake-form',
  providers: [ROOMY_FORM_FIELDS],
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Stocktake</h2>
    <form [formGroup]="form" (ngSubmit)="save()" aria-label="The count">
      <mat-dialog-content>
        <p class="lead" data-field="what">{{ what }}</p>
        <mat-form-field class="wide">
          <mat-label>Counted</mat-label>
          <input matInput inputmode="decimal" formControlName="counted" data-field="counted" />
          <span matTextSuffix>{{ unit }}</span>
          <mat-hint [class.field-error]="message('countedQty')">{{
            message('countedQty') ?? 'What is really left, without the container'
          }}</mat-hint>
        </mat-form-field>
        <p class="worked" data-field="difference" aria-live="polite">{{ difference() }}</p>
      </mat-dialog-content>
      <mat-dialog-actions>
        @if (problem(); as problem) {
          <p class="problem" role="alert">{{ problem }}</p>
        }
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <button matButton="filled" type="submit" [disabled]="saving()">
          {{ saving() ? 'Saving…' : 'Record count' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: './shelf-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StocktakeForm {
  private readonly stock = inject(ShelfStock);
  private readonly dialogRef = inject<MatDialogRef<StocktakeForm, boolean>>(MatDialogRef);
  private readonly data = inject<StockEntryData>(MAT_DIALOG_DATA);

  protected readonly unit = this.data.container.unit;
  protected readonly expected = `${quantityText(this.data.remainingQty)} ${this.unit}`;
  protected readonly what = entryTitle(this.data);
  protected readonly form = new FormGroup({ counted: new FormControl('', { nonNullable: true }) });

  private readonly counted = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => parseDecimal(this.form.getRawValue().counted) ?? Number.NaN),
    ),
    { requireSync: true },
  );
  private readonly messages = computed(() =>
    fieldMessages(stocktakeSchema.omit({ id: true }).safeParse({ countedQty: this.counted() })),
  );
  /** The entry the count will make, worked out as the stock book will: counted − expected. */
  protected readonly difference = computed(() => {
    const counted = this.counted();
    if (!Number.isFinite(counted) || counted < 0) return `The shelf expects ${this.expected}.`;
    const change = stocktakeAdjustment(counted, this.data.remainingQty);
    return change === 0
      ? `The shelf expects ${this.expected}: the count matches.`
      : `The shelf expects ${this.expected}: this records ${signedQuantity(change, this.unit)}.`;
  });
  private readonly submission = new Submission();
  protected readonly attempted = this.submission.attempted;
  protected readonly saving = this.submission.sending;
  protected readonly problem = this.submission.problemText;

  protected message(path: string): string | undefined {
    return this.attempted() ? this.messages().get(path) : undefined;
  }

  protected async save(): Promise<void> {
    const refused =
      this.messages().size > 0 ? 'The count needs another look: see the note beside it. Nothing was saved.' : null;
    const saved = await this.submission.save(
      async () => {
        await this.stock.recordStocktake(this.data.container.id, this.counted());
      },
      { refused, failed: 'The count could not be saved on this device.' },
    );
    if (saved) this.dialogRef.close(true);
  }
}
