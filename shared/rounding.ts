/**
 * Rounding that lands on the decimal a person would write, so a display never shows
 * 0.30000000000000004 and a scale step of 0.1 g never yields 12.299999999999999.
 */

/** Decimal places in a step such as 0.1, 0.05 or 2.5e-3 (0 for whole numbers). */
export function decimalPlaces(step: number): number {
  if (!Number.isFinite(step)) {
    throw new RangeError(`Step must be a finite number, got ${step}`);
  }
  const [mantissa = '', exponent = '0'] = Math.abs(step).toString().split('e');
  const fraction = mantissa.split('.')[1] ?? '';
  return Math.max(0, fraction.length - Number(exponent));
}

/** Rounds to a whole number of steps (half away from zero), e.g. a scale's 0.1 g resolution. */
export function roundToStep(value: number, step: number): number {
  if (!Number.isFinite(step) || step <= 0) {
    throw new RangeError(`Step must be a finite number above 0, got ${step}`);
  }
  // 12 significant figures first, so 0.35 / 0.1 = 3.4999999999999996 counts as the half it is.
  const steps = Math.sign(value) * Math.round(Number((Math.abs(value) / step).toPrecision(12)));
  // toFixed to the step's own decimals removes the binary residue of steps * step.
  return cleanZero(Number((steps * step).toFixed(Math.min(decimalPlaces(step), 100))));
}

/** Rounds to a number of decimal places (half away from zero on the stored binary value). */
export function roundToDecimals(value: number, decimals: number): number {
  return cleanZero(Number(value.toFixed(decimals)));
}

/** Rounds to significant figures; toPrecision works on the exact binary value, so 0.1 + 0.2 -> 0.3. */
export function roundToSignificant(value: number, significant: number): number {
  if (!Number.isInteger(significant) || significant < 1 || significant > 100) {
    throw new RangeError(`Significant figures must be a whole number from 1 to 100, got ${significant}`);
  }
  if (value === 0 || !Number.isFinite(value)) {
    return cleanZero(value);
  }
  return cleanZero(Number(value.toPrecision(significant)));
}

function cleanZero(value: number): number {
  return Object.is(value, -0) ? 0 : value;
}
