import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { AccountSession } from './account/account-session';
import { AppUpdates } from './core/app-updates';
import { Connectivity } from './core/connectivity';
import { NAVIGATION } from './core/navigation';

@Component({
  selector: 'bt-root',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatIconModule],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  private readonly connectivity = inject(Connectivity);
  protected readonly updates = inject(AppUpdates);
  private readonly session = inject(AccountSession);

  protected readonly navigation = NAVIGATION;
  protected readonly online = this.connectivity.online;
  protected readonly account = this.session.account;
  /** The first letter of the name, whole even when it is outside the basic plane. */
  protected readonly initial = computed(
    () => Array.from(this.account()?.displayName.trim() ?? '')[0]?.toUpperCase() ?? '?',
  );
}
