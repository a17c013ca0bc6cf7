import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

/** Builds belong to a workshop: says what is missing (an account, or a workshop) and where to get it. */
@Component({
  selector: 'bt-workshop-needed',
  imports: [MatButtonModule, RouterLink],
  template: `
    @if (signedIn()) {
      <p class="bt-lead" data-state="no-workshop">
        Builds are kept in a workshop, and you are not in one yet. Start one, or open the link in an invitation e-mail
        to join one.
      </p>
      <div class="bt-actions">
        <a matButton="filled" routerLink="/workshop">Go to Workshop</a>
      </div>
    } @else {
      <p class="bt-lead" data-state="signed-out">
        Builds are kept in a workshop, so they need an account. Sign in to log builds on this device; they stay here
        when you are offline.
      </p>
      <div class="bt-actions">
        <a matButton="filled" routerLink="/sign-in">Sign in</a>
      </div>
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 16px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class WorkshopNeeded {
  readonly signedIn = input.required<boolean>();
}
