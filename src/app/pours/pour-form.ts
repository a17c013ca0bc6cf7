import { FormControl, FormGroup } from '@angular/forms';
import {
  findMaterialPreset,
  formatLength,
  fromCelsius,
  fromMl,
  fromMm,
  toCelsius,
  toMl,
  toMm,
  splitIntoLayers,
  type DisplayUnits,
  type MaterialDataSheetInput,
  type PourPlanRequestInput,
  type PourShapeInput,
} from '@benchtide/shared';
import { parseDecimal } from '../core/decimal-input';

export type ShapeKind = PourShapeInput['kind'];

/** Every number is typed as text in the display units, so a comma or a half-typed value never throws. */
export function text(value = ''): FormControl<string> {
  return new FormControl(value, { nonNullable: true });
}

/** The water feature's shape, size and depth, for any form that plans a pour. */
export function featureControls() {
  return {
    shapeKind: new FormControl<ShapeKind>('rectangle', { nonNullable: true }),
    length: text(),
    width: text(),
    diameter: text(),
    area: text(),
    outline: text(),
    depth: text(),
    displaced: text('0'),
    wastePercent: text('10'),
  };
}

export function createPourForm() {
  return new FormGroup({
    ...featureControls(),
    presetId: text('deep-pour-epoxy'),
    basis: new FormControl<'volume' | 'weight'>('volume', { nonNullable: true }),
    partA: text(),
    partB: text(),
    densityA: text(),
    densityB: text(),
    potLifeMin: text(),
    recoatH: text(),
    recoatMaxH: text(),
    demouldH: text(),
    fullCureH: text(),
    referenceTemp: text(),
    minCureTemp: text(),
    maxLayer: text(),
    roomTemp: text(),
    startAt: text(),
    /** Empty: the fewest layers the maximum layer allows. */
    layerCount: text(),
  });
}

export type PourForm = ReturnType<typeof createPourForm>;
export type PourFormValue = ReturnType<PourForm['getRawValue']>;
type ShapeFieldValues = Pick<PourFormValue, 'shapeKind' | 'length' | 'width' | 'diameter' | 'area' | 'outline'>;

/** Area typed in: cm² for metric, in² for imperial. */
export interface AreaUnit {
  readonly label: 'cm²' | 'in²';
  readonly mm2: number;
}

/** Areas are typed and shown in cm² (metric) or in² (imperial); 1 in² = 645.16 mm² exactly (NIST HB 44). */
export function areaUnitFor(units: DisplayUnits): AreaUnit {
  return units.length === 'in' ? { label: 'in²', mm2: 645.16 } : { label: 'cm²', mm2: 100 };
}

function number(value: string): number {
  return parseDecimal(value) ?? Number.NaN;
}

function optionalNumber(value: string): number | undefined {
  return value.trim() === '' ? undefined : number(value);
}

/** "x, y" per line, in the display length unit. */
export function parseOutline(outline: string, units: DisplayUnits) {
  return outline
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line !== '')
    .map((line) => {
      const [x = '', y = ''] = line.split(/[\s;]+|,\s+/);
      return { xMm: toMm(number(x), units.length), yMm: toMm(number(y), units.length) };
    });
}

export function shapeFrom(value: ShapeFieldValues, units: DisplayUnits): PourShapeInput {
  const mm = (field: string) => toMm(number(field), units.length);
  switch (value.shapeKind) {
    case 'rectangle':
      return { kind: 'rectangle', lengthMm: mm(value.length), widthMm: mm(value.width) };
    case 'ellipse':
      return { kind: 'ellipse', lengthMm: mm(value.length), widthMm: mm(value.width) };
    case 'circle':
      return { kind: 'circle', diameterMm: mm(value.diameter) };
    case 'polygon':
      return { kind: 'polygon', points: parseOutline(value.outline, units) };
    case 'area':
      return { kind: 'area', areaMm2: number(value.area) * areaUnitFor(units).mm2 };
  }
}

/** The data-sheet fields as typed, in display units. */
export type DataSheetFieldValues = Pick<
  PourFormValue,
  | 'basis'
  | 'partA'
  | 'partB'
  | 'densityA'
  | 'densityB'
  | 'potLifeMin'
  | 'recoatH'
  | 'recoatMaxH'
  | 'demouldH'
  | 'fullCureH'
  | 'referenceTemp'
  | 'minCureTemp'
  | 'maxLayer'
>;

/** The data-sheet fields, in display units, as the SI data sheet the shared schema checks. */
export function dataSheetFrom(value: DataSheetFieldValues, units: DisplayUnits): MaterialDataSheetInput {
  const partB = optionalNumber(value.partB);
  const densityB = optionalNumber(value.densityB);
  const recoatMaxH = optionalNumber(value.recoatMaxH);
  return {
    mixRatio: { basis: value.basis, partA: number(value.partA), ...(partB === undefined ? {} : { partB }) },
    densityAGPerMl: number(value.densityA),
    ...(densityB === undefined ? {} : { densityBGPerMl: densityB }),
    potLifeMin: number(value.potLifeMin),
    recoatMin: number(value.recoatH) * 60,
    ...(recoatMaxH === undefined ? {} : { recoatMaxMin: recoatMaxH * 60 }),
    demouldMin: number(value.demouldH) * 60,
    fullCureMin: number(value.fullCureH) * 60,
    referenceTempC: toCelsius(number(value.referenceTemp), units.temperature),
    minCureTempC: toCelsius(number(value.minCureTemp), units.temperature),
    maxLayerMm: toMm(number(value.maxLayer), units.length),
  };
}

