import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { updateAccountRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { AccountSession } from '../core/account-session';
import { AccountSettings } from './account-settings';

@Component({
  selector: 'bt-display-name-form',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    ProblemNote,
  ],
  templateUrl: './display-name-form.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DisplayNameForm {
  private readonly session = inject(AccountSession);
  private readonly settings = inject(AccountSettings);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly form = this.formBuilder.group({ displayName: this.session.account()?.displayName ?? '' });
  protected readonly submission = new Submission(this.form);
  protected readonly saved = signal(false);
  protected readonly fieldMessage = fieldMessage;

  protected async save(): Promise<void> {
    this.saved.set(false);
    this.saved.set(
      await this.submission.checkAndSend(updateAccountRequestSchema, this.form.getRawValue(), (request) =>
        this.settings.rename(request),
      ),
    );
  }
}
