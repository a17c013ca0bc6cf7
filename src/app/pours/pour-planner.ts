import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, untracked } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatCardModule } from '@angular/material/card';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { displayUnitsFor, MATERIAL_PRESETS, planPour, TEMPERATURE_LABELS, type DisplayUnits } from '@benchtide/shared';
import { format } from 'date-fns';
import { map, startWith } from 'rxjs';
import { CUP_RESOLUTIONS_ML, DevicePreferences, SCALE_RESOLUTIONS_G } from '../core/device-preferences';
import { UnitSystemToggle } from '../core/unit-system-toggle';
import { PourPlanDraft } from './pour-plan-draft';
import { PourPlanSheet } from './pour-plan-sheet';
import { DataSheetFields, dataSheetErrors } from './data-sheet-fields';
import { FeatureShapeFields } from './feature-shape-fields';
import { convertFields, fewestLayers, presetFields, toPlanRequest } from './pour-form';
import { ROOMY_FORM_FIELDS } from '../core/form-field-defaults';

function sameUnits(a: DisplayUnits, b: DisplayUnits): boolean {
  return a.length === b.length && a.volume === b.volume && a.mass === b.mass && a.temperature === b.temperature;
}

@Component({
  providers: [ROOMY_FORM_FIELDS],
  selector: 'bt-pour-planner',
  imports: [
    ReactiveFormsModule,
    MatCardModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    UnitSystemToggle,
    PourPlanSheet,
    FeatureShapeFields,
    DataSheetFields,
  ],
  templateUrl: './pour-planner.html',
  styleUrl: './pour-planner.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourPlanner {
  private readonly preferences = inject(DevicePreferences);
  private readonly draft = inject(PourPlanDraft);

  protected readonly form = this.draft.form;
  protected readonly presets = MATERIAL_PRESETS;
  protected readonly resolutions = SCALE_RESOLUTIONS_G;
  protected readonly cupMarks = CUP_RESOLUTIONS_ML;

  protected readonly units = computed<DisplayUnits>(() => {
    const { unitSystem, temperatureUnit } = this.preferences.values();
    return { ...displayUnitsFor(unitSystem), temperature: temperatureUnit };
  });
  protected readonly labels = computed(() => ({ temperature: TEMPERATURE_LABELS[this.units().temperature] }));
  protected readonly scaleResolutionG = computed(() => this.preferences.values().scaleResolutionG);
  protected readonly cupResolutionMl = computed(() => this.preferences.values().cupResolutionMl);

  private readonly formValue = toSignal(
    this.form.valueChanges.pipe(
      startWith(null),
      map(() => this.form.getRawValue()),
    ),
    { requireSync: true },
  );
  protected readonly result = computed(() => planPour(this.request()));
  protected readonly request = computed(() =>
    toPlanRequest(this.formValue(), this.units(), this.scaleResolutionG(), this.cupResolutionMl()),
  );
  protected readonly fewest = computed(() => {
    const request = this.request();
    return fewestLayers(request.depthMm, request.material.maxLayerMm, this.units());
  });
  private readonly layersTyped = signal(false);
  /** What the Layers field shows: the fewest until the modeller types there (emptied, it plans the fewest). */
  protected readonly layersShown = computed(() => {
    const typed = this.formValue().layerCount;
    return typed !== '' || this.layersTyped() ? typed : String(this.fewest()?.count ?? '');
  });
  protected readonly errors = computed(() => {
    const result = this.result();
    return result.ok ? new Map<string, string>() : new Map(result.errors.map((error) => [error.path, error.message]));
  });
  protected readonly sheetErrors = computed(() => dataSheetErrors(this.errors(), 'material.'));
  protected readonly materialKind = computed(
    () => MATERIAL_PRESETS.find((preset) => preset.id === this.formValue().presetId)?.kind ?? 'two-part-epoxy',
  );

  constructor() {
    // Compared by content: a change of scale alone must not rewrite what the modeller typed.
    effect(() => {
      const next = this.units();
      untracked(() => {
        const from = this.draft.units;
        if (!sameUnits(from, next)) {
          this.form.patchValue(convertFields(this.form.getRawValue(), from, next));
          this.draft.units = next;
        }
      });
    });
    effect(() => this.draft.save(this.formValue(), this.units()));
  }

  protected error(path: string): string | undefined {
    return this.errors().get(path);
  }

  protected choosePreset(presetId: string): void {
    this.form.patchValue({ presetId, ...presetFields(presetId, this.units()) });
  }

  protected chooseResolution(scaleResolutionG: number): void {
    this.preferences.update({ scaleResolutionG });
  }

  protected chooseCupMarks(cupResolutionMl: number): void {
    this.preferences.update({ cupResolutionMl });
  }

  protected typeLayers(typed: string): void {
    this.layersTyped.set(true);
    this.form.controls.layerCount.setValue(typed);
  }

  protected startNow(): void {
    this.form.patchValue({ startAt: format(new Date(), "yyyy-MM-dd'T'HH:mm") });
  }
}
