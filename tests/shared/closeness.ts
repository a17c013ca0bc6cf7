/** |a - b| relative to the larger magnitude; 0 when both are 0. Floating results agree "to the last digit" below 1e-15. */
export function relativeDifference(actual: number, expected: number): number {
  const scale = Math.max(Math.abs(actual), Math.abs(expected));
  return scale === 0 ? 0 : Math.abs(actual - expected) / scale;
}

export const LAST_DIGIT = 1e-15;
