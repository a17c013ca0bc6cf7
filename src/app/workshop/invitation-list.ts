import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { type InvitationView, invitationRequestSchema, type Role, ROLES } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { ROLE_DUTIES, ROLE_LABELS } from './roles';
import { WorkshopRoster } from './workshop-roster';

/** The invitations waiting for an answer, and the form to send one; for owners. */
@Component({
  selector: 'bt-invitation-list',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ProblemNote,
  ],
  templateUrl: './invitation-list.html',
  styleUrl: './invitation-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvitationList {
  private readonly roster = inject(WorkshopRoster);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly invitations = this.roster.invitations;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleDuties = ROLE_DUTIES;
  protected readonly form = this.formBuilder.group({ email: '', role: this.formBuilder.control<Role>('builder') });
  protected readonly inviting = new Submission(this.form);
  protected readonly withdrawing = new Submission();
  protected readonly sentTo = signal<string | null>(null);
  protected readonly fieldMessage = fieldMessage;

  protected async invite(): Promise<void> {
    this.sentTo.set(null);
    const sent = await this.inviting.checkAndSend(invitationRequestSchema, this.form.getRawValue(), async (request) => {
      await this.roster.invite(request);
      this.sentTo.set(request.email);
    });
    // The role stays as chosen: invitations often go out to several people alike.
    if (sent) this.form.controls.email.reset();
  }

  protected async withdraw(invitation: InvitationView): Promise<void> {
    await this.withdrawing.send(() => this.roster.withdraw(invitation));
  }
}
