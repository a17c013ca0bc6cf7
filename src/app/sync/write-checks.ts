import type * as Checks from './write-check-schemas';

type WriteChecks = typeof Checks;

let loaded: WriteChecks | undefined;

/**
 * The checks every write on the device goes through, loaded with the first write rather than with the
 * screen: evaluating the validation library is a long task on a slow phone, and a screen that only
 * shows records never needs it. Once loaded it resolves at once, so a write inside a Dexie transaction
 * may wait on it, provided whoever opened the transaction loaded the checks before opening it.
 */
export async function writeChecks(): Promise<WriteChecks> {
  loaded ??= await import('./write-check-schemas');
  return loaded;
}
