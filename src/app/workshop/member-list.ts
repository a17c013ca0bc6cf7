import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { type MatSelectChange, MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { type MemberView, memberRoleRequestSchema, ROLES, may } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { ROLE_LABELS } from './roles';
import { WorkshopRoster } from './workshop-roster';

/** The members of the current workshop. Owners change roles and remove people; anyone may leave. */
@Component({
  selector: 'bt-member-list',
  imports: [MatButtonModule, MatCardModule, MatFormFieldModule, MatProgressBarModule, MatSelectModule, ProblemNote],
  templateUrl: './member-list.html',
  styleUrl: './member-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MemberList {
  private readonly roster = inject(WorkshopRoster);
  private readonly session = inject(AccountSession);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly members = this.roster.members;
  protected readonly loading = this.roster.loading;
  protected readonly loadProblem = this.roster.problem;
  protected readonly myId = computed(() => this.session.account()?.id ?? null);
  protected readonly owner = computed(() => may(this.session.currentWorkshop()?.role, 'manage-members'));
  protected readonly workshopName = computed(() => this.session.currentWorkshop()?.name ?? '');
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  /** The member whose removal (or one's own leaving) waits for a second tap. */
  protected readonly confirming = signal<string | null>(null);
  protected readonly action = new Submission();

  protected reload(): void {
    this.roster.reload();
  }

  protected async changeRole(member: MemberView, change: MatSelectChange): Promise<void> {
    const changed = await this.action.checkAndSend(memberRoleRequestSchema, { role: change.value }, ({ role }) =>
      this.roster.changeRole(member, role),
    );
    // A refused change goes back to what the server holds.
    if (!changed) change.source.writeValue(member.role);
  }

  protected async remove(member: MemberView): Promise<void> {
    const leaving = member.userId === this.myId();
    const workshopName = this.workshopName();
    if (!(await this.action.send(() => this.roster.remove(member)))) return;
    this.confirming.set(null);
    if (leaving) this.snackBar.open(`You left ${workshopName}.`, undefined, { duration: 6000 });
  }
}
