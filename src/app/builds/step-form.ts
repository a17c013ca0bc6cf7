import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
  type OnInit,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { STEP_KINDS, newStepSchema, stepPatchSchema } from '@benchtide/shared';
import { format } from 'date-fns';
import { map, startWith } from 'rxjs';
import { v7 } from 'uuid';
import type { ApiProblem } from '../core/api-error';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { ProblemNote } from '../core/problem-note';
import type { PickedPhoto } from '../sync/photo-upload-queue';
import { PhotosToAdd } from '../photos/photos-to-add';
import type { LocalStep } from '../sync/synced-records';
import { BuildLog } from './build-log';
import { STEP_KIND_WORDS, type StepKind } from './build-words';

type StepField = 'kind' | 'title' | 'when' | 'notes';

const LOCAL_MINUTE = "yyyy-MM-dd'T'HH:mm";
const FIELD_OF: Readonly<Record<string, StepField>> = {
  kind: 'kind',
  title: 'title',
  happenedAt: 'when',
  notes: 'notes',
};

/**
 * A step of the build log, new or changed: what kind, what was done, when, notes and photos. Saved on this
 * device at once. A new step whose time was not set by hand takes the time its earliest photo was taken.
 */
@Component({
  selector: 'bt-step-form',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    PhotosToAdd,
    ProblemNote,
  ],
  providers: [ROOMY_FORM_FIELDS],
  templateUrl: './step-form.html',
  styles: `
    :host {
      display: block;
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 12px;
    }
    .row mat-form-field {
      flex: 1 1 180px;
    }
    .wide {
      width: 100%;
    }
    .field-error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StepForm implements OnInit {
  private readonly log = inject(BuildLog);

  readonly buildId = input.required<string>();
  /** The step to change; a new step when absent. */
  readonly step = input<LocalStep>();
  readonly saved = output<string>();
  readonly cancelled = output<void>();

  protected readonly kinds = STEP_KINDS;
  protected readonly kindWords = STEP_KIND_WORDS;
  protected readonly form = new FormGroup({
    kind: new FormControl<StepKind | null>(null),
    title: new FormControl('', { nonNullable: true }),
    when: new FormControl(format(new Date(), LOCAL_MINUTE), { nonNullable: true }),
    notes: new FormControl('', { nonNullable: true }),
  });
  protected readonly attempted = signal(false);
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);
  protected readonly photos = signal<readonly PickedPhoto[]>([]);
  /** The taken time the step's time came from, while it still does. */
  protected readonly timeFromPhoto = signal<string | null>(null);

  private readonly newId = v7();
  private readonly value = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  private readonly fields = computed(() => {
    const { kind, title, when, notes } = this.value();
    return { kind, title, happenedAt: instant(when), notes };
  });
  private readonly errors = computed(() => {
    const checked = this.step()
      ? stepPatchSchema.safeParse(this.fields())
      : newStepSchema.safeParse({ id: this.newId, buildId: this.buildId(), ...this.fields() });
    const messages = new Map<StepField, string>();
    if (checked.success) return messages;
    for (const issue of checked.error.issues) {
      const field = FIELD_OF[String(issue.path[0] ?? '')];
      if (field !== undefined && !messages.has(field)) messages.set(field, issue.message);
    }
    return messages;
  });

  ngOnInit(): void {
    const step = this.step();
    if (!step) return;
    this.form.reset({
      kind: step.kind,
      title: step.title,
      when: Number.isFinite(Date.parse(step.happenedAt)) ? format(step.happenedAt, LOCAL_MINUTE) : '',
      notes: step.notes,
    });
  }

  protected photosChosen(photos: readonly PickedPhoto[]): void {
    this.photos.set(photos);
    const when = this.form.controls.when;
    if (this.step() || when.dirty) return;
    const earliest = photos
      .map((photo) => photo.takenAt)
      .filter((at) => at !== null)
      .sort()[0];
    if (earliest !== undefined) {
      when.setValue(format(earliest, LOCAL_MINUTE));
      this.timeFromPhoto.set(earliest);
    } else if (this.timeFromPhoto() !== null) {
      when.setValue(format(new Date(), LOCAL_MINUTE));
      this.timeFromPhoto.set(null);
    }
  }

  protected whenHint(): string {
    const fromPhoto = this.timeFromPhoto();
    if (fromPhoto !== null && !this.form.controls.when.dirty) {
      return `From the earliest photo, taken ${format(fromPhoto, 'd MMM yyyy, HH:mm')}`;
    }
    return 'Now, unless you change it';
  }

  protected error(field: StepField): string | null {
    const message = this.errors().get(field) ?? null;
    return this.attempted() || this.form.controls[field].dirty ? message : null;
  }

  protected async save(): Promise<void> {
    this.attempted.set(true);
    this.problem.set(null);
    if (this.errors().size > 0 || this.saving()) return;
    this.saving.set(true);
    try {
      const step = this.step();
      const buildId = this.buildId();
      const save = step
        ? () => this.log.patchStep(step.id, stepPatchSchema.parse(this.fields()))
        : () => this.log.createStep(buildId, newStepSchema.parse({ id: this.newId, buildId, ...this.fields() }));
      const photos = this.photos();
      const stepId = step?.id ?? this.newId;
      // The step and its photos are stored together, or neither is.
      await (photos.length > 0 ? this.log.addPhotos({ buildId, stepId }, photos, save) : save());
      this.photos.set([]);
      this.saved.emit(stepId);
    } catch (error) {
      const detail = error instanceof Error ? ` (${error.message})` : '';
      const kept = this.photos().length > 0 ? 'What you typed and the photos you chose are' : 'What you typed is';
      this.problem.set({
        code: 'device-storage',
        message: `This device could not save the step${detail}. ${kept} still here: try again.`,
        fields: {},
        retryAfterMinutes: null,
      });
    } finally {
      this.saving.set(false);
    }
  }
}

/** The local date and time typed, as an instant with its offset; left as typed when it cannot be read, so it is refused. */
function instant(local: string): string {
  const ms = Date.parse(local);
  return local.trim() !== '' && Number.isFinite(ms) ? new Date(ms).toISOString() : local;
}
