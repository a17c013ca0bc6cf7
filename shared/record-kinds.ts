/**
 * Every kind of synced record, written once: the device's table, the name and label in a workshop export,
 * and the changes a device may push for it, each with the shared schema its data is checked with (named
 * by its export from domain-schemas.ts or photo-schemas.ts, so this list loads no validation code) and
 * the words the device uses for it. The mutation union, the write checks, the device's tables, the
 * server's dispatch and pull, the export and the API document's body names all come from here.
 *
 * A change named `create` carries the new record (with its id) as data; every other change names the
 * record it changes.
 */
import type * as domainSchemas from './domain-schemas.js';
import type * as photoSchemas from './photo-schemas.js';

type SchemaModule = typeof domainSchemas & typeof photoSchemas;
/** The name of a shared schema a change's data is checked with. */
export type RecordSchemaName = {
  [N in keyof SchemaModule]: N extends `${string}Schema` ? N : never;
}[keyof SchemaModule];

interface ChangeSpec {
  readonly data?: RecordSchemaName;
  readonly words: string;
}

interface RecordKindSpec {
  readonly deviceTable: string;
  readonly export: { readonly name: string; readonly label: string };
  readonly changes: Readonly<Record<string, ChangeSpec>>;
}

export const RECORD_KINDS = {
  build: {
    deviceTable: 'builds',
    export: { name: 'builds', label: 'Builds' },
    changes: {
      create: { data: 'newBuildSchema', words: 'New build' },
      patch: { data: 'buildPatchSchema', words: 'Build edited' },
      delete: { words: 'Build deleted' },
    },
  },
  step: {
    deviceTable: 'steps',
    export: { name: 'steps', label: 'Build steps' },
    changes: {
      create: { data: 'newStepSchema', words: 'Step logged' },
      patch: { data: 'stepPatchSchema', words: 'Step edited' },
      delete: { words: 'Step deleted' },
    },
  },
  material: {
    deviceTable: 'materials',
    export: { name: 'materials', label: 'Materials' },
    changes: {
      create: { data: 'newMaterialSchema', words: 'Material added to the shelf' },
      patch: { data: 'materialPatchSchema', words: 'Material edited' },
      delete: { words: 'Material removed from the shelf' },
    },
  },
  container: {
    deviceTable: 'containers',
    export: { name: 'containers', label: 'Containers' },
    changes: {
      create: { data: 'newContainerSchema', words: 'Container added to the shelf' },
      patch: { data: 'containerPatchSchema', words: 'Container edited' },
      delete: { words: 'Container removed from the shelf' },
      waste: { data: 'wasteSchema', words: 'Waste recorded' },
      stocktake: { data: 'stocktakeSchema', words: 'Stocktake recorded' },
    },
  },
  /** Written by the server alongside containers and pours (purchase, use, waste, stocktake); never pushed. */
  ledgerEntry: {
    deviceTable: 'ledgerEntries',
    export: { name: 'ledger', label: 'Stock book' },
    changes: {},
  },
  pour: {
    deviceTable: 'pours',
    export: { name: 'pours', label: 'Pours' },
    changes: {
      create: { data: 'newPourSchema', words: 'Pour logged' },
      patch: { data: 'pourPatchSchema', words: 'Pour corrected' },
      delete: { words: 'Pour deleted' },
    },
  },
  /** Each layer as really poured; layer 1 is made with its pour (and shares its id), later ones as they go on. */
  pourLayer: {
    deviceTable: 'pourLayers',
    export: { name: 'layers', label: 'Pour layers' },
    changes: {
      create: { data: 'newPourLayerSchema', words: 'Layer poured' },
      patch: { data: 'pourLayerPatchSchema', words: 'Layer corrected' },
      delete: { words: 'Layer taken back' },
    },
  },
  /** Made by an upload (PUT with the bytes), then changed and deleted like the rest. */
  photo: {
    deviceTable: 'photos',
    export: { name: 'photos', label: 'Photo records' },
    changes: {
      patch: { data: 'photoPatchSchema', words: 'Photo caption changed' },
      delete: { words: 'Photo deleted' },
    },
  },
} as const satisfies Readonly<Record<string, RecordKindSpec>>;

type Kinds = typeof RECORD_KINDS;
export type SyncedEntity = keyof Kinds;
export type ChangeName<K extends SyncedEntity> = keyof Kinds[K]['changes'] & string;
export type ChangeSpecOf<K extends SyncedEntity, C extends ChangeName<K>> = Kinds[K]['changes'][C];
export type MutationType = { [K in SyncedEntity]: `${K}.${ChangeName<K>}` }[SyncedEntity];
export type DeviceTableName = Kinds[SyncedEntity]['deviceTable'];
export type ExportTableName = Kinds[SyncedEntity]['export']['name'];
/** The kinds that take a change named C. */
export type KindWith<C extends string> = {
  [K in SyncedEntity]: C extends ChangeName<K> ? K : never;
}[SyncedEntity];

export const SYNCED_ENTITIES = Object.keys(RECORD_KINDS) as SyncedEntity[];

/** The device's table of each kind, in the registry's order. */
export const DEVICE_TABLES = SYNCED_ENTITIES.map((kind) => RECORD_KINDS[kind].deviceTable) as DeviceTableName[];

export const DEVICE_TABLE_OF = Object.fromEntries(
  SYNCED_ENTITIES.map((kind) => [kind, RECORD_KINDS[kind].deviceTable]),
) as { readonly [K in SyncedEntity]: Kinds[K]['deviceTable'] };

/** Every change a device may push, with its kind, its name and its spec. */
export const CHANGE_TYPES = SYNCED_ENTITIES.flatMap((kind) =>
  Object.entries(RECORD_KINDS[kind].changes as Readonly<Record<string, ChangeSpec>>).map(([change, spec]) => ({
    type: `${kind}.${change}` as MutationType,
    kind,
    change,
    spec,
  })),
);

/** The modeller's words for a kind of change. */
export function changeWords(type: MutationType): string {
  const found = CHANGE_TYPES.find((entry) => entry.type === type);
  return found?.spec.words ?? 'Change';
}

/** The name of a change's type: `build.create` for the build's create. */
export function changeType<K extends SyncedEntity, C extends ChangeName<K>>(kind: K, change: C): `${K}.${C}` {
  return `${kind}.${change}`;
}

/** What a workshop export holds, by the names its tables carry, with their labels in plain words. */
export const EXPORT_TABLE_LABELS = Object.fromEntries(
  SYNCED_ENTITIES.map((kind) => [RECORD_KINDS[kind].export.name, RECORD_KINDS[kind].export.label]),
) as Readonly<Record<ExportTableName, string>>;
