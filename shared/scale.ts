/**
 * Scales (1:N) and track gauges. A model is the real thing divided by N.
 */

export type ScaleFamily = 'railway' | 'military-figure' | 'custom';

export interface ScaleEntry {
  readonly id: string;
  readonly name: string;
  /** N of 1:N. */
  readonly ratio: number;
  readonly family: ScaleFamily;
  /** Model track gauge for standard-gauge prototype track, where the standard defines one. */
  readonly gaugeMm?: number;
  readonly source: string;
}

export const STANDARD_SCALES: readonly ScaleEntry[] = [
  { id: 'z', name: 'Z', ratio: 220, family: 'railway', gaugeMm: 6.5, source: 'NEM 010; NMRA S-1.2' },
  { id: 'n', name: 'N', ratio: 160, family: 'railway', gaugeMm: 9, source: 'NEM 010; NMRA S-1.2' },
  { id: 'tt', name: 'TT', ratio: 120, family: 'railway', gaugeMm: 12, source: 'NEM 010; NMRA S-1.2' },
  { id: 'ho', name: 'HO', ratio: 87.1, family: 'railway', gaugeMm: 16.5, source: 'NMRA S-1.2' },
  { id: 'h0', name: 'H0', ratio: 87, family: 'railway', gaugeMm: 16.5, source: 'NEM 010' },
  // OO puts 1:76.2 bodies on H0 track, so its gauge is knowingly under scale.
  { id: 'oo', name: 'OO', ratio: 76.2, family: 'railway', gaugeMm: 16.5, source: 'common practice (British)' },
  { id: 's', name: 'S', ratio: 64, family: 'railway', gaugeMm: 22.43, source: 'NMRA S-1.2' },
  // NMRA O gauge is 1.25 in; at 1:48 that is slightly over scale for 1435 mm.
  { id: 'o-na', name: 'O (North America)', ratio: 48, family: 'railway', gaugeMm: 31.75, source: 'NMRA S-1.2' },
  { id: 'o-uk', name: 'O (British)', ratio: 43.5, family: 'railway', gaugeMm: 32, source: 'common practice (British)' },
  { id: '0', name: '0', ratio: 45, family: 'railway', gaugeMm: 32, source: 'NEM 010' },
  { id: '1', name: '1 (gauge one)', ratio: 32, family: 'railway', gaugeMm: 45, source: 'NEM 010' },
  // 45 mm track at 1:22.5 (IIm, often sold as G) stands for metre gauge, not standard gauge.
  { id: 'ii', name: 'II', ratio: 22.5, family: 'railway', gaugeMm: 64, source: 'NEM 010' },
  { id: 'fig-72', name: '1:72', ratio: 72, family: 'military-figure', source: 'common practice' },
  { id: 'fig-48', name: '1:48', ratio: 48, family: 'military-figure', source: 'common practice' },
  { id: 'fig-35', name: '1:35', ratio: 35, family: 'military-figure', source: 'common practice' },
  { id: 'fig-32', name: '1:32', ratio: 32, family: 'military-figure', source: 'common practice' },
  { id: 'fig-24', name: '1:24', ratio: 24, family: 'military-figure', source: 'common practice' },
  { id: 'fig-16', name: '1:16', ratio: 16, family: 'military-figure', source: 'common practice' },
  { id: 'fig-6', name: '1:6', ratio: 6, family: 'military-figure', source: 'common practice' },
];

export interface PrototypeGauge {
  readonly id: string;
  readonly name: string;
  readonly gaugeMm: number;
  readonly source: string;
}

export const PROTOTYPE_GAUGES: readonly PrototypeGauge[] = [
  { id: 'standard', name: 'Standard gauge (4 ft 8½ in)', gaugeMm: 1435, source: 'UIC' },
  { id: 'iberian', name: 'Iberian broad gauge', gaugeMm: 1668, source: 'from memory' },
  {
    id: 'indian',
    name: 'Indian broad gauge (5 ft 6 in)',
    gaugeMm: 1676,
    source: '5 ft 6 in by NIST Handbook 44, to the mm',
  },
  { id: 'russian', name: 'Russian broad gauge', gaugeMm: 1520, source: 'from memory' },
  { id: 'cape', name: 'Cape gauge (3 ft 6 in)', gaugeMm: 1067, source: '3 ft 6 in by NIST Handbook 44, to the mm' },
  { id: 'metre', name: 'Metre gauge', gaugeMm: 1000, source: 'metric definition' },
  { id: '3ft', name: '3 ft gauge', gaugeMm: 914.4, source: 'NIST Handbook 44 (1 ft = 0.3048 m)' },
  { id: '750mm', name: '750 mm gauge', gaugeMm: 750, source: 'from memory' },
  { id: '2ft', name: '2 ft gauge', gaugeMm: 609.6, source: 'NIST Handbook 44 (1 ft = 0.3048 m)' },
];

export function isValidRatio(ratio: number): boolean {
  return Number.isFinite(ratio) && ratio > 0;
}

/** A scale the modeller types in, such as 1:100 or 1:150. */
export function customScale(ratio: number): ScaleEntry {
  assertRatio(ratio);
  return { id: `custom-${ratio}`, name: `1:${ratio}`, ratio, family: 'custom', source: 'custom' };
}

export function findScale(id: string): ScaleEntry | undefined {
  return STANDARD_SCALES.find((scale) => scale.id === id);
}

export function realToModelMm(realMm: number, ratio: number): number {
  assertRatio(ratio);
  assertLength(realMm, 'A real length');
  return realMm / ratio;
}

export function modelToRealMm(modelMm: number, ratio: number): number {
  assertRatio(ratio);
  assertLength(modelMm, 'A model length');
  return modelMm * ratio;
}

function assertLength(mm: number, label: string): void {
  if (!Number.isFinite(mm) || mm < 0)
    throw new RangeError(`${label} must be a finite number of 0 mm or more, got ${mm}`);
}

export interface Footprint {
  readonly realWidthMm: number;
  readonly realDepthMm: number;
}

export interface ScaledBase {
  readonly ratio: number;
  readonly widthMm: number;
  readonly depthMm: number;
}

/** The base that shows one real footprint, at several scales side by side. */
export function baseForFootprint(footprint: Footprint, ratios: readonly number[]): ScaledBase[] {
  return ratios.map((ratio) => ({
    ratio,
    widthMm: realToModelMm(footprint.realWidthMm, ratio),
    depthMm: realToModelMm(footprint.realDepthMm, ratio),
  }));
}

export function figureHeightAtScaleMm(realHeightMm: number, ratio: number): number {
  return realToModelMm(realHeightMm, ratio);
}

export function gaugeAtScaleMm(prototypeGaugeMm: number, ratio: number): number {
  return realToModelMm(prototypeGaugeMm, ratio);
}

export interface ScaleComparison {
  /** How many times longer a thing is at scale A than at scale B. */
  readonly lengthFactor: number;
  /** Volume (and so resin) goes with the cube of length. */
  readonly volumeFactor: number;
}

export function compareScales(ratioA: number, ratioB: number): ScaleComparison {
  assertRatio(ratioA);
  assertRatio(ratioB);
  const lengthFactor = ratioB / ratioA;
  return { lengthFactor, volumeFactor: lengthFactor ** 3 };
}

function assertRatio(ratio: number): void {
  if (!isValidRatio(ratio)) {
    throw new RangeError(`Scale ratio must be a finite number above 0, got ${ratio}`);
  }
}
