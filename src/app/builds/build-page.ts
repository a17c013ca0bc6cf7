import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  LOCALE_ID,
  afterNextRender,
  afterRenderEffect,
  computed,
  inject,
  Injector,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { STEP_KINDS, displayUnitsFor, type DisplayUnits } from '@benchtide/shared';
import { format } from 'date-fns';
import type { ApiProblem } from '../core/api-error';
import { DevicePreferences } from '../core/device-preferences';
import { ProblemNote } from '../core/problem-note';
import { BuildPhotos, type BuildPhoto } from '../photos/build-photos';
import { PhotoGallery } from '../photos/photo-gallery';
import { PhotoStrip } from '../photos/photo-strip';
import type { LocalPourLayer, LocalStep } from '../sync/synced-records';
import { BuildLog, type PourDraw } from './build-log';
import { BuildSheet, type SheetHeader, type SheetStep } from './build-sheet';
import {
  STATUS_SHOWN,
  STEP_KIND_WORDS,
  activityText,
  moneyText,
  realLengthUnit,
  scaleBadge,
  sizeText,
  type StepKind,
} from './build-words';
import { PourEntry } from './pour-entry';
import { pourRecipe, type PourRecipe, type PourRecord } from './pour-recipe';
import { StepForm } from './step-form';
import { WorkshopNeeded } from './workshop-needed';

export type LogFilter = 'all' | 'steps' | 'pours' | StepKind;

type LogEntry =
  | { readonly kind: 'step'; readonly id: string; readonly atMs: number; readonly step: LocalStep }
  | {
      readonly kind: 'pour';
      readonly id: string;
      readonly atMs: number;
      readonly pour: PourRecipe;
      readonly record: PourRecord;
    };

const FILTERS: readonly { readonly value: LogFilter; readonly label: string }[] = [
  { value: 'all', label: 'All' },
  { value: 'steps', label: 'Steps' },
  { value: 'pours', label: 'Pours' },
  ...STEP_KINDS.map((kind) => ({ value: kind, label: STEP_KIND_WORDS[kind] })),
];
const WHEN = 'EEE d MMM yyyy, HH:mm';
const NO_LAYERS: readonly LocalPourLayer[] = [];

/**
 * One build and its log: the scale, the base and the real footprint it shows, then every step and pour,
 * newest first, each with its photos, then the build's photos. Builders log steps and add photos here; viewers read. Prints as a build sheet with every pour's recipe.
 */
