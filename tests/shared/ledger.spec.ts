import fc from 'fast-check';
import {
  allocateFifo,
  costOfUseMinor,
  costOfUses,
  sumCostsMinor,
  wholeMinor,
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

    it('should refuse an entry that is not a number or has the wrong sign, rather than sum to NaN', () => {
      const bad = (kind: LedgerEntry['kind'], quantity: number): LedgerEntry => ({
        containerId: 'resin-a',
        kind,
        quantity,
        atMs: 3,
      });
      expect(() => remainingByContainer([...entries, bad('pour-use', Number.NaN)])).toThrowError(
        RangeError,
        'A stock-book entry (pour-use) has a quantity that is not a number (NaN). Container resin-a.',
      );
      expect(() => remainingByContainer([bad('purchase', -500)])).toThrowError(RangeError, /purchase must add stock/);
      expect(() => remainingByContainer([bad('pour-use', 12)])).toThrowError(
        RangeError,
        /pour use must take stock away/,
      );
      expect(() => remainingByContainer([bad('waste', 0)])).toThrowError(RangeError, /waste must take stock away/);
      // a stocktake is the counted minus the expected, either way
      expect(remainingByContainer([bad('purchase', 10), bad('stocktake', -2.5), bad('stocktake', 0.5)])).toEqual({
        'resin-a': 8,
      });
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

    it('should cost a use as amount x price / size, exact to the millionth of a cent: 50 g of a 1000 g kit at 29.99 is 149.95 cents', () => {
      // hand-worked: 50 x 2999 / 1000 = 149.95
      expect(costOfUseMinor(50, kit)).toBe(149.95);
      // hand-worked: 1 x 100 / 3 = 33.3333333..., kept to the millionth
      expect(costOfUseMinor(1, { sizeQty: 3, priceMinor: 100 })).toBe(33.333333);
    });

    it('should round a line of money once, exactly half a minor unit away from zero', () => {
      expect(wholeMinor(costOfUseMinor(1, { sizeQty: 2, priceMinor: 3 }))).toBe(2);
      expect(wholeMinor(costOfUseMinor(0.1, { sizeQty: 0.2, priceMinor: 5 }))).toBe(3);
      expect(wholeMinor(149.95)).toBe(150);
      expect(wholeMinor(-2.5)).toBe(-3);
      expect(wholeMinor(0.4999)).toBe(0);
    });

    it('should sum exact uses per currency, round once, and never add currencies together', () => {
      const uses = [
        { quantity: 50, container: kit },
        { quantity: 33.3, container: kit },
        { quantity: 10, container: { sizeQty: 500, priceMinor: 1500, currency: 'GBP' } },
      ];
      // hand-worked: 149.95 + 33.3 x 2.999 (= 99.8667) = 249.8167 cents, 2.50; 10 x 1500 / 500 = 30 pence
      expect(costOfUses(uses)).toEqual({ EUR: 250, GBP: 30 });
    });

    it('should not let a hundred uses of under half a cent each cost nothing', () => {
      // hand-worked: 0.05 g of a 500 g bottle at 49.99 is 0.05 x 4999 / 500 = 0.4999 cent; a hundred are 49.99 cents
      const bottle = { sizeQty: 500, priceMinor: 4999, currency: 'EUR' };
      const uses = Array.from({ length: 100 }, () => ({ quantity: 0.05, container: bottle }));
      expect(costOfUses(uses)).toEqual({ EUR: 50 });
      expect(sumCostsMinor(uses.map((use) => costOfUseMinor(use.quantity, bottle)))).toBe(49.99);
    });

    it('should cost many uses within half a cent of the whole amount at the unit price (property)', () => {
      fc.assert(
        fc.property(
          fc.array(
            fc.integer({ min: 0, max: 1_000_000 }).map((milli) => milli / 1000),
            { maxLength: 50 },
          ),
          (quantities) => {
            const uses = quantities.map((quantity) => ({ quantity, container: kit }));
            // the whole amount priced once, in plain floating point: an independent figure
            const whole = (quantities.reduce((sum, quantity) => sum + quantity, 0) * kit.priceMinor) / kit.sizeQty;
            expect(Math.abs((costOfUses(uses)['EUR'] ?? 0) - whole)).toBeLessThanOrEqual(0.5 + 1e-6);
          },
        ),
      );
    });

    it('should refuse a cost that is not a number', () => {
      expect(() => sumCostsMinor([1, Number.NaN])).toThrowError(RangeError, /finite number/);
      expect(() => wholeMinor(Number.POSITIVE_INFINITY)).toThrowError(RangeError);
    });
  });
});
