const FIRST_RETRY_MS = 5_000;
const MAX_RETRY_MS = 5 * 60_000;

/**
 * The wait before trying again after `failures` failed syncs in a row: doubling from 5 s up to 5 min, and
 * anywhere in the upper half of that, so devices that lost the server together do not all return at once.
 */
export function retryDelayMs(failures: number, random: () => number = Math.random): number {
  const ceiling = Math.min(MAX_RETRY_MS, FIRST_RETRY_MS * 2 ** Math.max(0, failures - 1));
  return Math.round(ceiling / 2 + (random() * ceiling) / 2);
}