@Component({
  selector: 'bt-build-page',
  imports: [
    MatButtonModule,
    MatChipsModule,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
    BuildSheet,
    PhotoGallery,
    PhotoStrip,
    PourEntry,
    ProblemNote,
    StepForm,
    WorkshopNeeded,
  ],
  providers: [BuildLog],
  templateUrl: './build-page.html',
  styleUrl: './build-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BuildPage {
  private readonly log = inject(BuildLog);
  private readonly preferences = inject(DevicePreferences);
  private readonly locale = inject(LOCALE_ID);
  private readonly injector = inject(Injector);
  private readonly buildPhotos = inject(BuildPhotos);

  /** From the route `builds/:buildId`. */
  readonly buildId = input.required<string>();
  /** From `?pour=`: the pour a reminder led here for, shown marked and scrolled to. */
  readonly pour = input<string>();
  private readonly stepFormHost = viewChild<ElementRef<HTMLElement>>('stepFormHost');

  protected readonly filters = FILTERS;
  protected readonly kindWords = STEP_KIND_WORDS;
  protected readonly workshop = this.log.workshop;
  protected readonly signedIn = this.log.signedIn;
  protected readonly canWrite = this.log.canWrite;
  protected readonly filter = signal<LogFilter>('all');
  /** 'new' while a step is being logged, a step's id while it is changed. */
  protected readonly editingStep = signal<string | null>(null);
  protected readonly confirmingDelete = signal<string | null>(null);
  protected readonly problem = signal<ApiProblem | null>(null);

  private readonly followed = this.log.follow(this.buildId);
  protected readonly build = this.followed.build;
  protected readonly photos = this.buildPhotos.ofBuild(this.buildId);
  /** The photos of each step and pour, by its id. */
  private readonly photosByEntry = computed(() => {
    const byEntry = new Map<string, BuildPhoto[]>();
    for (const entry of this.photos()) {
      const key = entry.photo.stepId ?? entry.photo.pourId;
      if (key !== null) byEntry.set(key, [...(byEntry.get(key) ?? []), entry]);
    }
    return byEntry;
  });
  protected readonly units = computed<DisplayUnits>(() => {
    const { unitSystem, temperatureUnit } = this.preferences.values();
    return { ...displayUnitsFor(unitSystem), temperature: temperatureUnit };
  });
  private readonly materials = computed(() => new Map(this.log.materials().map((material) => [material.id, material])));
  protected readonly recipes = computed(() =>
    this.followed
      .pours()
      .map((pour: PourRecord) => pourRecipe(pour, this.materials().get(pour.materialId), this.units())),
  );
  protected readonly header = computed<SheetHeader | null>(() => {
    const build = this.build();
    if (!build) return null;
    const units = this.units();
    const real = realLengthUnit(this.preferences.values().unitSystem);
    const cost = this.followed
      .costs()
      .map((sum) => moneyText(sum.minor, sum.currency, this.locale))
      .join(' + ');
    return {
      name: build.name,
      scale: scaleBadge(build),
      status: STATUS_SHOWN[build.status].word,
      base: sizeText(build.baseWidthMm ?? null, build.baseDepthMm ?? null, units.length),
      real: sizeText(build.realWidthMm ?? null, build.realDepthMm ?? null, real),
      cost: cost === '' ? null : cost,
      notes: build.notes,
    };
  });
  protected readonly status = computed(() => {
    const build = this.build();
    return build ? STATUS_SHOWN[build.status] : null;
  });
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  private readonly scrolledTo = signal<string | null>(null);
  private readonly scrollToPour = afterRenderEffect(() => {
    const pourId = this.pour();
    if (!pourId || this.scrolledTo() === pourId) return;
    const entry = this.host.nativeElement.querySelector(`[data-pour="${CSS.escape(pourId)}"]`);
    if (entry === null) return;
    entry.scrollIntoView({ block: 'center' });
    this.scrolledTo.set(pourId);
  });
  protected readonly entries = computed<LogEntry[]>(() => {
    const filter = this.filter();
    const steps =
      filter === 'pours'
        ? []
        : this.followed.steps().filter((step) => filter === 'all' || filter === 'steps' || step.kind === filter);
    const records = new Map(this.followed.pours().map((pour) => [pour.id, pour as PourRecord]));
    const pours = filter === 'all' || filter === 'pours' ? this.recipes() : [];
    const entries: LogEntry[] = [
      ...steps.map((step) => ({ kind: 'step' as const, id: step.id, atMs: Date.parse(step.happenedAt), step })),
      ...pours.map((pour) => ({
        kind: 'pour' as const,
        id: pour.id,
        atMs: pour.startAtMs,
        pour,
        record: records.get(pour.id)!,
      })),
    ];
    return entries.sort((a, b) => b.atMs - a.atMs);
  });
  protected readonly sheetSteps = computed<SheetStep[]>(() =>
    [...this.followed.steps()]
      .sort((a, b) => Date.parse(a.happenedAt) - Date.parse(b.happenedAt))
      .map((step) => ({
        id: step.id,
        at: this.when(step.happenedAt),
        kind: STEP_KIND_WORDS[step.kind],
        title: step.title,
        notes: step.notes,
      })),
  );
  protected readonly pending = computed(
    () =>
      this.followed.pours().filter((pour) => pour.pending).length +
      this.followed.steps().filter((step) => step.pending).length,
  );

  protected layersOf(pourId: string): readonly LocalPourLayer[] {
    return this.followed.layers().get(pourId) ?? NO_LAYERS;
  }

  protected drawOf(pourId: string): PourDraw | undefined {
    return this.followed.draws().get(pourId);
  }

  protected photosOf(entryId: string): readonly BuildPhoto[] {
    return this.photosByEntry().get(entryId) ?? [];
  }

  protected when(at: string): string {
    const ms = Date.parse(at);
    return Number.isFinite(ms) ? format(ms, WHEN) : 'an unknown time';
  }

  protected ago(atMs: number): string {
    return activityText(new Date(atMs).toISOString(), this.log.now());
  }

  protected chooseFilter(value: LogFilter | undefined): void {
    this.filter.set(value ?? 'all');
  }

  protected startStep(id: string): void {
    this.confirmingDelete.set(null);
    this.editingStep.set(id);
    if (id !== 'new') return;
    afterNextRender(() => this.stepFormHost()?.nativeElement.scrollIntoView({ block: 'start' }), {
      injector: this.injector,
    });
  }

  protected stepDone(): void {
    this.editingStep.set(null);
  }

  protected async deleteStep(id: string): Promise<void> {
    this.problem.set(null);
    try {
      await this.log.deleteStep(id);
      this.confirmingDelete.set(null);
    } catch (error) {
      const detail = error instanceof Error ? ` (${error.message})` : '';
      this.problem.set({
        code: 'device-storage',
        message: `This device could not delete the step${detail}. It is still in the log: try again.`,
        fields: {},
        retryAfterMinutes: null,
      });
    }
  }

  protected print(): void {
    window.print();
  }
}
