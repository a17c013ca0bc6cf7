import { ChangeDetectionStrategy, Component, computed, inject, input, type OnInit, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { type InvitationPreview, MIN_PASSWORD_LENGTH, signUpRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { Workshops } from '../workshop/workshops';
import { ROLE_LABELS } from '../workshop/roles';
import { AccountAccess } from './account-access';
import { PasswordField } from './password-field';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-sign-up',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    PasswordField,
    ProblemNote,
  ],
  templateUrl: './sign-up.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignUp implements OnInit {
  private readonly access = inject(AccountAccess);
  private readonly workshops = inject(Workshops);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  /** The token of an invitation to a workshop, from the link in its e-mail. */
  readonly invitation = input<string>();

  protected readonly form = this.formBuilder.group({ displayName: '', email: '', password: '' });
  protected readonly submission = new Submission(this.form);
  protected readonly previewing = new Submission();
  protected readonly preview = signal<InvitationPreview | null>(null);
  protected readonly sent = signal<string | null>(null);
  protected readonly signInQuery = computed(() => (this.invitation() ? { returnTo: '/workshop' } : {}));
  protected readonly passwordHint = `At least ${MIN_PASSWORD_LENGTH} characters`;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly fieldMessage = fieldMessage;

  async ngOnInit(): Promise<void> {
    const token = this.invitation();
    if (!token) return;
    // An expired or unknown invitation still lets the account be created, without joining; the note says why.
    await this.previewing.send(async () => {
      const preview = await this.workshops.previewInvitation(token);
      this.preview.set(preview);
      // The invited address lets the account skip the confirmation e-mail.
      if (this.form.controls.email.value === '') this.form.controls.email.setValue(preview.email);
    });
  }

  protected async signUp(): Promise<void> {
    const request = { ...this.form.getRawValue(), invitationToken: this.invitation() || undefined };
    await this.submission.checkAndSend(signUpRequestSchema, request, async (checked) =>
      this.sent.set(await this.access.signUp(checked)),
    );
  }
}
