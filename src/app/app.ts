import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  signal,
} from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { AccountSession } from './core/account-session';
import { AppUpdates } from './core/app-updates';
import { Connectivity } from './core/connectivity';
import { DevicePreferences } from './core/device-preferences';
import { InstallOffer } from './core/install-offer';
import { NAVIGATION } from './core/navigation';
import { PourAlertBanner } from './reminders/pour-alert-banner';
import { SyncStatus } from './sync/sync-status';

@Component({
  selector: 'bt-root',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatIconModule, SyncStatus, PourAlertBanner],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  private readonly connectivity = inject(Connectivity);
  protected readonly updates = inject(AppUpdates);
  private readonly session = inject(AccountSession);
  private readonly injector = inject(Injector);
  private readonly rendered = signal(false);

  protected readonly navigation = NAVIGATION;
  protected readonly online = this.connectivity.online;
  protected readonly account = this.session.account;
  /** The first letter of the name, whole even when it is outside the basic plane. */
  protected readonly initial = computed(
    () => Array.from(this.account()?.displayName.trim() ?? '')[0]?.toUpperCase() ?? '?',
  );

  constructor() {
    // Created now: the browser's offer to install comes once, early; the chosen theme applies at once.
    inject(InstallOffer);
    inject(DevicePreferences);
    // A few seconds after the first screen is up, when the browser is idle: loading the device store
    // and the first push and pull must not compete with the first paint and the first taps. Screens
    // read the device's records without it; a change made meanwhile goes with the first sync.
    afterNextRender(() => setTimeout(() => whenIdle(() => this.rendered.set(true)), SYNC_START_DELAY_MS));
    // Syncing starts once the first screen is up and someone is signed in, from a chunk of its own.
    let started = false;
    let destroyed = false;
    inject(DestroyRef).onDestroy(() => (destroyed = true));
    effect(() => {
      if (started || !this.rendered() || this.account() === null) return;
      started = true;
      void import('./sync/start-sync').then(({ startSync }) => {
        if (!destroyed) startSync(this.injector);
      });
    });
  }
}

const SYNC_START_DELAY_MS = 5000;

function whenIdle(work: () => void): void {
  if (typeof requestIdleCallback === 'function') requestIdleCallback(work, { timeout: 4000 });
  else setTimeout(work, 1000);
}
