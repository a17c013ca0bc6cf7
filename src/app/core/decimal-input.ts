import { formatNumber, fromMm, type LengthUnit } from '@benchtide/shared';

/**
 * Reads what a modeller typed into a number field. A comma is taken as the decimal point (phones in
 * many countries offer only a comma); an empty or unreadable field gives null, never NaN.
 */
export function parseDecimal(text: string): number | null {
  const cleaned = text.trim().replace(',', '.');
  if (cleaned === '') return null;
  const value = Number(cleaned);
  return Number.isFinite(value) ? value : null;
}

/** The text of an input element from its event, for `(input)` bindings. */
export function inputText(event: Event): string {
  return (event.target as HTMLInputElement).value;
}

/** A length as a field shows it: plain digits the modeller can edit, empty when there is none. */
export function lengthText(mm: number | null, unit: LengthUnit): string {
  return mm === null ? '' : formatNumber(fromMm(mm, unit), { significant: 4, maxDecimals: 3 });
}
