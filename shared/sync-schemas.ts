/**
 * The sync messages between a device and the server. A device writes a record and a mutation
 * for it in its own store at once; the outbox of mutations is pushed in order, each applied
 * at most once (its id is remembered); changes are pulled by the workshop's change number.
 */
import * as z from 'zod';
import * as domainSchemas from './domain-schemas.js';
import * as photoSchemas from './photo-schemas.js';
import {
  CHANGE_TYPES,
  type ChangeName,
  type ChangeSpecOf,
  type RecordSchemaName,
  type SyncedEntity,
} from './record-kinds.js';

const mutationId = z.uuid({ error: 'A change needs an id made by the app' });
const recordId = z.uuid({ error: 'A change must name the record it changes' });

const SCHEMAS = { ...domainSchemas, ...photoSchemas };
type Schemas = typeof SCHEMAS;

/** The shared schema a change's data is checked with, by the name the registry gives it. */
export function recordSchema<N extends RecordSchemaName>(name: N): Schemas[N] {
  return SCHEMAS[name];
}

type DataOf<K extends SyncedEntity, C extends ChangeName<K>> =
  ChangeSpecOf<K, C> extends { data: infer N extends RecordSchemaName } ? { data: Schemas[N] } : Record<never, never>;
type ChangeShape<K extends SyncedEntity, C extends ChangeName<K>> = {
  type: z.ZodLiteral<`${K}.${C}`>;
  mutationId: typeof mutationId;
} & (C extends 'create' ? Record<never, never> : { recordId: typeof recordId }) &
  DataOf<K, C>;
type ChangeObject = {
  [K in SyncedEntity]: { [C in ChangeName<K>]: z.ZodObject<ChangeShape<K, C>> }[ChangeName<K>];
}[SyncedEntity];

const CHANGE_OBJECTS = CHANGE_TYPES.map(({ type, change, spec }) =>
  z.object({
    type: z.literal(type),
    mutationId,
    ...(change === 'create' ? {} : { recordId }),
    ...('data' in spec && spec.data ? { data: recordSchema(spec.data) } : {}),
  }),
) as unknown as [ChangeObject, ...ChangeObject[]];

/** What a device may change, one variant per kind of change in the registry (record-kinds.ts). */
export const mutationSchema = z.discriminatedUnion('type', CHANGE_OBJECTS, { error: 'Unknown kind of change' });
export type Mutation = z.input<typeof mutationSchema>;
export type ParsedMutation = z.output<typeof mutationSchema>;

export const MAX_PUSH = 200;

/** POST /api/sync/push: the workshop's outbox, oldest first. Mutations are checked one by one on the server. */
export const pushRequestSchema = z.object({
  workshopId: z.uuid({ error: 'Choose a workshop' }),
  mutations: z
    .array(z.unknown())
    .min(1, { error: 'Nothing to push' })
    .max(MAX_PUSH, { error: `Push at most ${MAX_PUSH} changes at once` }),
});

export type MutationResult =
  | { readonly mutationId: string; readonly status: 'applied'; readonly changeNumber: number }
  | {
      readonly mutationId: string;
      readonly status: 'rejected';
      /** Plain words for the list of changes that could not be saved, and field messages where they apply. */
      readonly reason: {
        readonly code: string;
        readonly message: string;
        readonly fields?: Readonly<Record<string, string>>;
      };
    };

export interface PushAnswer {
  readonly results: readonly MutationResult[];
}

/** One changed record; `record.deletedAt` set means a tombstone. */
export interface PulledChange {
  readonly entity: SyncedEntity;
  readonly changeNumber: number;
  readonly record: Readonly<Record<string, unknown>> & { readonly id: string; readonly deletedAt: string | null };
}

export const pullQuerySchema = z.object({
  workshopId: z.uuid({ error: 'Choose a workshop' }),
  after: z.coerce.number({ error: 'The cursor must be a number' }).int().min(0).default(0),
  limit: z.coerce.number().int().min(1).max(5000).default(1000),
});

/** GET /api/sync/pull answers a page of changes; `startOver` asks the device to drop its copy and pull from 0. */
export type PullAnswer =
  | {
      readonly startOver: false;
      readonly changes: readonly PulledChange[];
      readonly cursor: number;
      readonly more: boolean;
    }
  | { readonly startOver: true; readonly reason: string };

/** The data of a change as a form gives it, and as it is once checked. */
export type ChangeData<K extends SyncedEntity, C extends ChangeName<K>> =
  Extract<Mutation, { type: `${K}.${C}` }> extends { data: infer D } ? D : never;
export type CheckedChangeData<K extends SyncedEntity, C extends ChangeName<K>> =
  Extract<ParsedMutation, { type: `${K}.${C}` }> extends { data: infer D } ? D : never;

/** Checks a change's data with the schema the registry names for it; throws the schema's error when it is wrong. */
export function checkChangeData<K extends SyncedEntity, C extends ChangeName<K>>(
  kind: K,
  change: C,
  data: unknown,
): CheckedChangeData<K, C> {
  const spec = CHANGE_TYPES.find((entry) => entry.kind === kind && entry.change === change)?.spec;
  if (!spec?.data) throw new Error(`A ${kind} ${change} carries no data.`);
  return recordSchema(spec.data).parse(data) as CheckedChangeData<K, C>;
}
