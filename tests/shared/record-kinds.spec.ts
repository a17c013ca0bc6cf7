import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  CHANGE_TYPES,
  changeWords,
  DEVICE_TABLES,
  EXPORT_TABLE_LABELS,
  RECORD_KINDS,
  SYNCED_ENTITIES,
} from '../../shared/record-kinds.js';
import { checkChangeData, mutationSchema } from '../../shared/sync-schemas.js';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const REGISTRY = 'shared/record-kinds.ts';
/** Dexie's schema versions are history, like migrations: an old version's tables are kept as they were. */
const HISTORY = new Set(['src/app/sync/bench-db.ts']);

function sourceFiles(dir: string): string[] {
  return readdirSync(join(ROOT, dir), { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(path);
    const isSource = /\.(ts|html)$/.test(entry.name) && !/\.spec\.ts$|-testing\.ts$/.test(entry.name);
    return isSource ? [path] : [];
  });
}

const FILES = ['shared', 'server', 'src', 'tools']
  .flatMap(sourceFiles)
  .filter((path) => relative('.', path) !== REGISTRY)
  .map((path) => ({ path, text: readFileSync(join(ROOT, path), 'utf8') }));

describe('the registry of synced records', () => {
  it('should name every kind of change once, in the registry, and in no other source file', () => {
    const types = CHANGE_TYPES.map(({ type }) => type);
    const found = FILES.flatMap(({ path, text }) =>
      types
        .filter((type) => new RegExp(`['"\`]${type.replace('.', '\\.')}['"\`]`).test(text))
        .map((type) => `${path}: ${type}`),
    );
    expect(found).toEqual([]);
  });

  it('should keep the words for each change in the registry only', () => {
    const words = CHANGE_TYPES.map(({ spec }) => spec.words);
    // Templates may show the same words as a heading; code must take them from the registry.
    const code = FILES.filter(({ path }) => path.endsWith('.ts'));
    const found = code.flatMap(({ path, text }) =>
      words.filter((w) => text.includes(`'${w}'`)).map((w) => `${path}: ${w}`),
    );
    expect(found).toEqual([]);
  });

  it('should be the only list of the kinds of record or of their tables', () => {
    // A list is three or more kinds (or their tables) on one line, or on lines one after another.
    const names = [...SYNCED_ENTITIES, ...DEVICE_TABLES];
    const named = (line: string) =>
      names.filter((name) => new RegExp(`['"\`]${name}['"\`]|^\\s*\\[?\\s*${name}\\s*[:,\\]]`).test(line));
    const listing = FILES.filter(({ path }) => !HISTORY.has(path)).flatMap(({ path, text }) => {
      let run = 0;
      for (const line of text.split('\n')) {
        const here = named(line).length;
        if (here >= 3) return [`${path}: ${line.trim()}`];
        run = here > 0 ? run + 1 : 0;
        if (run >= 3) return [`${path}: a list ending at "${line.trim()}"`];
      }
      return [];
    });
    expect(listing).toEqual([]);
  });

  it('should make one mutation variant per change, each refusing data its schema refuses', () => {
    expect(mutationSchema.options.length).toBe(CHANGE_TYPES.length);
    const id = '0190f1c8-9a3b-7c4d-8e5f-0a1b2c3d4e5f';
    expect(mutationSchema.safeParse({ type: 'build.create', mutationId: id, data: { name: '' } }).success).toBeFalse();
    expect(mutationSchema.safeParse({ type: 'build.delete', mutationId: id, recordId: id }).success).toBeTrue();
    expect(mutationSchema.safeParse({ type: 'build.delete', mutationId: id }).success).toBeFalse();
    expect(mutationSchema.safeParse({ type: 'ledgerEntry.create', mutationId: id, data: {} }).success).toBeFalse();
    expect(() => checkChangeData('container', 'waste', { id, quantity: -1, note: '' })).toThrow();
  });

  it('should give each kind a device table and an export name of its own', () => {
    expect(new Set(DEVICE_TABLES).size).toBe(SYNCED_ENTITIES.length);
    expect(Object.keys(EXPORT_TABLE_LABELS).length).toBe(SYNCED_ENTITIES.length);
    expect(changeWords('container.stocktake')).toBe(RECORD_KINDS.container.changes.stocktake.words);
  });
});
