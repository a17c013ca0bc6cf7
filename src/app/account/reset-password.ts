import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { MIN_PASSWORD_LENGTH, resetPasswordRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { AccountAccess } from './account-access';
import { PasswordField } from './password-field';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

/** Where the link in the password e-mail leads. */
@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-reset-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    PasswordField,
    ProblemNote,
  ],
  templateUrl: './reset-password.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResetPassword {
  private readonly access = inject(AccountAccess);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  readonly token = input<string>();

  protected readonly form = this.formBuilder.group({ newPassword: '' });
  protected readonly submission = new Submission(this.form);
  protected readonly done = signal(false);
  protected readonly passwordHint = `At least ${MIN_PASSWORD_LENGTH} characters`;
  /** The link itself did not work (used, expired or cut short), rather than the password. */
  protected readonly linkFailed = computed(() => {
    const problem = this.submission.problem();
    return problem !== null && (problem.code === 'token_invalid' || 'token' in problem.fields);
  });

  protected async reset(): Promise<void> {
    const request = { token: this.token(), ...this.form.getRawValue() };
    this.done.set(
      await this.submission.checkAndSend(resetPasswordRequestSchema, request, (checked) =>
        this.access.resetPassword(checked),
      ),
    );
  }
}
