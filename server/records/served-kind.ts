import type { ChangeName, SyncedEntity } from '../../shared/record-kinds.js';
import type { ParsedMutation } from '../../shared/sync-schemas.js';
import type { ServerContext } from '../context.js';
import type { SyncedTable } from './synced-records.js';
import type { UnitOfWork } from './unit-of-work.js';

type MutationOf<K extends SyncedEntity, C extends string> = Extract<ParsedMutation, { type: `${K}.${C}` }>;
// Method syntax: a handler of one change is a handler of any change the dispatch sends its way.
type Handlers = Record<
  string,
  { apply(work: UnitOfWork, mutation: ParsedMutation, ctx: ServerContext): Promise<unknown> }['apply']
>;

interface ServedSpec<K extends SyncedEntity, T extends SyncedTable> {
  readonly kind: K;
  readonly table: T;
  /** What a pushed change does: the same service the matching REST route calls. */
  readonly changes: {
    readonly [C in ChangeName<K>]: (
      work: UnitOfWork,
      mutation: MutationOf<K, C>,
      ctx: ServerContext,
    ) => Promise<unknown>;
  };
  /**
   * Changes that can be refused after they wrote something, so a push runs them in a savepoint of their
   * own. Every other change refuses before it writes, and a push runs it without one.
   */
  readonly mayRefuseAfterWriting?: readonly ChangeName<K>[];
  /** How a row goes to devices, when not as stored (times as ISO strings). */
  readonly toRecord?: (row: T['$inferSelect']) => Readonly<Record<string, unknown>>;
}

/** A kind of record as the server keeps it: its table, how each change is applied, how a row is pulled. */
export interface ServedKind {
  readonly kind: SyncedEntity;
  readonly table: SyncedTable;
  apply(work: UnitOfWork, mutation: ParsedMutation, ctx: ServerContext): Promise<unknown>;
  needsSavepoint(mutation: ParsedMutation): boolean;
  toRecord(row: Readonly<Record<string, unknown>>): Readonly<Record<string, unknown>>;
}

function changeOf(mutation: ParsedMutation): string {
  return mutation.type.slice(mutation.type.indexOf('.') + 1);
}

function asStored(row: Readonly<Record<string, unknown>>): Readonly<Record<string, unknown>> {
  const deletedAt = row['deletedAt'];
  return { ...row, deletedAt: deletedAt instanceof Date ? deletedAt.toISOString() : null };
}

export function served<K extends SyncedEntity, T extends SyncedTable>(spec: ServedSpec<K, T>): ServedKind {
  const handlers: Handlers = spec.changes;
  const isolated = new Set<string>(spec.mayRefuseAfterWriting ?? []);
  return {
    kind: spec.kind,
    table: spec.table,
    apply: (work, mutation, ctx) => {
      const handler = handlers[changeOf(mutation)];
      if (!handler) throw new Error(`No service applies ${mutation.type}.`);
      return handler(work, mutation, ctx);
    },
    needsSavepoint: (mutation) => isolated.has(changeOf(mutation)),
    toRecord: spec.toRecord ? (row) => spec.toRecord!(row as T['$inferSelect']) : asStored,
  };
}
