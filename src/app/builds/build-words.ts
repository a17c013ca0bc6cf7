import {
  customScale,
  findScale,
  formatLength,
  formatMoney,
  isValidRatio,
  wholeMinor,
  type BUILD_STATUSES,
  type LengthUnit,
  type STEP_KINDS,
  type UnitSystem,
} from '@benchtide/shared';
import { formatDistanceStrict } from 'date-fns';
import type { LocalBuild } from '../sync/synced-records';

export type BuildStatus = (typeof BUILD_STATUSES)[number];
export type StepKind = (typeof STEP_KINDS)[number];

/** Each status as an icon and a word, never by colour alone. */
export const STATUS_SHOWN: Readonly<Record<BuildStatus, { readonly word: string; readonly icon: string }>> = {
  planning: { word: 'Planning', icon: 'planning' },
  building: { word: 'Building', icon: 'building' },
  finished: { word: 'Finished', icon: 'done' },
};

export const STEP_KIND_WORDS: Readonly<Record<StepKind, string>> = {
  'base-and-terrain': 'Base and terrain',
  painting: 'Painting',
  'water-pour': 'Water pour',
  detailing: 'Detailing',
  other: 'Other',
};

/**
 * The real world is measured in metres or feet: a base's 459 mm stands for 40 m, and nobody types
 * 40000 mm. The base itself is measured in the device's length unit.
 */
export function realLengthUnit(system: UnitSystem): LengthUnit {
  return system === 'imperial' ? 'ft' : 'm';
}

/** "HO 1:87.1" for a standard scale, "1:35" where the name is the ratio, "1:150" for the modeller's own. */
export function scaleBadge(build: Pick<LocalBuild, 'scaleId' | 'scaleRatio'>): string {
  if (!isValidRatio(build.scaleRatio)) return 'Scale not set';
  const ratio = customScale(build.scaleRatio).name;
  const standard = build.scaleId ? findScale(build.scaleId) : undefined;
  return standard && standard.ratio === build.scaleRatio && standard.name !== ratio
    ? `${standard.name} ${ratio}`
    : ratio;
}

/** "459 mm × 138 mm"; one side alone is named; null when neither is known. */
export function sizeText(widthMm: number | null, depthMm: number | null, unit: LengthUnit): string | null {
  if (widthMm !== null && depthMm !== null) return `${formatLength(widthMm, unit)} × ${formatLength(depthMm, unit)}`;
  if (widthMm !== null) return `${formatLength(widthMm, unit)} wide`;
  if (depthMm !== null) return `${formatLength(depthMm, unit)} deep`;
  return null;
}

/** "just now", "5 minutes ago", "2 hours ago", "3 days ago". */
export function activityText(at: string, nowMs: number): string {
  const ms = Date.parse(at);
  if (!Number.isFinite(ms)) return 'at an unknown time';
  if (Math.abs(nowMs - ms) < 60_000) return 'just now';
  return formatDistanceStrict(ms, nowMs, { addSuffix: true });
}

/** Money in the modeller's locale and the containers' currency: 1240 EUR minor units reads "€12.40". */
export function moneyText(minor: number, currency: string, locale: string): string {
  try {
    return formatMoney(minor, currency, locale);
  } catch {
    // A currency code the browser does not know: still the amount, with the code beside it.
    return `${(wholeMinor(minor) / 100).toFixed(2)} ${currency}`;
  }
}
