import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { type AbstractControl, FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
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
  displayUnitsFor,
  drawForPour,
  formatMass,
  formatNumber,
  formatVolume,
  fromCelsius,
  fromMl,
  fromMm,
  may,
  planPour,
  TEMPERATURE_LABELS,
  toCelsius,
  toMl,
  toMm,
  type DisplayUnits,
  type MaterialKind,
  type PourPlanRequestInput,
  type PourUse,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { map, startWith, timer } from 'rxjs';
import { DevicePreferences } from '../core/device-preferences';
import { parseDecimal } from '../core/decimal-input';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';
import { StockShortError } from '../sync/offline-store';
import type { LocalPour } from '../sync/synced-records';
import { FeatureShapeFields } from './feature-shape-fields';
import { featureControls, fieldText, shapeFields, shapeFrom, text } from './pour-form';
import { PourLog, type ContainerWithStock } from './pour-log';
import { PourPlanSheet } from './pour-plan-sheet';

/** A room in a house, when nothing better is known (common practice). */
const USUAL_ROOM_C = 20;
const LAST_BUILD_KEY = 'benchtide.last-pour-build';

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
  roomTempC: 'roomTemp',
  startAtMs: 'startAt',
};

function number(value: string): number {
  return parseDecimal(value) ?? Number.NaN;
}

/**
 * Logging a pour: one screen that grows from the build and the feature to the plan, the stock it takes
 * and the cautions. A repeat of the last pour is two taps: "Repeat" then "Start pour". Everything is
 * worked out on the device and saved there first; the server plans it again when it arrives.
 */
