import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { PickedPhoto } from '../sync/photo-upload-queue';
import type { LocalBuild } from '../sync/synced-records';
import { BuildPhotos, type BuildPhoto } from './build-photos';
import { PhotoPicker } from './photo-picker';
import { PhotoThumb } from './photo-thumb';
import { openPhotoViewer } from './photo-viewer';
import { PhotoStoring, photoTile } from './photo-storing';
import { UPLOAD_ICON } from './photo-words';

/**
 * A build's photos, newest first, each with where its upload stands; builders add photos here, send a
 * refused one again or discard it (on a second tap). A tap opens the photo large.
 */
@Component({
  selector: 'bt-photo-gallery',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, PhotoPicker, PhotoThumb],
  templateUrl: './photo-gallery.html',
  styleUrl: './photo-gallery.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoGallery {
  private readonly photos = inject(BuildPhotos);
  private readonly dialog = inject(MatDialog);

  readonly workshopId = input.required<string>();
  readonly build = input.required<LocalBuild>();
  readonly entries = input.required<readonly BuildPhoto[]>();
  readonly canWrite = input(false);

  protected readonly icons = UPLOAD_ICON;
  protected readonly tiles = computed(() =>
    this.entries().map((entry) => ({
      ...photoTile(entry, this.build().name),
      cover: this.build().coverPhotoId === entry.photo.id,
    })),
  );
  private readonly storing = new PhotoStoring();
  /** How many photos are being stored on this device now. */
  protected readonly saving = this.storing.saving;
  protected readonly problem = this.storing.problem;
  protected readonly confirmingDiscard = signal<string | null>(null);

  protected async add(picked: PickedPhoto[]): Promise<void> {
    await this.storing.store(picked.length, () =>
      this.photos.add(this.workshopId(), { buildId: this.build().id }, picked),
    );
  }

  protected open(entry: BuildPhoto): void {
    const { workshopId, build, canWrite } = this;
    openPhotoViewer(this.dialog, {
      workshopId: workshopId(),
      buildId: build().id,
      buildName: build().name,
      entry,
      canWrite: canWrite(),
    });
  }

  protected async sendAgain(photoId: string): Promise<void> {
    await this.photos.sendAgain(photoId);
  }

  protected async discard(photoId: string): Promise<void> {
    if (this.confirmingDiscard() !== photoId) {
      this.confirmingDiscard.set(photoId);
      return;
    }
    this.confirmingDiscard.set(null);
    await this.photos.discard(photoId);
  }
}
