import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';

export interface RemovalConfirmData {
  readonly title: string;
  /** What goes and what stays, in a sentence or two. */
  readonly text: string;
}

/** Asks once more before something is taken off the shelf; closes with true to go ahead. */
@Component({
  selector: 'bt-removal-confirm',
  imports: [MatButtonModule, MatDialogModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <p data-field="consequence">{{ data.text }}</p>
    </mat-dialog-content>
    <mat-dialog-actions>
      <button matButton type="button" [mat-dialog-close]="false">Keep it</button>
      <button matButton="filled" type="button" class="delete" [mat-dialog-close]="true">Delete</button>
    </mat-dialog-actions>
  `,
  styles: `
    mat-dialog-actions {
      gap: 8px;
      --mat-button-filled-container-height: 48px;
      --mat-button-text-container-height: 48px;
    }
    .delete {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RemovalConfirm {
  protected readonly data = inject<RemovalConfirmData>(MAT_DIALOG_DATA);
}
