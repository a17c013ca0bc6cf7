/**
 * Display strings for quantities. Deterministic on every device: '.' as the decimal
 * separator, no grouping, no locale data, so a plan reads the same on phone and server.
 */
import { decimalPlaces, roundToDecimals } from './rounding.js';
import {
  fromCelsius,
  fromG,
  fromMl,
  fromMm,
  type LengthUnit,
  type MassUnit,
  type TemperatureUnit,
  type VolumeUnit,
} from './units.js';

export interface NumberFormatOptions {
  /** Significant figures wanted before the point limits them (default 3). */
  readonly significant?: number;
  /** Never more decimals than this (default 2). */
  readonly maxDecimals?: number;
  /** Exactly this many decimals, trailing zeros kept (e.g. the scale's resolution). */
  readonly decimals?: number;
}

type Precision = Required<Pick<NumberFormatOptions, 'significant' | 'maxDecimals'>>;

export const UNIT_LABELS: Readonly<Record<LengthUnit | VolumeUnit | MassUnit, string>> = {
  mm: 'mm',
  cm: 'cm',
  m: 'm',
  in: 'in',
  ft: 'ft',
  mL: 'mL',
  L: 'L',
  usFlOz: 'fl oz',
  in3: 'in³',
  cm3: 'cm³',
  g: 'g',
  kg: 'kg',
  oz: 'oz',
  lb: 'lb',
};

export const TEMPERATURE_LABELS: Readonly<Record<TemperatureUnit, string>> = { C: '°C', F: '°F' };

// Finer than a ruler, cup or kitchen scale can read is noise on the bench.
const LENGTH_PRECISION: Record<LengthUnit, Precision> = {
  mm: { significant: 3, maxDecimals: 2 },
  cm: { significant: 3, maxDecimals: 2 },
  m: { significant: 4, maxDecimals: 3 },
  in: { significant: 3, maxDecimals: 3 },
  ft: { significant: 3, maxDecimals: 2 },
};
const VOLUME_PRECISION: Record<VolumeUnit, Precision> = {
  mL: { significant: 3, maxDecimals: 1 },
  L: { significant: 3, maxDecimals: 3 },
  usFlOz: { significant: 3, maxDecimals: 2 },
  in3: { significant: 3, maxDecimals: 2 },
  cm3: { significant: 3, maxDecimals: 1 },
};
const MASS_PRECISION: Record<MassUnit, Precision> = {
  g: { significant: 3, maxDecimals: 2 },
  kg: { significant: 3, maxDecimals: 3 },
  oz: { significant: 3, maxDecimals: 2 },
  lb: { significant: 3, maxDecimals: 2 },
};
const TEMPERATURE_PRECISION: Precision = { significant: 3, maxDecimals: 1 };

/**
 * Keeps every whole digit and adds decimals only up to the significant figures:
 * 1435 -> "1435", 22.43 -> "22.4", 0.254 -> "0.25" (max 2 decimals), 0.1 + 0.2 -> "0.3".
 */
export function formatNumber(value: number, options: NumberFormatOptions = {}): string {
  if (!Number.isFinite(value)) {
    return '—';
  }
  if (options.decimals !== undefined) {
    return roundToDecimals(value, options.decimals).toFixed(options.decimals);
  }
  const significant = options.significant ?? 3;
  const maxDecimals = options.maxDecimals ?? 2;
  const magnitude = value === 0 ? 0 : Math.floor(Math.log10(Math.abs(value)));
  const places = Math.min(maxDecimals, Math.max(0, significant - 1 - magnitude));
  const text = roundToDecimals(value, places).toFixed(places);
  return places > 0 ? text.replace(/\.?0+$/, '') : text;
}

export function formatLength(mm: number, unit: LengthUnit = 'mm', options: NumberFormatOptions = {}): string {
  return withUnit(fromMm(mm, unit), UNIT_LABELS[unit], { ...LENGTH_PRECISION[unit], ...options });
}

export function formatVolume(ml: number, unit: VolumeUnit = 'mL', options: NumberFormatOptions = {}): string {
  return withUnit(fromMl(ml, unit), UNIT_LABELS[unit], { ...VOLUME_PRECISION[unit], ...options });
}

export function formatMass(g: number, unit: MassUnit = 'g', options: NumberFormatOptions = {}): string {
  return withUnit(fromG(g, unit), UNIT_LABELS[unit], { ...MASS_PRECISION[unit], ...options });
}

export function formatTemperature(
  celsius: number,
  unit: TemperatureUnit = 'C',
  options: NumberFormatOptions = {},
): string {
  return `${formatNumber(fromCelsius(celsius, unit), { ...TEMPERATURE_PRECISION, ...options })} ${TEMPERATURE_LABELS[unit]}`;
}

/**
 * "45 min", "2 h 10 min", "3 d 4 h". Past a day, minutes are rounded away: nobody
 * times a full cure to the minute.
 */
export function formatDuration(minutes: number): string {
  if (!Number.isFinite(minutes)) {
    return '—';
  }
  const sign = minutes < 0 ? '-' : '';
  const total = Math.round(Math.abs(minutes));
  if (total < 60) {
    return `${sign}${total} min`;
  }
  if (total < 24 * 60) {
    const hours = Math.floor(total / 60);
    const rest = total % 60;
    return `${sign}${hours} h${rest > 0 ? ` ${rest} min` : ''}`;
  }
  const totalHours = Math.round(total / 60);
  const days = Math.floor(totalHours / 24);
  const hours = totalHours % 24;
  return `${sign}${days} d${hours > 0 ? ` ${hours} h` : ''}`;
}

/**
 * A running countdown: "42:07" under an hour, "2:10:05" under a day, then whole days and hours.
 * Rounded up to the second, so it never shows 0:00 before the moment has come.
 */
export function formatCountdown(ms: number): string {
  if (!Number.isFinite(ms)) return '—';
  const seconds = Math.max(0, Math.ceil(ms / 1000));
  const two = (n: number) => String(n).padStart(2, '0');
  const [h, m, s] = [Math.floor(seconds / 3600), Math.floor(seconds / 60) % 60, seconds % 60];
  if (h === 0) return `${m}:${two(s)}`;
  if (h < 24) return `${h}:${two(m)}:${two(s)}`;
  return formatDuration(seconds / 60);
}

/**
 * Grams as the scale shows them, to its step ("12.30 g" on a 0.01 g scale). An amount that rounds to
 * nothing though there is some reads "under 0.1 g" rather than "0 g".
 */
export function formatWeighed(shownG: number, stepG: number, unit: MassUnit = 'g', exactG = shownG): string {
  if (shownG === 0 && exactG > 0) return `under ${formatMass(stepG, unit)}`;
  return formatMass(shownG, unit, unit === 'g' ? { decimals: decimalPlaces(stepG) } : {});
}

/** Millilitres as the cup's marks show them; "under 1 mL" where the marks would read 0 of something. */
export function formatCupped(shownMl: number, stepMl: number, unit: VolumeUnit = 'mL', exactMl = shownMl): string {
  if (shownMl === 0 && exactMl > 0) return `under ${formatVolume(stepMl, unit)}`;
  return formatVolume(shownMl, unit);
}

function withUnit(value: number, label: string, options: NumberFormatOptions): string {
  const text = formatNumber(value, options);
  // Something too small for the places shown is not nothing: "under 0.1 mL", not "0 mL".
  if (value > 0 && options.decimals === undefined && Number(text) === 0) {
    return `under ${(10 ** -(options.maxDecimals ?? 2)).toFixed(options.maxDecimals ?? 2)} ${label}`;
  }
  return `${text} ${label}`;
}
