import { changeType, type Mutation } from '@benchtide/shared';
import type { OutboxRow } from './synced-records';

/** A way to send a refused change again, changed so that the server can take it. */
export interface ChangeFix {
  readonly kind: 'record-shortfall';
  /** What the fix does, in plain words, for its button. */
  readonly label: string;
}

const POUR_LOGGED = changeType('pour', 'create');

const RECORD_SHORTFALL: ChangeFix = {
  kind: 'record-shortfall',
  label: 'Log it, noting the rest came from a bottle not on the shelf',
};

/** The fixes a refused change offers; none for one that is waiting, or refused for a reason no change of it mends. */
export function fixesFor(row: OutboxRow): ChangeFix[] {
  if (row.state !== 'rejected') return [];
  const { mutation, reason } = row;
  if (
    mutation.type === POUR_LOGGED &&
    reason?.code === 'stock_short' &&
    mutation.data.whenShort !== 'record-shortfall'
  ) {
    return [RECORD_SHORTFALL];
  }
  return [];
}

/** The change as the fix has it; throws, in plain words, for a fix the row does not offer. */
export function fixedMutation(row: OutboxRow, fix: ChangeFix): Mutation {
  const { mutation } = row;
  const offered = fixesFor(row).some((candidate) => candidate.kind === fix.kind);
  if (!offered || mutation.type !== POUR_LOGGED) {
    throw new Error('That fix does not apply to this change. Retry it as it is, or discard it.');
  }
  return { ...mutation, data: { ...mutation.data, whenShort: 'record-shortfall' } };
}
