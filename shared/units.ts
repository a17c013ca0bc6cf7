/**
 * Units of the bench. Everything inside Benchtide is SI (mm, mL, g, degrees C);
 * other units exist only at the edges, for input and display.
 */

export type LengthUnit = 'mm' | 'cm' | 'm' | 'in' | 'ft';
export type VolumeUnit = 'mL' | 'L' | 'usFlOz' | 'in3' | 'cm3';
export type MassUnit = 'g' | 'kg' | 'oz' | 'lb';
export type TemperatureUnit = 'C' | 'F';
export type UnitSystem = 'metric' | 'imperial';

// Exact by definition: NIST Handbook 44 Appendix C and NIST SP 811.
export const MM_PER_INCH = 25.4;
export const MM_PER_FOOT = 304.8;
export const ML_PER_US_FL_OZ = 29.5735295625;
export const ML_PER_CUBIC_INCH = 16.387064;
export const G_PER_OUNCE = 28.349523125;
export const G_PER_POUND = 453.59237;
export const MM3_PER_ML = 1000;

export const LENGTH_UNITS: readonly LengthUnit[] = ['mm', 'cm', 'm', 'in', 'ft'];
export const VOLUME_UNITS: readonly VolumeUnit[] = ['mL', 'L', 'usFlOz', 'in3', 'cm3'];
export const MASS_UNITS: readonly MassUnit[] = ['g', 'kg', 'oz', 'lb'];
export const TEMPERATURE_UNITS: readonly TemperatureUnit[] = ['C', 'F'];

const MM_PER: Record<LengthUnit, number> = { mm: 1, cm: 10, m: 1000, in: MM_PER_INCH, ft: MM_PER_FOOT };
const ML_PER: Record<VolumeUnit, number> = {
  mL: 1,
  L: 1000,
  usFlOz: ML_PER_US_FL_OZ,
  in3: ML_PER_CUBIC_INCH,
  cm3: 1,
};
const G_PER: Record<MassUnit, number> = { g: 1, kg: 1000, oz: G_PER_OUNCE, lb: G_PER_POUND };

/** The factor for a unit, refusing one the table does not have rather than give NaN. */
function factor<U extends string>(table: Record<U, number>, unit: U, what: string): number {
  const found = Object.hasOwn(table, unit) ? table[unit] : undefined;
  if (found === undefined) {
    throw new RangeError(`Unknown ${what} unit "${String(unit)}"; use one of ${Object.keys(table).join(', ')}`);
  }
  return found;
}

// NaN passes through on purpose: a form field that cannot be read yet is NaN, and the schema says so in words.
export function toMm(value: number, unit: LengthUnit): number {
  return value * factor(MM_PER, unit, 'length');
}

export function fromMm(mm: number, unit: LengthUnit): number {
  return mm / factor(MM_PER, unit, 'length');
}

export function toMl(value: number, unit: VolumeUnit): number {
  return value * factor(ML_PER, unit, 'volume');
}

export function fromMl(ml: number, unit: VolumeUnit): number {
  return ml / factor(ML_PER, unit, 'volume');
}

export function toG(value: number, unit: MassUnit): number {
  return value * factor(G_PER, unit, 'mass');
}

export function fromG(g: number, unit: MassUnit): number {
  return g / factor(G_PER, unit, 'mass');
}

/** NIST SP 811: t/degF = 1.8 t/degC + 32. */
export function celsiusToFahrenheit(celsius: number): number {
  return (celsius * 9) / 5 + 32;
}

/** NIST SP 811: t/degC = (t/degF - 32) / 1.8. */
export function fahrenheitToCelsius(fahrenheit: number): number {
  return ((fahrenheit - 32) * 5) / 9;
}

export function toCelsius(value: number, unit: TemperatureUnit): number {
  return temperatureUnit(unit) === 'C' ? value : fahrenheitToCelsius(value);
}

export function fromCelsius(celsius: number, unit: TemperatureUnit): number {
  return temperatureUnit(unit) === 'C' ? celsius : celsiusToFahrenheit(celsius);
}

function temperatureUnit(unit: TemperatureUnit): TemperatureUnit {
  if (unit !== 'C' && unit !== 'F') {
    throw new RangeError(`Unknown temperature unit "${String(unit)}"; use C or F`);
  }
  return unit;
}

export interface DisplayUnits {
  readonly length: LengthUnit;
  readonly volume: VolumeUnit;
  readonly mass: MassUnit;
  readonly temperature: TemperatureUnit;
}

export const DISPLAY_UNITS: Readonly<Record<UnitSystem, DisplayUnits>> = {
  metric: { length: 'mm', volume: 'mL', mass: 'g', temperature: 'C' },
  imperial: { length: 'in', volume: 'usFlOz', mass: 'oz', temperature: 'F' },
};

export function displayUnitsFor(system: UnitSystem): DisplayUnits {
  return DISPLAY_UNITS[system];
}
