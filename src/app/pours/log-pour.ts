import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { type AbstractControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import {
  formatMass,
  formatNumber,
  formatVolume,
  fromCelsius,
  fromMl,
  fromMm,
  may,
  TEMPERATURE_LABELS,
  isPourMaterialKind,
  type MaterialKindName,
  type PourUse,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { Submission } from '../core/submission';
import type { LocalPour } from '../sync/synced-records';
import { FeatureShapeFields } from './feature-shape-fields';
import { PourDraft } from './pour-draft';
import { fieldText, shapeFields } from './pour-form';
import { PourLog, type ContainerWithStock } from './pour-log';
import { PourPlanSheet } from './pour-plan-sheet';

/** Which field a message of the shared maths is about. */
const FIELD_OF_PATH: Readonly<Record<string, string>> = {
  'shape.lengthMm': 'length',
  'shape.widthMm': 'width',
  'shape.diameterMm': 'diameter',
  'shape.areaMm2': 'area',
  'shape.points': 'outline',
  depthMm: 'depth',
  displacedMl: 'displaced',
  wastePercent: 'wastePercent',
  startAtMs: 'startAt',
  layerCount: 'layerCount',
};

/**
 * Logging a pour: one screen that grows from the build and the feature to the plan, the stock it takes
 * and the cautions. A repeat of the last pour is two taps: "Repeat" then "Start pour". Everything is
 * worked out on the device and saved there first; the server plans it again when it arrives.
 */
@Component({
  selector: 'bt-log-pour',
  providers: [ROOMY_FORM_FIELDS, PourDraft],
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatCardModule,
    MatCheckboxModule,
    MatChipsModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    FeatureShapeFields,
    PourPlanSheet,
  ],
  templateUrl: './log-pour.html',
  styleUrl: './log-pour.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LogPour {
  private readonly pourLog = inject(PourLog);
  private readonly router = inject(Router);
  protected readonly draft = inject(PourDraft);

  /** `?build=` from a build's page. */
  readonly build = input<string>();

  protected readonly form = this.draft.form;
  protected readonly builds = this.draft.builds;
  protected readonly materials = this.draft.materials;
  protected readonly lastPour = this.draft.lastPour;
  protected readonly mayLog = computed(() => may(this.pourLog.workshop()?.role, 'write-builds'));
  protected readonly signedIn = computed(() => this.pourLog.workshop() !== null);
  protected readonly stock = this.draft.stock;
  protected readonly material = this.draft.material;
  protected readonly units = this.draft.units;
  /** A poured material of another kind gets the fullest set of cautions, the two-part resin's. */
  protected readonly cautionKind = computed<MaterialKindName>(() => {
    const kind = this.material()?.kind;
    return kind === undefined || !isPourMaterialKind(kind) ? 'two-part-epoxy' : kind;
  });
  protected readonly temperatureLabel = computed(() => TEMPERATURE_LABELS[this.units().temperature]);
  protected readonly result = this.draft.result;
  protected readonly draw = this.draft.draw;
  protected readonly cost = this.draft.cost;
  protected readonly submitted = signal(false);
  /** The maths' messages, each shown once its field was typed in or "Start pour" was pressed. */
  protected readonly errors = computed(() => {
    const result = this.result();
    if (result === null || result.ok) return new Map<string, string>();
    this.draft.value(); // read for its changes: a field turns dirty as it is typed in, which no signal reports
    const shown = result.errors.filter((error) => this.submitted() || this.isTyped(error.path));
    return new Map(shown.map((error) => [error.path, error.message]));
  });

  private readonly submission = new Submission();
  protected readonly saving = this.submission.sending;
  protected readonly problem = this.submission.problemText;

  constructor() {
    this.draft.followLink(this.build);
  }

  /** What the last pour was, in a line, for the repeat button. */
  protected describe(pour: LocalPour): string {
    const build = this.builds().find((b) => b.id === pour.buildId)?.name ?? 'a build';
    const material = this.materials().find((m) => m.id === pour.materialId)?.name ?? 'a material';
    const mixed = `, ${formatMass(pour.plan.mix.total.totalG, this.units().mass)} mixed`;
    return `${pour.note || build} · ${material}${mixed}`;
  }

  /** Copies the last pour's feature, depth, material and room. */
  protected repeat(pour: LocalPour): void {
    const { request } = pour;
    const units = this.units();
    this.form.patchValue({
      ...shapeFields(request.shape, units),
      note: pour.note,
      depth: fieldText(fromMm(request.depthMm, units.length)),
      displaced: fieldText(fromMl(request.displacedMl, units.volume)),
      wastePercent: fieldText(request.wastePercent),
      containerIds: [],
      recordShortfall: false,
    });
    this.draft.repeatLayers(request.layerCount);
    this.draft.chooseMaterial(pour.materialId);
    this.draft.typeRoom(fieldText(fromCelsius(request.roomTempC, units.temperature)));
    // From a build's page the build stays; from the bench, the repeat goes into the last pour's build.
    if (this.build() === undefined) this.draft.chooseBuild(pour.buildId);
  }

  protected containerLabel(container: ContainerWithStock): string {
    const part = container.part === 'single' ? '' : `Part ${container.part} · `;
    const left = `${formatNumber(Math.max(0, container.remainingQty))} ${container.unit} left`;
    return `${part}bought ${format(container.boughtOn, 'd MMM yyyy')}${container.lot ? ` · lot ${container.lot}` : ''} · ${left}`;
  }

  protected useText(use: PourUse): string {
    const container = this.stock().find((c) => c.id === use.containerId);
    const unit = container?.unit ?? 'g';
    const amount =
      unit === 'g' ? formatMass(use.quantity, this.units().mass) : formatVolume(use.quantity, this.units().volume);
    const from = container ? `the container bought ${format(container.boughtOn, 'd MMM yyyy')}` : 'a container';
    return `${this.partLabel(use.part)}: ${amount} from ${from}`;
  }

  protected partLabel(part: string): string {
    return part === 'single' ? 'Medium' : `Part ${part}`;
  }

  protected shortLabel(quantityG: number): string {
    return formatMass(quantityG, this.units().mass);
  }

  protected startNow(): void {
    this.form.controls.startAt.setValue('');
  }

  protected async start(): Promise<void> {
    this.submitted.set(true);
    const toLog = this.draft.toLog();
    const saved = await this.submission.save(
      async () => {
        if (!('pour' in toLog)) return;
        await this.pourLog.log(toLog.pour);
        this.draft.remember(toLog.pour.buildId);
      },
      {
        refused: 'problem' in toLog ? toLog.problem : null,
        failed: 'The pour could not be saved on this device. Nothing was changed.',
      },
    );
    if (saved) await this.router.navigateByUrl('/');
  }

  /** Whether the field a message of the shared maths is about was typed in. */
  private isTyped(path: string): boolean {
    if (path === 'roomTempC') return this.draft.roomTyped();
    if (path === 'layerCount') return this.draft.layersChosen();
    const name = FIELD_OF_PATH[path];
    const control: AbstractControl | null = name === undefined ? null : this.form.get(name);
    return control?.dirty !== false;
  }
}
