import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { emailOnlyRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { AccountAccess } from './account-access';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-forgot-password',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ProblemNote,
  ],
  templateUrl: './forgot-password.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ForgotPassword {
  private readonly access = inject(AccountAccess);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly form = this.formBuilder.group({ email: '' });
  protected readonly submission = new Submission(this.form);
  protected readonly sent = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;

  protected async send(): Promise<void> {
    await this.submission.checkAndSend(emailOnlyRequestSchema, this.form.getRawValue(), async (request) =>
      this.sent.set(await this.access.forgotPassword(request)),
    );
  }
}
