import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, type OnInit, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import type { InvitationPreview } from '@benchtide/shared';
import { AccountSession } from '../core/account-session';
import { ProblemNote } from '../core/problem-note';
import { Submission } from '../core/submission';
import { ROLE_DUTIES, ROLE_LABELS } from './roles';
import { Workshops } from './workshops';

/** Where the link in an invitation e-mail leads: what the invitation is, and the way in. */
@Component({
  selector: 'bt-invitation-accept',
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, ProblemNote],
  templateUrl: './invitation-accept.html',
  styleUrl: './invitation-accept.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvitationAccept implements OnInit {
  private readonly workshops = inject(Workshops);
  private readonly session = inject(AccountSession);
  private readonly router = inject(Router);

  readonly token = input.required<string>();

  protected readonly preview = signal<InvitationPreview | null>(null);
  protected readonly account = this.session.account;
  /** Signed in with another address than the one invited: the server will refuse. */
  protected readonly otherAddress = computed(() => {
    const preview = this.preview();
    const account = this.account();
    return preview !== null && account !== null && preview.email.toLowerCase() !== account.email.toLowerCase();
  });
  protected readonly here = computed(() => `/invitations/${this.token()}`);
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly roleDuties = ROLE_DUTIES;
  protected readonly loading = new Submission();
  protected readonly accepting = new Submission();
  protected readonly signingOut = new Submission();

  ngOnInit(): Promise<void> {
    return this.load();
  }

  protected async load(): Promise<void> {
    await this.loading.send(async () => this.preview.set(await this.workshops.previewInvitation(this.token())));
  }

  protected async accept(): Promise<void> {
    if (await this.accepting.send(() => this.workshops.acceptInvitation(this.token()))) {
      await this.router.navigateByUrl('/workshop');
    }
  }

  protected async signOut(): Promise<void> {
    this.accepting.clear();
    await this.signingOut.send(() => this.session.signOut());
  }
}