@Component({
  selector: 'bt-log-pour',
  providers: [ROOMY_FORM_FIELDS],
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
  private readonly preferences = inject(DevicePreferences);
  private readonly router = inject(Router);

  /** `?build=` from a build's page. */
  readonly build = input<string>();

  protected readonly form = new FormGroup({
    buildId: text(),
    note: text(),
    ...featureControls(),
    materialId: text(),
    roomTemp: text(),
    /** Empty: the pour starts when "Start pour" is pressed. */
    startAt: text(),
    containerIds: new FormControl<string[]>([], { nonNullable: true }),
    recordShortfall: new FormControl(false, { nonNullable: true }),
  });

  protected readonly builds = this.pourLog.builds();
  protected readonly materials = this.pourLog.materials();
  protected readonly lastPour = this.pourLog.lastPour();
  protected readonly mayLog = computed(() => may(this.pourLog.workshop()?.role, 'write-builds'));
  protected readonly signedIn = computed(() => this.pourLog.workshop() !== null);

  private readonly value = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  /** Minutes tick, so "start now" plans stay current while the modeller stirs. */
  private readonly minute = toSignal(timer(0, 60_000).pipe(map(() => Date.now())), { initialValue: Date.now() });
  private readonly materialId = computed(() => this.value().materialId || null);
  protected readonly stock = this.pourLog.stockOf(this.materialId);
  protected readonly material = computed(() => this.materials().find((m) => m.id === this.materialId()) ?? null);

  protected readonly units = computed<DisplayUnits>(() => {
    const { unitSystem, temperatureUnit } = this.preferences.values();
    return { ...displayUnitsFor(unitSystem), temperature: temperatureUnit };
  });
  /** A material of another kind gets the fullest set of cautions, the two-part resin's. */
  protected readonly cautionKind = computed<MaterialKind>(() => {
    const kind = this.material()?.kind;
    return kind === undefined || kind === 'other' ? 'two-part-epoxy' : kind;
  });
  protected readonly temperatureLabel = computed(() => TEMPERATURE_LABELS[this.units().temperature]);

  private readonly request = computed<PourPlanRequestInput | null>(() => {
    const material = this.material();
    if (material === null) return null;
    const value = this.value();
    const units = this.units();
    return {
      shape: shapeFrom(value, units),
      depthMm: toMm(number(value.depth), units.length),
      displacedMl: toMl(number(value.displaced || '0'), units.volume),
      wastePercent: number(value.wastePercent || '0'),
      material: material.dataSheet,
      roomTempC: toCelsius(number(value.roomTemp), units.temperature),
      startAtMs: this.startAtMs(),
      scaleResolutionG: this.preferences.values().scaleResolutionG,
    };
  });
  protected readonly result = computed(() => {
    const request = this.request();
    return request === null ? null : planPour(request);
  });
  protected readonly submitted = signal(false);
  /** The maths' messages, each shown once its field was typed in or "Start pour" was pressed. */
  protected readonly errors = computed(() => {
    const result = this.result();
    if (result === null || result.ok) return new Map<string, string>();
    this.value(); // read for its changes: a field turns dirty as it is typed in, which no signal reports
    const shown = result.errors.filter((error) => this.submitted() || this.fieldOf(error.path)?.dirty !== false);
    return new Map(shown.map((error) => [error.path, error.message]));
  });
  protected readonly draw = computed(() => {
    const result = this.result();
    if (result === null || !result.ok) return null;
    const chosen = this.value().containerIds;
    return drawForPour(result.plan, this.stock(), chosen.length > 0 ? chosen : undefined);
  });
  protected readonly cost = computed(() => {
    const draw = this.draw();
    const currency = this.stock()[0]?.currency;
    if (draw === null || currency === undefined) return null;
    const minor = draw.uses.reduce((sum, use) => sum + use.costMinor, 0);
    return new Intl.NumberFormat(undefined, { style: 'currency', currency }).format(minor / 100);
  });

  protected readonly saving = signal(false);
  protected readonly problem = signal<string | null>(null);

  constructor() {
    // The build comes from the link, or is the one last poured into on this device, or the latest.
    effect(() => {
      const builds = this.builds();
      const wanted = this.build() ?? stored(LAST_BUILD_KEY);
      untracked(() => {
        if (this.form.controls.buildId.value !== '' || builds.length === 0) return;
        const id = builds.find((b) => b.id === wanted)?.id ?? builds[0]!.id;
        this.form.controls.buildId.setValue(id);
      });
    });
    effect(() => {
      const materials = this.materials();
      const last = this.lastPour();
      untracked(() => {
        if (this.form.controls.materialId.value !== '' || materials.length === 0) return;
        const id = materials.find((m) => m.id === last?.materialId)?.id ?? materials[0]!.id;
        this.form.controls.materialId.setValue(id);
      });
    });
    effect(() => {
      const roomC = this.lastPour()?.request.roomTempC ?? USUAL_ROOM_C;
      const unit = this.units().temperature;
      untracked(() => {
        if (this.form.controls.roomTemp.value === '') {
          this.form.controls.roomTemp.setValue(fieldText(fromCelsius(roomC, unit)));
        }
      });
    });
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
      materialId: pour.materialId,
      roomTemp: fieldText(fromCelsius(request.roomTempC, units.temperature)),
      containerIds: [],
      recordShortfall: false,
    });
    // From a build's page the build stays; from the bench, the repeat goes into the last pour's build.
    if (this.build() === undefined) this.form.controls.buildId.setValue(pour.buildId);
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
    this.problem.set(null);
    this.submitted.set(true);
    const value = this.form.getRawValue();
    const request = this.request();
    const result = this.result();
    if (value.buildId === '') return this.problem.set('Choose the build this pour is for.');
    if (request === null) return this.problem.set('Choose a material from the shelf.');
    if (result === null || !result.ok)
      return this.problem.set('Some values need another look: see the notes beside the fields.');
    const draw = this.draw();
    if (draw && draw.shortfall.length > 0 && !value.recordShortfall) {
      return this.problem.set(
        'The shelf does not hold enough for this pour. Add a container on the Shelf, or tick that the rest comes from a bottle not on the shelf.',
      );
    }
    this.saving.set(true);
    try {
      await this.pourLog.log({
        buildId: value.buildId,
        materialId: value.materialId,
        shape: request.shape,
        depthMm: request.depthMm,
        displacedMl: request.displacedMl ?? 0,
        wastePercent: request.wastePercent ?? 0,
        roomTempC: request.roomTempC,
        startAt: new Date(this.startAtMs()).toISOString(),
        scaleResolutionG: request.scaleResolutionG ?? 0.1,
        ...(value.containerIds.length > 0 ? { containerIds: value.containerIds } : {}),
        whenShort: value.recordShortfall ? 'record-shortfall' : 'refuse',
        note: value.note,
      });
      store(LAST_BUILD_KEY, value.buildId);
      await this.router.navigateByUrl('/');
    } catch (error) {
      this.problem.set(
        error instanceof StockShortError || error instanceof Error
          ? error.message
          : 'The pour could not be saved on this device. Nothing was changed.',
      );
    } finally {
      this.saving.set(false);
    }
  }

  private fieldOf(path: string): AbstractControl | undefined {
    const name = FIELD_OF_PATH[path];
    return name === undefined ? undefined : (this.form.get(name) ?? undefined);
  }

  private startAtMs(): number {
    const typed = this.value().startAt;
    return typed === '' ? this.minute() : new Date(typed).getTime();
  }
}

function stored(key: string): string | null {
  try {
    return localStorage.getItem(key);
  } catch {
    return null;
  }
}

function store(key: string, value: string): void {
  try {
    localStorage.setItem(key, value);
  } catch {
    // Private browsing: the next pour just starts from the latest build.
  }
}
