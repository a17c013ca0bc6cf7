import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import {
  BUILD_STATUSES,
  UNIT_LABELS,
  buildPatchSchema,
  findScale,
  newBuildSchema,
  type ScaleEntry,
} from '@benchtide/shared';
import { map, startWith } from 'rxjs';
import { v7 } from 'uuid';
import type * as z from 'zod';
import type { ApiProblem } from '../core/api-error';
import { DevicePreferences } from '../core/device-preferences';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { ProblemNote } from '../core/problem-note';
import { UnitSystemToggle } from '../core/unit-system-toggle';
import { ScalePicker } from '../scale-tools/scale-picker';
import type { LocalBuild } from '../sync/synced-records';
import {
  NO_SAVED_SIZES,
  buildFields,
  createBuildForm,
  emptiedSizes,
  fieldMessages,
  savedScale,
  savedSizesOf,
  sizeFieldText,
  sizeUnitsFor,
  sizesFrom,
  type BuildField,
  type SavedSizes,
  type SizeFrom,
  type SizeUnits,
} from './build-form';
import { BuildLog } from './build-log';
import { STATUS_SHOWN, scaleBadge, sizeText } from './build-words';
import { WorkshopNeeded } from './workshop-needed';

const BASE_KEYS = ['baseWidthMm', 'baseDepthMm'] as const;
const REAL_KEYS = ['realWidthMm', 'realDepthMm'] as const;

/**
 * A new build, or the name, scale, status, size and notes of one: the base size or the real footprint is
 * typed and the other follows from the scale as it is typed. Saved on this device at once.
 */
