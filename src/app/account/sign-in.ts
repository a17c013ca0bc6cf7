import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { emailOnlyRequestSchema, signInRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { AccountAccess } from './account-access';
import { AccountSession } from '../core/account-session';
import { PasswordField } from './password-field';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-sign-in',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    PasswordField,
    ProblemNote,
  ],
  templateUrl: './sign-in.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly session = inject(AccountSession);
  private readonly access = inject(AccountAccess);
  private readonly router = inject(Router);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  /** The screen that sent the modeller here, to go back to once signed in. */
  readonly returnTo = input<string>();

  protected readonly form = this.formBuilder.group({ email: '', password: '' });
  protected readonly submission = new Submission(this.form);
  protected readonly resending = new Submission(this.form);
  protected readonly resent = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;

  protected async signIn(): Promise<void> {
    this.resent.set(null);
    this.resending.clear();
    const signedIn = await this.submission.checkAndSend(signInRequestSchema, this.form.getRawValue(), (request) =>
      this.session.signIn(request),
    );
    if (signedIn) await this.router.navigateByUrl(pathInApp(this.returnTo()));
  }

  protected async resend(): Promise<void> {
    await this.resending.checkAndSend(
      emailOnlyRequestSchema,
      { email: this.form.controls.email.value },
      async (request) => this.resent.set(await this.access.resendVerification(request)),
    );
  }
}

/** Only a path inside this app: a link that sends people to another site after signing in is a trap. */
function pathInApp(returnTo: string | undefined): string {
  return returnTo !== undefined && /^\/(?![/\\])/.test(returnTo) ? returnTo : '/';
}
