/**
 * The sync messages between a device and the server. A device writes a record and a mutation
 * for it in its own store at once; the outbox of mutations is pushed in order, each applied
 * at most once (its id is remembered); changes are pulled by the workshop's change number.
 */
import * as z from 'zod';
import {
  buildPatchSchema,
  containerPatchSchema,
  materialPatchSchema,
  newBuildSchema,
  newContainerSchema,
  newMaterialSchema,
  newPourSchema,
  newStepSchema,
  stepPatchSchema,
  stocktakeSchema,
  wasteSchema,
} from './domain-schemas.js';
import { photoPatchSchema } from './photo-schemas.js';

const mutationId = z.uuid({ error: 'A change needs an id made by the app' });
const recordId = z.uuid({ error: 'A change must name the record it changes' });

/** What a device may change, one variant per kind of write. */
export const mutationSchema = z.discriminatedUnion(
  'type',
  [
    z.object({ type: z.literal('build.create'), mutationId, data: newBuildSchema }),
    z.object({ type: z.literal('build.patch'), mutationId, recordId, data: buildPatchSchema }),
    z.object({ type: z.literal('build.delete'), mutationId, recordId }),
    z.object({ type: z.literal('step.create'), mutationId, data: newStepSchema }),
    z.object({ type: z.literal('step.patch'), mutationId, recordId, data: stepPatchSchema }),
    z.object({ type: z.literal('step.delete'), mutationId, recordId }),
    z.object({ type: z.literal('material.create'), mutationId, data: newMaterialSchema }),
    z.object({ type: z.literal('material.patch'), mutationId, recordId, data: materialPatchSchema }),
    z.object({ type: z.literal('material.delete'), mutationId, recordId }),
    z.object({ type: z.literal('container.create'), mutationId, data: newContainerSchema }),
    z.object({ type: z.literal('container.patch'), mutationId, recordId, data: containerPatchSchema }),
    z.object({ type: z.literal('container.delete'), mutationId, recordId }),
    z.object({ type: z.literal('container.waste'), mutationId, recordId, data: wasteSchema }),
    z.object({ type: z.literal('container.stocktake'), mutationId, recordId, data: stocktakeSchema }),
    z.object({ type: z.literal('pour.create'), mutationId, data: newPourSchema }),
    z.object({ type: z.literal('pour.delete'), mutationId, recordId }),
    z.object({ type: z.literal('photo.patch'), mutationId, recordId, data: photoPatchSchema }),
    z.object({ type: z.literal('photo.delete'), mutationId, recordId }),
  ],
  { error: 'Unknown kind of change' },
);
export type Mutation = z.input<typeof mutationSchema>;
export type MutationType = Mutation['type'];

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

export const SYNCED_ENTITIES = ['build', 'step', 'material', 'container', 'ledgerEntry', 'pour', 'photo'] as const;
export type SyncedEntity = (typeof SYNCED_ENTITIES)[number];

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
