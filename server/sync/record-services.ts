import { SYNCED_ENTITIES, type SyncedEntity } from '../../shared/record-kinds.js';
import { buildRecords, stepRecords } from '../builds/build-service.js';
import { photoRecords } from '../photos/photo-service.js';
import { pourLayerRecords } from '../pours/pour-layer-service.js';
import { pourRecords } from '../pours/pour-service.js';
import type { ServedKind } from '../records/served-kind.js';
import { containerRecords, ledgerRecords, materialRecords } from '../shelf/shelf-service.js';

/** The service of every kind of synced record in the registry (shared/record-kinds.ts), in its order. */
export const RECORD_SERVICES: readonly ServedKind[] = [
  buildRecords,
  stepRecords,
  materialRecords,
  containerRecords,
  ledgerRecords,
  pourRecords,
  pourLayerRecords,
  photoRecords,
];

const BY_KIND = new Map(RECORD_SERVICES.map((service) => [service.kind, service]));
const unserved = SYNCED_ENTITIES.filter((kind) => !BY_KIND.has(kind));
if (unserved.length > 0) throw new Error(`No service on the server for these kinds of record: ${unserved.join(', ')}.`);

/** The server's side of a kind of record (every kind has one: checked above, as this module loads). */
export function serviceOf(kind: SyncedEntity): ServedKind {
  return BY_KIND.get(kind)!;
}
