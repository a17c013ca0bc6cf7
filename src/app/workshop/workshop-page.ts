import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { ROLES, workshopRequestSchema, may } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { InvitationList } from './invitation-list';
import { MemberList } from './member-list';
import { NewWorkshopForm } from './new-workshop-form';
import { RecordExport } from './record-export';
import { ROLE_DUTIES, ROLE_LABELS } from './roles';
import { WorkshopRoster } from './workshop-roster';
import { Workshops } from './workshops';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

/**
 * The workshop the modeller is working in: its members and their roles, and for owners its name and
 * invitations. What a role may not do is hidden here; the server refuses it either way.
 */
@Component({
  selector: 'bt-workshop-page',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ProblemNote,
    MemberList,
    InvitationList,
    RecordExport,
    NewWorkshopForm,
  ],
  providers: [WorkshopRoster, ROOMY_FORM_FIELDS],
  templateUrl: './workshop-page.html',
  styleUrl: './workshop-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopPage {
  private readonly session = inject(AccountSession);
  private readonly workshops = inject(Workshops);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly allWorkshops = this.session.workshops;
  protected readonly workshop = this.session.currentWorkshop;
  protected readonly owner = computed(() => may(this.workshop()?.role, 'rename'));
  protected readonly mayExport = computed(() => may(this.workshop()?.role, 'export'));
  protected readonly stale = this.session.stale;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleDuties = ROLE_DUTIES;
  protected readonly renaming = signal(false);
  protected readonly renameForm = this.formBuilder.group({ name: '' });
  protected readonly renameSubmission = new Submission(this.renameForm);
  protected readonly fieldMessage = fieldMessage;

  protected choose(workshopId: string): void {
    this.stopRenaming();
    this.session.chooseWorkshop(workshopId);
  }

  protected startRenaming(): void {
    this.renameForm.setValue({ name: this.workshop()?.name ?? '' });
    this.renaming.set(true);
  }

  protected stopRenaming(): void {
    this.renaming.set(false);
    this.renameSubmission.clear();
  }

  protected async rename(): Promise<void> {
    const workshopId = this.workshop()?.id;
    if (workshopId === undefined) return;
    const renamed = await this.renameSubmission.checkAndSend(
      workshopRequestSchema,
      this.renameForm.getRawValue(),
      (request) => this.workshops.rename(workshopId, request),
    );
    if (renamed) this.renaming.set(false);
  }
}
