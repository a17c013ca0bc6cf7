import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { AccountDeletion } from './account-deletion';
import { AccountSession } from '../core/account-session';
import { DisplayNameForm } from './display-name-form';
import { PasswordChangeForm } from './password-change-form';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { ReminderSettings } from '../reminders/reminder-settings';

@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-account-page',
  imports: [
    MatButtonModule,
    MatCardModule,
    MatIconModule,
    MatProgressBarModule,
    ProblemNote,
    DisplayNameForm,
    PasswordChangeForm,
    AccountDeletion,
    ReminderSettings,
  ],
  templateUrl: './account-page.html',
  styleUrl: './account-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AccountPage {
  private readonly session = inject(AccountSession);
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly account = this.session.account;
  protected readonly stale = this.session.stale;
  protected readonly signingOut = new Submission();
  protected readonly othersSignedOut = signal(false);

  protected async signOut(): Promise<void> {
    if (!(await this.signingOut.send(() => this.session.signOut()))) return;
    this.snackBar.open('Signed out. The bench still works on this device.', undefined, { duration: 6000 });
    await this.router.navigateByUrl('/');
  }

  protected async signOutOthers(): Promise<void> {
    this.othersSignedOut.set(false);
    this.othersSignedOut.set(await this.signingOut.send(() => this.session.signOutOthers()));
  }
}
