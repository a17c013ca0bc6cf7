import { ChangeDetectionStrategy, Component, LOCALE_ID, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { BuildPhotos } from '../photos/build-photos';
import { PhotoThumb } from '../photos/photo-thumb';
import { photoAlt } from '../photos/photo-words';
import { BuildLog } from './build-log';
import { STATUS_SHOWN, activityText, moneyText, scaleBadge } from './build-words';
import { WorkshopNeeded } from './workshop-needed';
import type { LocalBuild, LocalPhoto } from '../sync/synced-records';

/** The workshop's builds as cards with their cover photos, the one worked on last at the top, and a way to start a new one. */
@Component({
  selector: 'bt-build-list',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, PhotoThumb, RouterLink, WorkshopNeeded],
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
  private readonly coverIds = computed(
    () => this.log.builds().flatMap((build) => (build.coverPhotoId ? [build.coverPhotoId] : [])),
    { equal: (a, b) => a.join() === b.join() },
  );
  private readonly covers = inject(BuildPhotos).byId(this.coverIds);
  protected readonly shown = computed(() => {
    const now = this.log.now();
    return this.cards().map(({ build, lastActivityAt, costs }) => ({
      cover: coverOf(build, this.covers()),
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

/** The cover photo shown on a card, described from its record when this device has it. */
function coverOf(build: LocalBuild, covers: ReadonlyMap<string, LocalPhoto>) {
  const id = build.coverPhotoId;
  if (!id) return null;
  const photo = covers.get(id);
  return { id, alt: photo ? photoAlt(photo, build.name) : `Cover photo of ${build.name}` };
}
