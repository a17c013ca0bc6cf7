import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { BuildLog } from './build-log';
import { STATUS_SHOWN, activityText, moneyText, scaleBadge } from './build-words';
import { WorkshopNeeded } from './workshop-needed';

/** The workshop's builds as cards, the one worked on last at the top, with a way to start a new one. */
@Component({
  selector: 'bt-build-list',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, WorkshopNeeded],
  providers: [BuildLog],
  templateUrl: './build-list.html',
  styleUrl: './build-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BuildList {
  private readonly log = inject(BuildLog);
  private readonly locale = inject(LOCALE_ID);

  protected readonly workshop = this.log.workshop;
  protected readonly signedIn = this.log.signedIn;
  protected readonly loaded = this.log.loaded;
  protected readonly canWrite = this.log.canWrite;
  private readonly cards = this.log.cards();
  protected readonly shown = computed(() => {
    const now = this.log.now();
    return this.cards().map(({ build, lastActivityAt, costs }) => ({
      id: build.id,
      name: build.name,
      scale: scaleBadge(build),
      status: STATUS_SHOWN[build.status],
      activity: activityText(lastActivityAt, now),
      cost: costs.map((sum) => moneyText(sum.minor, sum.currency, this.locale)).join(' + '),
      pending: build.pending === true,
    }));
  });
}
