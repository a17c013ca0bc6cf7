import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { PhotoTarget, PickedPhoto } from '../sync/photo-upload-queue';
import type { LocalBuild } from '../sync/synced-records';
import { BuildPhotos, type BuildPhoto } from './build-photos';
import { PhotoPicker } from './photo-picker';
import { PhotoThumb } from './photo-thumb';
import { openPhotoViewer } from './photo-viewer';
import { PhotoStoring, photoTile } from './photo-storing';
import { UPLOAD_ICON } from './photo-words';

/**
 * The photos of one step or pour as small thumbnails in the build log, each opening large on a tap; with a
 * target, builders add photos to it here.
 */
@Component({
  selector: 'bt-photo-strip',
  imports: [MatIconModule, MatProgressBarModule, PhotoPicker, PhotoThumb],
  template: `
    @if (tiles().length > 0) {
      <ul class="strip" [attr.aria-label]="'Photos ' + subject()">
        @for (tile of tiles(); track tile.photo.id) {
          <li [attr.data-photo]="tile.photo.id">
            <button type="button" class="open" (click)="open(tile)">
              <bt-photo-thumb
                class="mini"
                [workshopId]="workshopId()"
                [photoId]="tile.photo.id"
                [blob]="tile.upload?.blob ?? null"
                [alt]="tile.alt"
              />
              @if (tile.status; as status) {
                <span class="state" [class.refused]="status.state === 'refused'" [title]="status.label">
                  <mat-icon [svgIcon]="icons[status.state]" aria-hidden="true" />
                  <span class="bt-visually-hidden">{{ status.label }}</span>
                </span>
              }
            </button>
          </li>
        }
      </ul>
    }
    @if (canWrite() && addTo(); as target) {
      <bt-photo-picker [subject]="subject()" [disabled]="saving() > 0" (picked)="add(target, $event)" />
      @if (saving() > 0) {
        <mat-progress-bar mode="indeterminate" aria-label="Storing the photos on this device" />
      }
      @if (problem(); as problem) {
        <p class="problem" role="alert">{{ problem }}</p>
      }
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 8px;
    }
    .strip {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    .open {
      position: relative;
      display: block;
      padding: 0;
      border: 0;
      border-radius: 8px;
      overflow: hidden;
      background: none;
      cursor: pointer;
    }
    .open:focus-visible {
      outline: 3px solid var(--mat-sys-primary);
      outline-offset: 2px;
    }
    .mini {
      width: 64px;
      height: 64px;
    }
    .state {
      position: absolute;
      right: 2px;
      bottom: 2px;
      display: flex;
      padding: 2px;
      border-radius: 50%;
      background: var(--mat-sys-surface);
      color: var(--mat-sys-on-surface);
    }
    .state.refused {
      color: var(--mat-sys-error);
    }
    .state mat-icon {
      width: 18px;
      height: 18px;
    }
    .problem {
      margin: 0;
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoStrip {
  private readonly photos = inject(BuildPhotos);
  private readonly dialog = inject(MatDialog);

  readonly workshopId = input.required<string>();
  readonly build = input.required<LocalBuild>();
  readonly entries = input.required<readonly BuildPhoto[]>();
  readonly canWrite = input(false);
  /** Where photos added here go; none are added here without it. */
  readonly addTo = input<PhotoTarget | null>(null);
  /** What the photos are of, for screen readers: "of this pour". */
  readonly subject = input('');

  protected readonly icons = UPLOAD_ICON;
  protected readonly tiles = computed(() => this.entries().map((entry) => photoTile(entry, this.build().name)));
  private readonly storing = new PhotoStoring();
  protected readonly saving = this.storing.saving;
  protected readonly problem = this.storing.problem;

  protected async add(target: PhotoTarget, picked: PickedPhoto[]): Promise<void> {
    await this.storing.store(picked.length, () => this.photos.add(this.workshopId(), target, picked));
  }

  protected open(entry: BuildPhoto): void {
    openPhotoViewer(this.dialog, {
      workshopId: this.workshopId(),
      buildId: this.build().id,
      buildName: this.build().name,
      entry,
      canWrite: this.canWrite(),
    });
  }
}