/** The form, in display units, as the SI request the shared maths and the server accept. */
export function toPlanRequest(
  value: PourFormValue,
  units: DisplayUnits,
  scaleResolutionG: number,
  cupResolutionMl = 1,
): PourPlanRequestInput {
  const startAt = new Date(value.startAt).getTime();
  return {
    shape: shapeFrom(value, units),
    depthMm: toMm(number(value.depth), units.length),
    displacedMl: toMl(number(value.displaced || '0'), units.volume),
    wastePercent: number(value.wastePercent || '0'),
    material: dataSheetFrom(value, units),
    roomTempC: toCelsius(number(value.roomTemp), units.temperature),
    startAtMs: Number.isFinite(startAt) ? startAt : Number.NaN,
    scaleResolutionG,
    cupResolutionMl,
    ...layerCountFrom(value.layerCount),
  };
}

/** The layers typed in, for a request: nothing when left empty, so the plan takes the fewest. */
export function layerCountFrom(typed: string): { layerCount?: number } {
  return typed.trim() === '' ? {} : { layerCount: number(typed) };
}

/**
 * The fewest layers a depth takes at the data sheet's maximum layer, and the hint under the field;
 * null while the depth or the maximum layer is not a number yet.
 */
export function fewestLayers(
  depthMm: number,
  maxLayerMm: number,
  units: DisplayUnits,
): { readonly count: number; readonly hint: string } | null {
  if (!Number.isFinite(depthMm) || !Number.isFinite(maxLayerMm) || depthMm <= 0 || maxLayerMm <= 0) return null;
  const { count } = splitIntoLayers(depthMm, maxLayerMm);
  const depth = formatLength(depthMm, units.length);
  const most = formatLength(maxLayerMm, units.length);
  return {
    count,
    hint: `At least ${count} for ${depth} at most ${most} a layer; more for thin detail or tinted layers.`,
  };
}

/** Shown numbers are trimmed so a converted value reads like one a person typed. */
export function fieldText(value: number): string {
  return Number.isFinite(value) ? String(Math.round(value * 1000) / 1000) : '';
}

/** A stored shape (SI) as the fields show it, in display units: how a repeated pour fills the form. */
export function shapeFields(shape: PourShapeInput, units: DisplayUnits): Partial<PourFormValue> {
  const length = (mm: number) => fieldText(fromMm(mm, units.length));
  switch (shape.kind) {
    case 'rectangle':
    case 'ellipse':
      return { shapeKind: shape.kind, length: length(shape.lengthMm), width: length(shape.widthMm) };
    case 'circle':
      return { shapeKind: 'circle', diameter: length(shape.diameterMm) };
    case 'polygon':
      return {
        shapeKind: 'polygon',
        outline: shape.points.map((point) => `${length(point.xMm)}, ${length(point.yMm)}`).join('\n'),
      };
    case 'area':
      return { shapeKind: 'area', area: fieldText(shape.areaMm2 / areaUnitFor(units).mm2) };
  }
}

/** The data-sheet fields of a preset, in display units. */
export function presetFields(presetId: string, units: DisplayUnits): Partial<PourFormValue> {
  const preset = findMaterialPreset(presetId);
  return preset ? dataSheetFields(preset.dataSheet, units) : {};
}

/** A data sheet (SI) as its fields show it, in display units. */
export function dataSheetFields(sheet: MaterialDataSheetInput, units: DisplayUnits): DataSheetFieldValues {
  const optional = (value: number | undefined, scale = 1) => (value === undefined ? '' : fieldText(value / scale));
  return {
    basis: sheet.mixRatio.basis,
    partA: fieldText(sheet.mixRatio.partA),
    partB: optional(sheet.mixRatio.partB),
    densityA: fieldText(sheet.densityAGPerMl),
    densityB: optional(sheet.densityBGPerMl),
    potLifeMin: fieldText(sheet.potLifeMin),
    recoatH: fieldText(sheet.recoatMin / 60),
    recoatMaxH: optional(sheet.recoatMaxMin, 60),
    demouldH: fieldText(sheet.demouldMin / 60),
    fullCureH: fieldText(sheet.fullCureMin / 60),
    referenceTemp: fieldText(fromCelsius(sheet.referenceTempC, units.temperature)),
    minCureTemp: fieldText(fromCelsius(sheet.minCureTempC, units.temperature)),
    maxLayer: fieldText(fromMm(sheet.maxLayerMm, units.length)),
  };
}

const LENGTH_FIELDS = ['length', 'width', 'diameter', 'depth', 'maxLayer'] as const;
const TEMPERATURE_FIELDS = ['referenceTemp', 'minCureTemp', 'roomTemp'] as const;

/** Re-expresses the typed numbers when the modeller switches between metric and imperial. */
export function convertFields(value: PourFormValue, from: DisplayUnits, to: DisplayUnits): Partial<PourFormValue> {
  const change: Partial<PourFormValue> = {};
  const convert = (field: string, fn: (n: number) => number) => {
    const parsed = parseDecimal(field);
    return parsed === null ? field : fieldText(fn(parsed));
  };
  for (const key of LENGTH_FIELDS) change[key] = convert(value[key], (n) => fromMm(toMm(n, from.length), to.length));
  for (const key of TEMPERATURE_FIELDS) {
    change[key] = convert(value[key], (n) => fromCelsius(toCelsius(n, from.temperature), to.temperature));
  }
  change.displaced = convert(value.displaced, (n) => fromMl(toMl(n, from.volume), to.volume));
  change.area = convert(value.area, (n) => (n * areaUnitFor(from).mm2) / areaUnitFor(to).mm2);
  change.outline = value.outline
    .split('\n')
    .map((line) =>
      line
        .split(/([\s;]+|,\s+)/)
        .map((part) => (/^[\d.,-]+$/.test(part) ? convert(part, (n) => fromMm(toMm(n, from.length), to.length)) : part))
        .join(''),
    )
    .join('\n');
  return change;
}
