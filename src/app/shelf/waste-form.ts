import { Submission } from '../core/submission';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { DEFERENCE_NOTE, safetyCautions, wasteSchema } from '@benchtide/shared';
import { map, startWith } from 'rxjs';
import { parseDecimal } from '../core/decimal-input';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { quantityText } from './container-row';
import { fieldMessages } from './field-messages';
import { ShelfStock } from './shelf-stock';
import { entryTitle, type StockEntryData } from './stock-entry-data';

/** Spilled, skinned over or gone off: an amount taken off a container's stock, with a note of why. */
@Component({
  selector: 'bt-waste-form',
  providers: [ROOMY_FORM_FIELDS],
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Record waste</h2>
    <form [formGroup]="form" (ngSubmit)="save()" aria-label="The waste">
      <mat-dialog-content>
        <p class="lead" data-field="what">{{ what }}</p>
        <mat-form-field class="wide">
          <mat-label>Amount wasted</mat-label>
          <input matInput inputmode="decimal" formControlName="amount" data-field="amount" />
          <span matTextSuffix>{{ unit }}</span>
          <mat-hint [class.field-error]="message('quantity')">{{
            message('quantity') ?? 'Left now: ' + left
          }}</mat-hint>
        </mat-form-field>
        @if (after(); as after) {
          <p class="worked" data-field="after" aria-live="polite">{{ after }}</p>
        }
        <mat-form-field class="wide">
          <mat-label>Note</mat-label>
          <input matInput formControlName="note" data-field="note" autocomplete="off" />
          <mat-hint [class.field-error]="message('note')">{{
            message('note') ?? 'Spilled, set in the cup, gone off…'
          }}</mat-hint>
        </mat-form-field>
        @if (disposal) {
          <p class="caution" data-field="caution">
            <mat-icon svgIcon="caution" aria-hidden="true" />
            <span>{{ disposal }} {{ deference }}</span>
          </p>
        }
      </mat-dialog-content>
      <mat-dialog-actions>
        @if (problem(); as problem) {
          <p class="problem" role="alert">{{ problem }}</p>
        }
        <button matButton type="button" mat-dialog-close>Cancel</button>
        <button matButton="filled" type="submit" [disabled]="saving()">
          {{ saving() ? 'Saving…' : 'Record waste' }}
        </button>
      </mat-dialog-actions>
    </form>
  `,
  styleUrl: './shelf-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WasteForm {
  private readonly stock = inject(ShelfStock);
  private readonly dialogRef = inject<MatDialogRef<WasteForm, boolean>>(MatDialogRef);
  private readonly data = inject<StockEntryData>(MAT_DIALOG_DATA);

  protected readonly unit = this.data.container.unit;
  protected readonly left = `${quantityText(this.data.remainingQty)} ${this.unit}`;
  protected readonly what = entryTitle(this.data);
  /** Uncured two-part resin is the waste that needs care. */
  protected readonly disposal =
    this.data.material.kind === 'two-part-epoxy'
      ? (safetyCautions('two-part-epoxy').find((caution) => caution.id === 'waste')?.text ?? null)
      : null;
  protected readonly deference = DEFERENCE_NOTE;
  protected readonly form = new FormGroup({
    amount: new FormControl('', { nonNullable: true }),
    note: new FormControl('', { nonNullable: true }),
  });

  private readonly value = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  private readonly entry = computed(() => ({
    quantity: parseDecimal(this.value().amount) ?? Number.NaN,
    note: this.value().note,
  }));
  private readonly messages = computed(() => fieldMessages(wasteSchema.omit({ id: true }).safeParse(this.entry())));
  protected readonly after = computed(() => {
    const { quantity } = this.entry();
    if (!Number.isFinite(quantity) || quantity <= 0) return null;
    const after = Math.round((this.data.remainingQty - quantity) * 1000) / 1000;
    return after < 0
      ? `That is more than the ${this.left} the shelf expects to be left; a stocktake puts the count right.`
      : `Leaves ${quantityText(after)} ${this.unit}`;
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
      this.messages().size > 0 ? 'The amount needs another look: see the note beside it. Nothing was saved.' : null;
    const saved = await this.submission.save(
      async () => {
        const { quantity, note } = this.entry();
        await this.stock.recordWaste(this.data.container.id, quantity, note);
      },
      { refused, failed: 'The waste could not be saved on this device.' },
    );
    if (saved) this.dialogRef.close(true);
  }
}
