import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { photoPatchSchema } from '@benchtide/shared';
import { format } from 'date-fns';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { LocalRecords } from '../sync/local-records';
import { BuildPhotos, type BuildPhoto } from './build-photos';
import { photoAlt, uploadStatus } from './photo-words';
import { PhotoThumb } from './photo-thumb';

export interface PhotoViewerData {
  readonly workshopId: string;
  readonly buildId: string;
  readonly buildName: string;
  /** The photo and its upload as they were when opened; the dialog follows them live from there. */
  readonly entry: BuildPhoto;
  readonly canWrite: boolean;
}

/** Opens a photo large, over the screen; full screen on a narrow phone. */
export function openPhotoViewer(dialog: MatDialog, data: PhotoViewerData): void {
  dialog.open(PhotoViewer, { data, width: '960px', maxWidth: '100vw', maxHeight: '100vh', autoFocus: 'dialog' });
}

/**
 * One photo, large: its caption, when it was taken, where its upload stands. Builders and owners change
 * the caption, put it on the build's card, or delete it (on a second tap); viewers only look.
 */
@Component({
  selector: 'bt-photo-viewer',
  imports: [MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule, PhotoThumb],
  providers: [ROOMY_FORM_FIELDS],
  templateUrl: './photo-viewer.html',
  styleUrl: './photo-viewer.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoViewer {
  private readonly photos = inject(BuildPhotos);
  private readonly ref = inject<MatDialogRef<PhotoViewer>>(MatDialogRef);
  protected readonly data = inject<PhotoViewerData>(MAT_DIALOG_DATA);

  private readonly builds = inject(LocalRecords).builds(signal(this.data.workshopId));
  private readonly photoId = this.data.entry.photo.id;
  private readonly live = this.photos.one(signal(this.photoId));
  /** As opened until the device answers; null once the photo has gone (deleted here or on another device). */
  protected readonly shown = computed(() => {
    const live = this.live();
    return live === undefined ? this.data.entry : live;
  });
  protected readonly alt = computed(() => photoAlt(this.shown()?.photo ?? this.data.entry.photo, this.data.buildName));
  protected readonly status = computed(() => {
    const upload = this.shown()?.upload;
    return upload ? uploadStatus(upload) : null;
  });
  protected readonly when = computed(() => {
    const { takenAt, createdAt } = this.shown()?.photo ?? this.data.entry.photo;
    return takenAt === null ? `Added ${format(createdAt, WHEN)}` : `Taken ${format(takenAt, WHEN)}`;
  });
  protected readonly isCover = computed(
    () => this.builds().find((build) => build.id === this.data.buildId)?.coverPhotoId === this.photoId,
  );

  protected readonly form = new FormGroup({
    caption: new FormControl(this.data.entry.photo.caption, { nonNullable: true }),
  });
  protected readonly caption = this.form.controls.caption;
  protected readonly captionError = signal<string | null>(null);
  protected readonly confirmingDelete = signal(false);
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);

  protected async saveCaption(): Promise<void> {
    const checked = photoPatchSchema.safeParse({ caption: this.caption.value });
    this.captionError.set(
      checked.success ? null : (checked.error.issues[0]?.message ?? 'This caption cannot be saved.'),
    );
    if (!checked.success) return;
    await this.run('save the caption', async () => {
      await this.photos.setCaption(this.data.workshopId, this.photoId, this.caption.value);
      this.caption.markAsPristine();
    });
  }

  protected async useAsCover(on: boolean): Promise<void> {
    await this.run('change the cover', () =>
      this.photos.useAsCover(this.data.workshopId, this.data.buildId, on ? this.photoId : null),
    );
  }

  protected async remove(): Promise<void> {
    const cover = this.isCover() ? this.photoId : null;
    await this.run('delete the photo', () =>
      this.photos.remove(this.data.workshopId, { id: this.data.buildId, coverPhotoId: cover }, this.photoId),
    );
    if (this.problem() === null) this.ref.close();
  }

  private async run(what: string, work: () => Promise<void>): Promise<void> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      await work();
    } catch (error) {
      const detail = error instanceof Error ? ` (${error.message})` : '';
      this.problem.set(`This device could not ${what}${detail}. Nothing was lost: try again.`);
    } finally {
      this.busy.set(false);
    }
  }
}

const WHEN = 'EEE d MMM yyyy, HH:mm';
