import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { photoUrl, type PhotoSize } from '@benchtide/shared';
import { Connectivity } from '../core/connectivity';
import { PhotoIcons } from './photo-icons';

/**
 * One photo: from the bytes kept on this device while it is not on the server yet, else the server's copy
 * (cached by the service worker for offline viewing). Says so when neither can be shown.
 */
@Component({
  selector: 'bt-photo-thumb',
  imports: [MatIconModule],
  template: `
    @if (failed()) {
      <span class="missing" role="img" [attr.aria-label]="alt() + ' (shown when online)'">
        <mat-icon svgIcon="photos" aria-hidden="true" />
        <span aria-hidden="true">Shown when online</span>
      </span>
    } @else if (src(); as src) {
      <img
        [src]="src"
        [alt]="alt()"
        [attr.loading]="size() === 'thumb' ? 'lazy' : null"
        decoding="async"
        (error)="failed.set(true)"
      />
    }
  `,
  styles: `
    :host {
      display: block;
      overflow: hidden;
      background: var(--mat-sys-surface-container-high);
    }
    img {
      display: block;
      width: 100%;
      height: 100%;
      object-fit: var(--bt-photo-fit, cover);
    }
    .missing {
      display: flex;
      flex-direction: column;
      align-items: center;
      justify-content: center;
      gap: 4px;
      height: 100%;
      padding: 4px;
      text-align: center;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-label-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoThumb {
  readonly workshopId = input.required<string>();
  readonly photoId = input.required<string>();
  /** The bytes kept on this device, while the server does not hold the photo yet. */
  readonly blob = input<Blob | null>(null);
  readonly alt = input.required<string>();
  readonly size = input<PhotoSize>('thumb');

  private readonly hasBlob = computed(() => this.blob() !== null);
  private readonly objectUrl = signal<string | null>(null);
  protected readonly src = computed(() =>
    this.hasBlob() ? this.objectUrl() : photoUrl(this.workshopId(), this.photoId(), this.size()),
  );
  private readonly online = inject(Connectivity).online;
  /** Tried again when the address changes or the connection comes back. */
  protected readonly failed = linkedSignal<{ src: string | null; online: boolean }, boolean>({
    source: () => ({ src: this.src(), online: this.online() }),
    computation: (now, before) => {
      const cameBack = before !== undefined && now.online && !before.source.online;
      return before !== undefined && before.source.src === now.src && !cameBack ? before.value : false;
    },
  });

  constructor() {
    inject(PhotoIcons);
    // Made once per photo, not per read of its upload row (each read is a new Blob), and let go when done.
    effect((onCleanup) => {
      this.photoId();
      const blob = this.hasBlob() ? untracked(this.blob) : null;
      if (blob === null) return this.objectUrl.set(null);
      const url = URL.createObjectURL(blob);
      this.objectUrl.set(url);
      onCleanup(() => URL.revokeObjectURL(url));
    });
  }
}
