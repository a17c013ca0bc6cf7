import { ChangeDetectionStrategy, Component, computed, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatIconModule } from '@angular/material/icon';
import {
  formatPart,
  formatWeighed,
  formatDuration,
  formatLength,
  formatMass,
  formatNumber,
  formatTemperature,
  formatVolume,
  type DisplayUnits,
  type MaterialKindName,
  type PourPlanResult,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { LayerDiagram } from './layer-diagram';
import { areaUnitFor } from './pour-form';
import { PourCautions } from './pour-cautions';
import { WeighView } from './weigh-view';

const WHEN = 'EEE d MMM, HH:mm';

/** The plan as the modeller reads it at the bench: how much, how many layers, what to weigh, when. */
@Component({
  selector: 'bt-pour-plan-sheet',
  imports: [MatButtonModule, MatCardModule, MatIconModule, LayerDiagram, PourCautions, WeighView],
  templateUrl: './pour-plan-sheet.html',
  styleUrl: './pour-plan-sheet.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PourPlanSheet {
  readonly result = input.required<PourPlanResult>();
  readonly units = input.required<DisplayUnits>();
  readonly materialKind = input.required<MaterialKindName>();

  /** The weigh view is open: only the amounts, very large, the screen kept on. */
  protected readonly weighing = signal(false);

  protected readonly plan = computed(() => {
    const result = this.result();
    return result.ok ? result.plan : null;
  });
  protected readonly errors = computed(() => {
    const result = this.result();
    return result.ok ? [] : result.errors;
  });

  protected readonly volume = computed(() => {
    const plan = this.plan();
    if (!plan) return null;
    const { volume, mix } = plan;
    const unit = this.units().volume;
    return {
      toMix: formatVolume(volume.totalToMixMl, unit),
      toMixMass: formatMass(mix.exactTotal.totalG, this.units().mass),
      area: formatNumber(volume.areaMm2 / areaUnitFor(this.units()).mm2),
      areaUnit: areaUnitFor(this.units()).label,
      gross: formatVolume(volume.grossVolumeMl, unit),
      displaced: formatVolume(volume.displacedMl, unit),
      net: formatVolume(volume.netVolumeMl, unit),
      wastePercent: formatNumber(volume.wastePercent),
    };
  });

  protected readonly layers = computed(() => {
    const plan = this.plan();
    if (!plan) return null;
    return {
      count: plan.layers.count,
      depth: formatLength(plan.layers.layerDepthMm, this.units().length),
      totalDepth: formatLength(plan.request.depthMm, this.units().length),
      volume: formatVolume(plan.layers.volumePerLayerMl, this.units().volume),
      maxLayer: formatLength(plan.request.material.maxLayerMm, this.units().length),
    };
  });

  protected readonly mix = computed(() => {
    const plan = this.plan();
    if (!plan) return null;
    const { mix, request } = plan;
    const mass = (g: number, exactG: number) => formatWeighed(g, request.scaleResolutionG, this.units().mass, exactG);
    const part = (of: 'perLayer' | 'total', which: 'A' | 'B') => formatPart(mix, of, which, request, this.units());
    const ratio = request.material.mixRatio;
    return {
      byWeight: mix.basis === 'weight',
      singlePart: mix.singlePart,
      ratio: mix.singlePart
        ? 'single part'
        : `${formatNumber(ratio.partA)} : ${formatNumber(ratio.partB ?? 0)} by ${mix.basis}`,
      layerCount: mix.layerCount,
      perLayer: {
        a: part('perLayer', 'A'),
        b: part('perLayer', 'B'),
        total: mass(mix.perLayer.totalG, mix.exactPerLayer.totalG),
      },
      total: { a: part('total', 'A'), b: part('total', 'B'), total: mass(mix.total.totalG, mix.exactTotal.totalG) },
    };
  });

  protected readonly cure = computed(() => {
    const plan = this.plan();
    if (!plan) return null;
    const { cure } = plan;
    const start = cure.layers[0]?.pourAtMs ?? 0;
    const when = (ms: number) => ({ at: format(ms, WHEN), after: formatDuration((ms - start) / 60_000) });
    return {
      temperature: formatTemperature(cure.effectiveTempC, this.units().temperature),
      factor: formatNumber(cure.factor, { significant: 3 }),
      reliable: cure.reliable,
      potLife: formatDuration(cure.times.potLifeMin),
      layers: cure.layers.map((layer) => ({
        layer: layer.layer,
        pour: when(layer.pourAtMs),
        potLifeEnds: when(layer.potLifeEndsAtMs),
        recoatFrom: when(layer.recoatFromMs),
        recoatUntil: layer.recoatUntilMs === undefined ? null : when(layer.recoatUntilMs),
        last: layer.layer === cure.layers.length,
      })),
      demould: when(cure.demouldAtMs),
      fullCure: when(cure.fullCureAtMs),
    };
  });

  protected readonly warnings = computed(() => this.plan()?.warnings ?? []);
}
