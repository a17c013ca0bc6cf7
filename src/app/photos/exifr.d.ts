/**
 * The one exifr call the app makes, typed here: the package's own typings reference Node's types, which
 * would leak Node globals into the browser build's type check.
 */
declare module 'exifr/dist/full.esm.mjs' {
  interface PickOptions {
    pick: string[];
    reviveValues: boolean;
  }
  export function parse(input: Blob, options: PickOptions): Promise<Record<string, unknown> | undefined>;
}
