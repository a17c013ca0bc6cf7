import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { format } from 'date-fns';
import { BuildPhotos } from './build-photos';
import { megabytes } from './photo-checks';
import { PhotoThumb } from './photo-thumb';
import { UPLOAD_ICON, uploadStatus } from './photo-words';

/**
 * The photos on this device that the server does not hold yet: how far each upload got, or why the server
 * refused it, with a way to send it again or discard it (on a second tap).
 */
@Component({
  selector: 'bt-photo-upload-list',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, PhotoThumb],
  templateUrl: './photo-upload-list.html',
  styleUrl: './photo-upload-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoUploadList {
  private readonly photos = inject(BuildPhotos);

  protected readonly icons = UPLOAD_ICON;
  protected readonly rows = computed(() =>
    this.photos.uploads().map(({ upload, buildName }) => ({
      upload,
      status: uploadStatus(upload),
      title: `${upload.fileName} for ${buildName}`,
      detail: `${megabytes(upload.blob.size)}, added ${format(upload.createdAt, 'HH:mm, d MMM')}`,
    })),
  );
  protected readonly refusedCount = this.photos.refusedCount;
  /** The upload whose discard waits for a second tap. */
  protected readonly confirmingDiscard = signal<string | null>(null);

  protected async sendAgain(id: string): Promise<void> {
    await this.photos.sendAgain(id);
  }

  protected async discard(id: string): Promise<void> {
    if (this.confirmingDiscard() !== id) {
      this.confirmingDiscard.set(id);
      return;
    }
    this.confirmingDiscard.set(null);
    await this.photos.discard(id);
  }
}
