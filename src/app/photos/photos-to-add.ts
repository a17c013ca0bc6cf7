import { ChangeDetectionStrategy, Component, input, model } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { format } from 'date-fns';
import type { PickedPhoto } from '../sync/photo-upload-queue';
import { PhotoPicker } from './photo-picker';
import { PhotoThumb } from './photo-thumb';

/** Photos chosen for something not saved yet (a step being logged): shown, removable, stored by the form with it. */
@Component({
  selector: 'bt-photos-to-add',
  imports: [MatButtonModule, PhotoPicker, PhotoThumb],
  template: `
    <bt-photo-picker [subject]="subject()" (picked)="photos.set([...photos(), ...$event])" />
    @if (photos().length > 0) {
      <ul class="chosen" aria-label="Photos to add">
        @for (photo of photos(); track photo.id) {
          <li data-field="photo-to-add">
            <bt-photo-thumb
              class="mini"
              workshopId=""
              [photoId]="photo.id"
              [blob]="photo.file"
              [alt]="describe(photo)"
            />
            <span class="name">{{ describe(photo) }}</span>
            <button matButton type="button" [attr.aria-label]="'Remove ' + describe(photo)" (click)="remove(photo.id)">
              Remove
            </button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 8px;
    }
    .chosen {
      display: flex;
      flex-direction: column;
      gap: 8px;
      margin: 0;
      padding: 0;
      list-style: none;
    }
    li {
      display: flex;
      align-items: center;
      gap: 12px;
      --mat-button-text-container-height: 48px;
    }
    .mini {
      flex: none;
      width: 56px;
      height: 56px;
      border-radius: 8px;
    }
    .name {
      flex: 1;
      min-width: 0;
      overflow-wrap: anywhere;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotosToAdd {
  readonly photos = model<readonly PickedPhoto[]>([]);
  readonly subject = input('');

  protected describe(photo: PickedPhoto): string {
    const name = photo.file.name || 'Photo';
    return photo.takenAt === null ? name : `${name}, taken ${format(photo.takenAt, 'd MMM yyyy, HH:mm')}`;
  }

  protected remove(id: string): void {
    this.photos.set(this.photos().filter((photo) => photo.id !== id));
  }
}
