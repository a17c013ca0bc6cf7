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
  type MaterialKind,
} from '@benchtide/shared';
import { format } from 'date-fns';
import { areaUnitFor } from '../pours/pour-form';
import type { LocalMaterial, LocalPour } from '../sync/synced-records';

const WHEN = 'EEE d MMM yyyy, HH:mm';

/** A pour as this device may hold it: one logged by an older version waits for the server's plan. */
export type PourRecord = Omit<LocalPour, 'plan' | 'request'> & {
  plan: LocalPour['plan'] | null;
  request: LocalPour['request'] | null;
};

export interface PartLine {
  readonly part: string;
  readonly mass: string;
  readonly volume: string;
}

export interface RecipeTime {
  readonly label: string;
  readonly atMs: number;
  readonly at: string;
}

/** Everything a student or client needs to repeat a pour, in the modeller's units. */
export interface PourRecipe {
  readonly id: string;
  readonly startAtMs: number;
  readonly material: string;
  readonly materialKind: MaterialKind;
  readonly safetySheet: string;
  readonly start: string;
  /** False while the plan has not arrived: only what was logged is known. */
  readonly planned: boolean;
  readonly shape: string | null;
  readonly depth: string | null;
  readonly layers: string | null;
  readonly ratio: string | null;
  readonly perLayer: readonly PartLine[];
  readonly total: readonly PartLine[];
  /** "320 g mixed in all". */
  readonly mixed: string | null;
  readonly room: string | null;
  readonly times: readonly RecipeTime[];
  readonly warnings: readonly string[];
  readonly shortfall: readonly string[];
  readonly note: string;
}

export function pourRecipe(pour: PourRecord, material: LocalMaterial | undefined, units: DisplayUnits): PourRecipe {
  const { plan, request } = pour;
  const startAtMs = Date.parse(pour.startAt);
  const base = {
    id: pour.id,
    startAtMs,
    material: material?.name ?? 'A material not on this device',
    materialKind: cautionKind(material, pour),
    safetySheet: material?.safetySheet ?? '',
    start: Number.isFinite(startAtMs) ? format(startAtMs, WHEN) : 'an unknown time',
    note: pour.note,
    shortfall: pour.shortfall.map(
      (short) =>
        `${partName(short.part)}: ${formatMass(short.quantityG, units.mass)} from a bottle not on the shelf (not costed)`,
    ),
  };
  if (plan === null || request === null) {
    return {
      ...base,
      planned: false,
      shape: null,
      depth: null,
      layers: null,
      ratio: null,
      perLayer: [],
      total: [],
      mixed: null,
      room: null,
      times: [],
      warnings: [],
    };
  }
  const { mix, cure, layers } = plan;
  const mass = (g: number) => formatWeighed(g, request.scaleResolutionG, units.mass);
  const lines = (of: 'perLayer' | 'total'): PartLine[] => {
    const part = (name: string, which: 'A' | 'B') => ({ part: name, ...formatPart(mix, of, which, request, units) });
    return mix.singlePart ? [part('Medium', 'A')] : [part('Part A', 'A'), part('Part B', 'B')];
  };
  const ratio = request.material.mixRatio;
  const times: RecipeTime[] = [];
  const add = (label: string, atMs: number) => times.push({ label, atMs, at: format(atMs, WHEN) });
  for (const layer of cure.layers) {
    add(`Layer ${layer.layer} poured`, layer.pourAtMs);
    add(`Layer ${layer.layer} working time ends`, layer.potLifeEndsAtMs);
    // The next layer goes on at the earliest recoat time, shown as its pour; only the window's end is news.
    if (layer.layer < cure.layers.length && layer.recoatUntilMs !== undefined) {
      add(`Layer ${layer.layer + 1} no later than`, layer.recoatUntilMs);
    }
  }
  add('Demould or handle', cure.demouldAtMs);
  add('Full cure', cure.fullCureAtMs);
  times.sort((a, b) => a.atMs - b.atMs);
  return {
    ...base,
    planned: true,
    shape: shapeText(request.shape, plan.volume.areaMm2, units),
    depth: formatLength(request.depthMm, units.length),
    layers: `${layers.count} ${layers.count === 1 ? 'layer' : 'layers'} of ${formatLength(layers.layerDepthMm, units.length)}`,
    ratio: mix.singlePart
      ? 'Single part'
      : `${formatNumber(ratio.partA)} : ${formatNumber(ratio.partB ?? 0)} by ${mix.basis}`,
    perLayer: lines('perLayer'),
    total: lines('total'),
    mixed: `${mass(mix.total.totalG)} mixed in all (${formatVolume(mix.total.totalMl, units.volume)})`,
    room:
      `${formatTemperature(cure.roomTempC, units.temperature)}; times are an estimate ` +
      `(data-sheet times × ${formatNumber(cure.factor, { significant: 3 })}, ${formatDuration(cure.times.potLifeMin)} working time)`,
    times,
    warnings: plan.warnings.map((warning) => warning.message),
  };
}

function partName(part: string): string {
  return part === 'single' ? 'Medium' : `Part ${part}`;
}

function shapeText(shape: NonNullable<PourRecord['request']>['shape'], areaMm2: number, units: DisplayUnits): string {
  const length = (mm: number) => formatLength(mm, units.length);
  const area = areaUnitFor(units);
  const surface = `${formatNumber(areaMm2 / area.mm2)} ${area.label}`;
  switch (shape.kind) {
    case 'rectangle':
      return `Rectangle ${length(shape.lengthMm)} × ${length(shape.widthMm)} (${surface})`;
    case 'ellipse':
      return `Oval ${length(shape.lengthMm)} × ${length(shape.widthMm)} (${surface})`;
    case 'circle':
      return `Circle ${length(shape.diameterMm)} across (${surface})`;
    case 'polygon':
      return `Traced outline of ${shape.points.length} points (${surface})`;
    case 'area':
      return `Surface of ${surface}`;
  }
}

/** The usual cautions follow the material; a two-part mix of another kind is treated as a resin. */
function cautionKind(material: LocalMaterial | undefined, pour: PourRecord): MaterialKind {
  if (material?.kind === 'two-part-epoxy') return 'two-part-epoxy';
  if (material?.kind === 'single-part-medium' || material?.kind === 'water-gel') return material.kind;
  return pour.plan?.mix.singlePart === true ? 'single-part-medium' : 'two-part-epoxy';
}