@Component({
  selector: 'bt-build-editor',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ProblemNote,
    ScalePicker,
    UnitSystemToggle,
    WorkshopNeeded,
  ],
  providers: [BuildLog, ROOMY_FORM_FIELDS],
  templateUrl: './build-editor.html',
  styleUrl: './build-editor.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BuildEditor {
  private readonly log = inject(BuildLog);
  private readonly router = inject(Router);
  private readonly preferences = inject(DevicePreferences);
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly injector = inject(Injector);

  /** From the route `builds/:buildId/edit`; absent for a new build. */
  readonly buildId = input<string>();

  protected readonly form = createBuildForm();
  protected readonly statuses = BUILD_STATUSES;
  protected readonly statusShown = STATUS_SHOWN;
  protected readonly workshop = this.log.workshop;
  protected readonly signedIn = this.log.signedIn;
  protected readonly canWrite = this.log.canWrite;
  protected readonly editing = computed(() => this.buildId() !== undefined);
  protected readonly build = this.log.follow(computed(() => this.buildId() ?? null)).build;
  protected readonly backLink = computed(() => {
    const build = this.build();
    return build ? ['/builds', build.id] : ['/builds'];
  });
  protected readonly scale = signal<ScaleEntry | null>(findScale('ho') ?? null);
  protected readonly units = computed(() => sizeUnitsFor(this.preferences.values().unitSystem));
  protected readonly labels = computed(() => ({
    base: UNIT_LABELS[this.units().base],
    real: UNIT_LABELS[this.units().real],
  }));
  protected readonly attempted = signal(false);
  protected readonly saving = signal(false);
  protected readonly problem = signal<ApiProblem | null>(null);
  protected readonly confirmingDelete = signal(false);

  /** The id a new build gets, made once so the live checks and the save speak of the same build. */
  private readonly newId = v7();
  private filledFrom: string | null = null;
  private shownUnits: SizeUnits = this.units();
  private readonly saved = signal<SavedSizes>(NO_SAVED_SIZES);
  private readonly formValue = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  protected readonly sizeFrom = computed(() => this.formValue().sizeFrom);
  private readonly sizes = computed(() =>
    sizesFrom(this.formValue(), this.scale()?.ratio ?? null, this.units(), this.saved()),
  );
  private readonly fields = computed(() => buildFields(this.formValue(), this.scale(), this.sizes()));
  private readonly issues = computed(() => {
    const checked = this.editing()
      ? buildPatchSchema.safeParse(this.fields())
      : newBuildSchema.safeParse({ id: this.newId, ...this.fields() });
    return checked.success ? [] : checked.error.issues;
  });
  private readonly errors = computed(() => {
    const messages = fieldMessages(this.issues());
    for (const [field, message] of emptiedSizes(this.formValue(), this.saved())) messages.set(field, message);
    return messages;
  });
  /** The side not typed, worked out from the typed one and the scale. */
  protected readonly worked = computed(() => {
    const sizes = this.sizes();
    const units = this.units();
    const scale = this.scale();
    if (this.sizeFrom() === 'base') {
      const real = sizeText(sizes.realWidthMm ?? null, sizes.realDepthMm ?? null, units.real);
      return real && scale
        ? `Shows ${real} of the real world at ${scaleBadge({ scaleId: scale.id, scaleRatio: scale.ratio })}`
        : null;
    }
    const base = sizeText(sizes.baseWidthMm ?? null, sizes.baseDepthMm ?? null, units.base);
    return base && scale
      ? `Needs a base of ${base} at ${scaleBadge({ scaleId: scale.id, scaleRatio: scale.ratio })}`
      : null;
  });

  constructor() {
    // Filled once from the saved build: later changes synced in must not overwrite what is being typed.
    effect(() => {
      const build = this.build();
      if (!build) return;
      untracked(() => this.fill(build));
    });
    effect(() => {
      const next = this.units();
      untracked(() => this.convertTyped(next));
    });
  }

  protected error(field: BuildField): string | null {
    const message = this.errors().get(field) ?? null;
    if (message === null) return null;
    // An unreadable 1:N is explained by the scale picker itself.
    if (field === 'scale') return this.attempted() && this.scale() !== null ? message : null;
    if (this.attempted()) return message;
    return this.form.controls[field].dirty ? message : null;
  }

  protected chooseSizeFrom(next: SizeFrom): void {
    const sizes = this.sizes();
    const units = this.units();
    const side =
      next === 'base'
        ? { width: sizes.baseWidthMm, depth: sizes.baseDepthMm }
        : { width: sizes.realWidthMm, depth: sizes.realDepthMm };
    // The worked-out side becomes the typed one; an unreadable entry stays as typed for the modeller to fix.
    const value = this.formValue();
    this.form.patchValue({
      sizeFrom: next,
      width:
        side.width === undefined && value.width.trim() !== '' ? value.width : sizeFieldText(side.width, next, units),
      depth:
        side.depth === undefined && value.depth.trim() !== '' ? value.depth : sizeFieldText(side.depth, next, units),
    });
  }

  protected async save(): Promise<void> {
    this.attempted.set(true);
    this.problem.set(null);
    const build = this.build();
    if (this.errors().size > 0) {
      this.focusFirstError();
      return;
    }
    if (this.saving() || (this.editing() && !build)) return;
    this.saving.set(true);
    try {
      let id: string;
      if (build) {
        id = build.id;
        const patch = this.changes(build, buildPatchSchema.parse(this.fields()));
        if (Object.keys(patch).length > 0) await this.log.patchBuild(id, patch);
      } else {
        id = await this.log.createBuild(newBuildSchema.parse({ id: this.newId, ...this.fields() }));
      }
      this.form.markAsPristine();
      await this.router.navigate(['/builds', id]);
    } catch (error) {
      this.problem.set(storageProblem(error));
    } finally {
      this.saving.set(false);
    }
  }

  protected async remove(): Promise<void> {
    const build = this.build();
    if (!build || this.saving()) return;
    this.saving.set(true);
    try {
      await this.log.deleteBuild(build.id);
      await this.router.navigate(['/builds']);
    } catch (error) {
      this.problem.set(storageProblem(error));
    } finally {
      this.saving.set(false);
    }
  }

  /** A gloved thumb needn't hunt for what to fix: the first field with a message takes the focus. */
  private focusFirstError(): void {
    const fields: readonly BuildField[] = ['name', 'width', 'depth', 'notes'];
    const first = fields.find((field) => this.errors().has(field));
    if (first === undefined) return;
    afterNextRender(() => this.host.nativeElement.querySelector<HTMLElement>(`[data-field="${first}"]`)?.focus(), {
      injector: this.injector,
    });
  }

  private fill(build: LocalBuild): void {
    if (this.filledFrom === build.id) return;
    this.filledFrom = build.id;
    const saved = savedSizesOf(build);
    const sizeFrom: SizeFrom =
      saved.baseWidthMm === null &&
      saved.baseDepthMm === null &&
      (saved.realWidthMm !== null || saved.realDepthMm !== null)
        ? 'real'
        : 'base';
    const units = this.units();
    this.saved.set(saved);
    this.scale.set(savedScale(build));
    this.form.reset({
      name: build.name,
      status: build.status,
      sizeFrom,
      width: sizeFieldText(sizeFrom === 'base' ? saved.baseWidthMm : saved.realWidthMm, sizeFrom, units),
      depth: sizeFieldText(sizeFrom === 'base' ? saved.baseDepthMm : saved.realDepthMm, sizeFrom, units),
      notes: build.notes,
    });
  }

  /** Typed lengths follow a change of units: a saved value exactly, a typed one as read. */
  private convertTyped(next: SizeUnits): void {
    const from = this.shownUnits;
    this.shownUnits = next;
    if (from.base === next.base && from.real === next.real) return;
    const value = this.form.getRawValue();
    const sizes = sizesFrom(value, this.scale()?.ratio ?? null, from, this.saved());
    const side = value.sizeFrom;
    const keep = (typed: string, mm: number | undefined) =>
      mm === undefined || !Number.isFinite(mm) ? typed : sizeFieldText(mm, side, next);
    this.form.patchValue({
      width: keep(value.width, side === 'base' ? sizes.baseWidthMm : sizes.realWidthMm),
      depth: keep(value.depth, side === 'base' ? sizes.baseDepthMm : sizes.realDepthMm),
    });
  }

  /**
   * Only what changed is sent, so an edit made on another device to a field left alone here is kept. A new
   * scale or a new typed size sends every size, worked out again, so base and footprint stay in step.
   */
  private changes(build: LocalBuild, data: z.output<typeof buildPatchSchema>): Record<string, unknown> {
    const patch: Record<string, unknown> = {};
    if (data.name !== build.name) patch['name'] = data.name;
    if (data.status !== build.status) patch['status'] = data.status;
    if (data.notes !== build.notes) patch['notes'] = data.notes;
    const scaleId = data.scaleId ?? '';
    const scaleChanged = data.scaleRatio !== build.scaleRatio || scaleId !== (build.scaleId ?? '');
    // An empty id marks a custom ratio: a change can set a field but not take it away.
    if (scaleChanged) Object.assign(patch, { scaleRatio: data.scaleRatio, scaleId });
    // The typed side decides: the worked-out side may differ from the saved one in the last binary digit.
    const typed = this.sizeFrom() === 'base' ? BASE_KEYS : REAL_KEYS;
    const sizesChanged = typed.some((key) => (data[key] ?? null) !== (build[key] ?? null));
    if (scaleChanged || sizesChanged) {
      for (const key of [...BASE_KEYS, ...REAL_KEYS]) if (data[key] !== undefined) patch[key] = data[key];
    }
    return patch;
  }
}

function storageProblem(error: unknown): ApiProblem {
  const detail = error instanceof Error ? ` (${error.message})` : '';
  return {
    code: 'device-storage',
    message: `This device could not save the build${detail}. Nothing was lost from the form: try Save again.`,
    fields: {},
    retryAfterMinutes: null,
  };
}
