import type {
  LedgerKind,
  Mutation,
  MutationResult,
  newBuildSchema,
  newContainerSchema,
  newMaterialSchema,
  newStepSchema,
  PourPlan,
  PourPlanRequest,
  PourShortfall,
} from '@benchtide/shared';
import { DEVICE_TABLE_OF, DEVICE_TABLES, type DeviceTableName } from '@benchtide/shared';
import type * as z from 'zod';

/**
 * The records as this device keeps them: the server's rows as JSON (times as ISO strings, absent values as
 * null), or the device's own copy of a change it has not yet had back from the server.
 */
export interface SyncedFields {
  id: string;
  workshopId: string;
  createdAt: string;
  updatedAt: string;
  /** Set when deleted here and not yet confirmed; a pulled tombstone removes the record. */
  deletedAt: string | null;
  /** The workshop change number of the server's copy; 0 while the server has not seen the record. */
  changeNumber: number;
  /** Changed on this device since the server's copy last arrived. */
  pending?: boolean;
}

/** Optional fields may also be null: that is how the server sends a value that is not there. */
type Stored<T> = { [K in keyof T]: undefined extends T[K] ? T[K] | null : T[K] };
type Fields<T extends z.ZodType> = Stored<Omit<z.output<T>, 'id'>>;

export type LocalBuild = SyncedFields & Fields<typeof newBuildSchema> & { createdBy?: string | null };
export type LocalStep = SyncedFields & Fields<typeof newStepSchema> & { loggedBy?: string | null };
export type LocalMaterial = SyncedFields & Fields<typeof newMaterialSchema>;
/** A material that can be poured: it has the values of its data sheet. */
export type PourMaterial = LocalMaterial & { dataSheet: NonNullable<LocalMaterial['dataSheet']> };
export type LocalContainer = SyncedFields & Fields<typeof newContainerSchema>;

export interface LocalLedgerEntry extends SyncedFields {
  containerId: string;
  kind: LedgerKind;
  /** Signed, in the container's unit. */
  quantity: number;
  costMinor: number;
  at: string;
  pourId: string | null;
  note: string;
}

export interface LocalPour extends SyncedFields {
  buildId: string;
  stepId: string | null;
  materialId: string;
  startAt: string;
  /** The request as planned, with the material's data sheet as it was that day. */
  request: PourPlanRequest;
  /** Planned on this device when logged here; the server plans again and its copy replaces this on pull. */
  plan: Omit<PourPlan, 'request'>;
  shortfall: PourShortfall[];
  note: string;
  /** The layers now planned: the plan's own until a layer is added, skipped or the rest re-split. */
  layerCount: number;
  loggedBy?: string | null;
}

/** A layer as really poured (shared/pour-layers.ts); layer 1 shares its pour's id. */
export interface LocalPourLayer extends SyncedFields {
  pourId: string;
  number: number;
  pouredAt: string;
  roomTempC: number;
  /** The plan for this layer when it went on. */
  depthMm: number;
  partAG: number;
  partBG: number;
  weighedAG: number | null;
  weighedBG: number | null;
  note: string;
  recordedBy?: string | null;
}

/** A bench photo: the server's record, or this device's own while its upload waits (then `pending`, with no size yet). */
export interface LocalPhoto extends SyncedFields {
  buildId: string;
  stepId: string | null;
  pourId: string | null;
  caption: string;
  /** When the camera took it, as an ISO instant; null when the file does not say. */
  takenAt: string | null;
  width: number | null;
  height: number | null;
  contentHash: string | null;
  uploadedBy: string | null;
}

/** The device's tables of synced records, from the registry (record-kinds.ts in shared/). */
export const SYNCED_TABLES = DEVICE_TABLES;
export type SyncedTableName = DeviceTableName;
export const TABLE_OF = DEVICE_TABLE_OF;

export type RejectReason = Extract<MutationResult, { status: 'rejected' }>['reason'];

/**
 * How to put one record back if its change is discarded: `restore` holds the fields as they were before
 * the change, or is null when the change created the record.
 */
export interface RecordUndo {
  table: SyncedTableName;
  id: string;
  restore: Record<string, unknown> | null;
}

export interface OutboxRow {
  /** Order of writing on this device; pushed oldest first. */
  seq: number;
  mutationId: string;
  workshopId: string;
  mutation: Mutation;
  queuedAt: string;
  /** How many pushes carried it. */
  attempts: number;
  state: 'waiting' | 'rejected';
  reason?: RejectReason;
  undo: RecordUndo[];
}

export type PhotoUploadState = 'waiting' | 'sending' | 'refused';

/**
 * A photo chosen on this device and not yet on the server: the bytes themselves, what to send with them,
 * and how sending them goes. The row goes once the server holds the photo; its local record stays.
 */
export interface PhotoUploadRow {
  /** The photo's own id, made here: a retried upload goes under the same id. */
  id: string;
  workshopId: string;
  blob: Blob;
  fileName: string;
  /** `takenAt`: the camera's time as this device read it, for a file whose time carries no zone. */
  fields: { buildId: string; stepId: string | null; pourId: string | null; caption: string; takenAt?: string | null };
  state: PhotoUploadState;
  /** How many times sending began. */
  attempts: number;
  /** Why the last try failed or was refused; `status` is the HTTP status, 0 for no answer. */
  lastError: { code: string; message: string; status: number } | null;
  bytesSent: number;
  bytesTotal: number;
  createdAt: string;
}

export interface SyncStateRow {
  workshopId: string;
  /** The last change number pulled. */
  cursor: number;
  lastSyncedAt: string | null;
  lastError?: string;
}
