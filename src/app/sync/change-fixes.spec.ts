import type { Mutation } from '@benchtide/shared';
import { v7 } from 'uuid';
import { fixedMutation, fixesFor } from './change-fixes';
import type { OutboxRow, RejectReason } from './synced-records';

type PourCreate = Extract<Mutation, { type: 'pour.create' }>;

const STOCK_SHORT: RejectReason = {
  code: 'stock_short',
  message: 'The shelf holds 5 g of part A; this pour needs 9.9 g.',
};

const pourCreate = (whenShort?: 'refuse' | 'record-shortfall'): Mutation => ({
  type: 'pour.create',
  mutationId: v7(),
  data: {
    id: v7(),
    buildId: v7(),
    materialId: v7(),
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    roomTempC: 20,
    startAt: '2025-03-01T10:00:00Z',
    ...(whenShort === undefined ? {} : { whenShort }),
  },
});

function row(mutation: Mutation, reason?: RejectReason): OutboxRow {
  return {
    seq: 1,
    mutationId: mutation.mutationId,
    workshopId: v7(),
    mutation,
    queuedAt: '2025-03-01T10:00:00.000Z',
    attempts: 1,
    state: reason === undefined ? 'waiting' : 'rejected',
    ...(reason === undefined ? {} : { reason }),
    undo: [],
  };
}

describe('change fixes', () => {
  describe('fixesFor', () => {
    it('should offer to log a pour refused for short stock with the rest noted as from another bottle', () => {
      expect(fixesFor(row(pourCreate('refuse'), STOCK_SHORT))).toEqual([
        { kind: 'record-shortfall', label: 'Log it, noting the rest came from a bottle not on the shelf' },
      ]);
      expect(fixesFor(row(pourCreate(), STOCK_SHORT)).map((fix) => fix.kind)).toEqual(['record-shortfall']);
    });

    it('should offer nothing for a change still waiting, refused for another reason, or already noting the rest', () => {
      expect(fixesFor(row(pourCreate()))).toEqual([]);
      expect(fixesFor(row(pourCreate(), { code: 'not_found', message: 'There is no such build.' }))).toEqual([]);
      expect(fixesFor(row(pourCreate('record-shortfall'), STOCK_SHORT))).toEqual([]);
      const build: Mutation = { type: 'build.delete', mutationId: v7(), recordId: v7() };
      expect(fixesFor(row(build, STOCK_SHORT))).toEqual([]);
    });
  });

  describe('fixedMutation', () => {
    it('should send the pour again noting the shortfall, changing nothing else', () => {
      const mutation = pourCreate('refuse') as PourCreate;
      const refused = row(mutation, STOCK_SHORT);
      const [fix] = fixesFor(refused);

      const fixed = fixedMutation(refused, fix!);

      const expected: PourCreate = { ...mutation, data: { ...mutation.data, whenShort: 'record-shortfall' } };
      expect(fixed).toEqual(expected);
    });

    it('should refuse, in plain words, a fix the change does not offer', () => {
      const fix = { kind: 'record-shortfall', label: 'Log it anyway' } as const;
      const notRefused = row(pourCreate());
      const build = row({ type: 'build.delete', mutationId: v7(), recordId: v7() }, STOCK_SHORT);

      expect(() => fixedMutation(notRefused, fix)).toThrowError(/does not apply to this change/);
      expect(() => fixedMutation(build, fix)).toThrowError(/does not apply to this change/);
    });
  });
});
