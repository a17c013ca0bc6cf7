import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { changePasswordRequestSchema, MIN_PASSWORD_LENGTH } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { AccountSettings } from './account-settings';
import { PasswordField } from './password-field';

@Component({
  selector: 'bt-password-change-form',
  imports: [ReactiveFormsModule, MatButtonModule, MatCardModule, MatProgressBarModule, PasswordField, ProblemNote],
  templateUrl: './password-change-form.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordChangeForm {
  private readonly settings = inject(AccountSettings);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly form = this.formBuilder.group({ currentPassword: '', newPassword: '' });
  protected readonly submission = new Submission(this.form);
  protected readonly changed = signal(false);
  protected readonly passwordHint = `At least ${MIN_PASSWORD_LENGTH} characters`;

  protected async change(): Promise<void> {
    this.changed.set(false);
    const changed = await this.submission.checkAndSend(
      changePasswordRequestSchema,
      this.form.getRawValue(),
      (request) => this.settings.changePassword(request),
    );
    if (changed) this.form.reset();
    this.changed.set(changed);
  }
}
