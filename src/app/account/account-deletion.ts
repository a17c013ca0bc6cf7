import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { deleteAccountRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { ROLE_LABELS } from '../workshop/roles';
import { AccountSession } from '../core/account-session';
import { AccountSettings } from './account-settings';
import { PasswordField } from './password-field';

/** Deleting the account, in two steps: what happens to each workshop is said before the password is asked. */
@Component({
  selector: 'bt-account-deletion',
  imports: [ReactiveFormsModule, MatButtonModule, MatCardModule, MatProgressBarModule, PasswordField, ProblemNote],
  templateUrl: './account-deletion.html',
  styles: `
    .danger {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AccountDeletion {
  private readonly session = inject(AccountSession);
  private readonly settings = inject(AccountSettings);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly workshops = this.session.workshops;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly confirming = signal(false);
  protected readonly form = this.formBuilder.group({ password: '' });
  protected readonly submission = new Submission(this.form);

  protected cancel(): void {
    this.confirming.set(false);
    this.form.reset();
    this.submission.clear();
  }

  protected async delete(): Promise<void> {
    const deleted = await this.submission.checkAndSend(deleteAccountRequestSchema, this.form.getRawValue(), (request) =>
      this.settings.deleteAccount(request),
    );
    if (!deleted) return;
    this.snackBar.open('Your account is deleted. The bench still works on this device.', undefined, {
      duration: 6000,
    });
    await this.router.navigateByUrl('/');
  }
}
