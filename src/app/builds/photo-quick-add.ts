import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { PhotoPicker } from '../photos/photo-picker';
import { PhotoStoring } from '../photos/photo-storing';
import type { PickedPhoto } from '../sync/photo-upload-queue';
import { BuildLog } from './build-log';
import { WorkshopNeeded } from './workshop-needed';

/** What was just added, for the note that says so. */
interface Added {
  readonly buildId: string;
  readonly buildName: string;
  readonly count: number;
}

/**
 * Straight from the bench to the camera: photos for the build worked on last, or another one chosen, in
 * one tap more. They are stored here at once and sent when the device is online.
 */
@Component({
  selector: 'bt-photo-quick-add',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatProgressBarModule,
    MatSelectModule,
    RouterLink,
    PhotoPicker,
    WorkshopNeeded,
  ],
  providers: [BuildLog, ROOMY_FORM_FIELDS],
  templateUrl: './photo-quick-add.html',
  styles: `
    :host {
      display: flex;
      flex-direction: column;
      gap: 16px;
      max-width: 720px;
      margin: 0 auto;
    }
    h1,
    p {
      margin: 0;
    }
    .problem {
      padding: 12px 16px;
      border-radius: 12px;
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PhotoQuickAdd {
  private readonly log = inject(BuildLog);

  protected readonly workshop = this.log.workshop;
  protected readonly signedIn = this.log.signedIn;
  protected readonly loaded = this.log.loaded;
  protected readonly canWrite = this.log.canWrite;
  private readonly cards = this.log.cards();
  /** Last worked on first. */
  protected readonly builds = computed(() => this.cards().map((card) => card.build));
  private readonly picked = signal<string | null>(null);
  /** The build worked on last (which may change as the device reads each build's log), until one is chosen. */
  protected readonly chosenId = computed(() => {
    const picked = this.picked();
    const builds = this.builds();
    return builds.some((build) => build.id === picked) ? picked : (builds[0]?.id ?? null);
  });
  protected readonly chosenName = computed(
    () => this.builds().find((build) => build.id === this.chosenId())?.name ?? '',
  );
  private readonly storing = new PhotoStoring();
  protected readonly saving = this.storing.saving;
  protected readonly problem = this.storing.problem;
  protected readonly added = signal<Added | null>(null);

  protected choose(buildId: string): void {
    this.picked.set(buildId);
  }

  protected async add(picked: PickedPhoto[]): Promise<void> {
    const buildId = this.chosenId();
    if (buildId === null) return;
    this.added.set(null);
    if (await this.storing.store(picked.length, () => this.log.addPhotos({ buildId }, picked))) {
      this.added.set({ buildId, buildName: this.chosenName(), count: picked.length });
    }
  }
}
