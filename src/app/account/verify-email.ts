import { ChangeDetectionStrategy, Component, inject, input, type OnInit, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { verifyEmailRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { AccountAccess } from './account-access';
import { AccountSession } from '../core/account-session';

/** Where the link in the confirmation e-mail leads: the address is confirmed as the screen opens. */
@Component({
  selector: 'bt-verify-email',
  imports: [RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, ProblemNote],
  templateUrl: './verify-email.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class VerifyEmail implements OnInit {
  private readonly access = inject(AccountAccess);
  private readonly session = inject(AccountSession);

  readonly token = input<string>();

  protected readonly submission = new Submission();
  protected readonly verified = signal(false);
  protected readonly signedIn = this.session.signedIn;

  ngOnInit(): Promise<void> {
    return this.verify();
  }

  protected async verify(): Promise<void> {
    const verified = await this.submission.checkAndSend(verifyEmailRequestSchema, { token: this.token() }, (request) =>
      this.access.verifyEmail(request),
    );
    this.verified.set(verified);
    // A device that was signed in already learns that the address is confirmed.
    if (verified && this.session.signedIn()) await this.session.refresh();
  }
}
