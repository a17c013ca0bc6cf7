import fc from 'fast-check';
import {
  allocateFifo,
  costOfUseMinor,
  costOfUses,
  massToVolumeMl,
  remainingByContainer,
  stocktakeAdjustment,
  volumeToMassG,
  type LedgerEntry,
  type StockOnHand,
} from '../../shared/index.js';

describe('ledger', () => {
  describe('remainingByContainer', () => {
    const entries: LedgerEntry[] = [
      { containerId: 'resin-a', kind: 'purchase', quantity: 100, atMs: 1 },
      { containerId: 'resin-a', kind: 'pour-use', quantity: -12.3, atMs: 2 },
      { containerId: 'resin-b', kind: 'purchase', quantity: 50, atMs: 1 },
      { containerId: 'resin-a', kind: 'waste', quantity: -45.6, atMs: 3 },
    ];

    it('should sum the entries per container without binary residue: 100 - 12.3 - 45.6 is 42.1', () => {
      expect(remainingByContainer(entries)).toEqual({ 'resin-a': 42.1, 'resin-b': 50 });
    });

    it('should give the same stock whatever order entries sync in (property)', () => {
      fc.assert(
        fc.property(fc.shuffledSubarray(entries, { minLength: entries.length }), (shuffled) => {
          expect(remainingByContainer(shuffled)).toEqual(remainingByContainer(entries));
        }),
      );
    });

    it('should record a stocktake as counted minus expected, so remaining becomes the count', () => {
      const adjustment = stocktakeAdjustment(40, 42.1);
      expect(adjustment).toBe(-2.1);
      const counted = [
        ...entries,
        { containerId: 'resin-a', kind: 'stocktake' as const, quantity: adjustment, atMs: 4 },
      ];
      expect(remainingByContainer(counted)['resin-a']).toBe(40);
    });
  });

  describe('allocateFifo', () => {
    const stock: StockOnHand[] = [
      { containerId: 'c-new', boughtAtMs: 300, remainingQty: 500 },
      { containerId: 'c-old', boughtAtMs: 100, remainingQty: 30 },
      { containerId: 'c-empty', boughtAtMs: 50, remainingQty: 0 },
      { containerId: 'c-mid-b', boughtAtMs: 200, remainingQty: 40 },
      { containerId: 'c-mid-a', boughtAtMs: 200, remainingQty: 40 },
    ];

    it('should take from the oldest container first, then by id, skipping empty ones', () => {
      expect(allocateFifo(100, stock)).toEqual({
        allocations: [
          { containerId: 'c-old', quantity: 30 },
          { containerId: 'c-mid-a', quantity: 40 },
          { containerId: 'c-mid-b', quantity: 30 },
        ],
        allocatedQty: 100,
        shortfallQty: 0,
      });
    });

    it('should take from a chosen container first', () => {
      expect(allocateFifo(20, stock, 'c-new').allocations).toEqual([{ containerId: 'c-new', quantity: 20 }]);
    });

    it('should report a shortfall rather than overdraw', () => {
      expect(allocateFifo(700, stock)).toEqual(jasmine.objectContaining({ allocatedQty: 610, shortfallQty: 90 }));
    });

    const stockArb = fc.uniqueArray(
      fc.record({
        containerId: fc.string({ minLength: 1, maxLength: 6 }),
        boughtAtMs: fc.integer({ min: 0, max: 1000 }),
        remainingQty: fc.integer({ min: -5000, max: 100_000 }).map((milli) => milli / 1000),
      }),
      { selector: (item) => item.containerId, maxLength: 8 },
    );
    const needArb = fc.integer({ min: 0, max: 400_000 }).map((milli) => milli / 1000);

    it('should conserve quantity and never overdraw any container (property)', () => {
      fc.assert(
        fc.property(needArb, stockArb, (needQty, items) => {
          const result = allocateFifo(needQty, items);
          const milli = (value: number) => Math.round(value * 1000);
          const allocatedMilli = result.allocations.reduce((sum, allocation) => sum + milli(allocation.quantity), 0);
          expect(allocatedMilli).toBe(milli(result.allocatedQty));
          expect(allocatedMilli + milli(result.shortfallQty)).toBe(milli(needQty));
          expect(result.shortfallQty).toBeGreaterThanOrEqual(0);
          for (const allocation of result.allocations) {
            const item = items.find((candidate) => candidate.containerId === allocation.containerId);
            expect(allocation.quantity).toBeGreaterThan(0);
            expect(allocation.quantity).toBeLessThanOrEqual(item?.remainingQty ?? 0);
          }
          const available = items.reduce((sum, item) => sum + Math.max(0, milli(item.remainingQty)), 0);
          expect(milli(result.shortfallQty)).toBe(Math.max(0, milli(needQty) - available));
        }),
      );
    });
  });

  describe('mass and volume', () => {
    it('should convert by density (rho = m / V): 110 g at 1.1 g/mL is 100 mL', () => {
      expect(massToVolumeMl(110, 1.1)).toBeCloseTo(100, 12);
      expect(volumeToMassG(100, 1.1)).toBeCloseTo(110, 12);
      expect(() => massToVolumeMl(1, 0)).toThrowError(RangeError);
    });
  });

  describe('cost', () => {
    const kit = { sizeQty: 1000, priceMinor: 2999, currency: 'EUR' };

    it('should cost a use as amount x price / size, rounded to a whole cent: 50 g of a 1000 g kit at 29.99 is 1.50', () => {
      expect(costOfUseMinor(50, kit)).toBe(150);
    });

    it('should round exactly half a minor unit up', () => {
      expect(costOfUseMinor(1, { sizeQty: 2, priceMinor: 3 })).toBe(2);
      expect(costOfUseMinor(0.1, { sizeQty: 0.2, priceMinor: 5 })).toBe(3);
    });

    it('should sum rounded uses per currency and never add currencies together', () => {
      const uses = [
        { quantity: 50, container: kit },
        { quantity: 33.3, container: kit },
        { quantity: 10, container: { sizeQty: 500, priceMinor: 1500, currency: 'GBP' } },
      ];
      expect(costOfUses(uses)).toEqual({ EUR: 150 + 100, GBP: 30 });
    });

    it('should make a build total equal the sum of its cost lines (property)', () => {
      fc.assert(
        fc.property(
          fc.array(
            fc.integer({ min: 0, max: 1_000_000 }).map((milli) => milli / 1000),
            { maxLength: 20 },
          ),
          (quantities) => {
            const uses = quantities.map((quantity) => ({ quantity, container: kit }));
            const lines = quantities.map((quantity) => costOfUseMinor(quantity, kit));
            expect(costOfUses(uses)['EUR'] ?? 0).toBe(lines.reduce((sum, line) => sum + line, 0));
            expect(lines.every((line) => Number.isInteger(line) && line >= 0)).toBeTrue();
          },
        ),
      );
    });
  });
});
