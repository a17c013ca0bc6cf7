import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { RouterLink } from '@angular/router';
import { PourAlerts } from './pour-alerts';

/** The moment a pour came due, shown over the screen in use until the modeller goes to it or dismisses it. */
@Component({
  selector: 'bt-pour-alert-banner',
  imports: [RouterLink],
  template: `
    @if (alerts.current(); as alert) {
      <aside class="pour-alert" role="alert" aria-live="assertive">
        <p>
          <strong>{{ alert.title }}</strong>
          <span>{{ alert.body }}</span>
        </p>
        <div class="actions">
          <a [routerLink]="['/builds', alert.buildId]" [queryParams]="{ pour: alert.pourId }" (click)="alerts.dismiss()"
            >Open the pour</a
          >
          <button type="button" (click)="alerts.dismiss()">Dismiss</button>
        </div>
      </aside>
    }
  `,
  styleUrl: './pour-alert-banner.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourAlertBanner {
  protected readonly alerts = inject(PourAlerts);
}
