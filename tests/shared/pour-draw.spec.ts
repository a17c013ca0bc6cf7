import fc from 'fast-check';
import {
  drawForPour,
  partsNeeded,
  planPour,
  stockShortMessage,
  type PourPlan,
  type PourPlanRequestInput,
  type ShelfContainer,
} from '../../shared/index.js';

// Invented data sheets for tests only; not any maker's figures.
const twoPart: PourPlanRequestInput['material'] = {
  mixRatio: { basis: 'weight', partA: 1, partB: 1 },
  densityAGPerMl: 1.1,
  densityBGPerMl: 0.9,
  potLifeMin: 30,
  recoatMin: 240,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 10,
};
const singlePart: PourPlanRequestInput['material'] = {
  ...twoPart,
  mixRatio: { basis: 'volume', partA: 1 },
  densityAGPerMl: 1.15,
  densityBGPerMl: undefined,
};

/** 100 × 50 mm, 4 mm deep: 20 mL to mix (1 mL = 1000 mm³), one layer. */
function planFor(material: PourPlanRequestInput['material']): PourPlan {
  const result = planPour({
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 50 },
    depthMm: 4,
    material,
    roomTempC: 20,
    startAtMs: Date.UTC(2026, 10, 20, 18),
    scaleResolutionG: 0.1,
  });
  if (!result.ok) throw new Error(result.errors.map((error) => error.message).join(' '));
  return result.plan;
}

function container(id: string, fields: Partial<ShelfContainer> = {}): ShelfContainer {
  return {
    id,
    part: 'A',
    unit: 'g',
    boughtOn: '2026-10-01',
    sizeQty: 500,
    priceMinor: 2500,
    remainingQty: 500,
    ...fields,
  };
}

describe('pour draw', () => {
  // Worked example by hand: 20 mL of a 1:1-by-weight mix with part densities 1.1 and 0.9 g/mL
  // weighs 20 / (0.5/1.1 + 0.5/0.9) = 19.8 g (ideal mixing: the parts' volumes add, common practice), 9.9 g a part.
  const plan = planFor(twoPart);

  describe('partsNeeded', () => {
    it('should need 9.9 g of each part of a 1:1-by-weight pour of 20 mL (worked example)', () => {
      expect(partsNeeded(plan)).toEqual([
        { part: 'A', quantityG: 9.9, densityGPerMl: 1.1 },
        { part: 'B', quantityG: 9.9, densityGPerMl: 0.9 },
      ]);
    });

    it('should need one part of a single-part medium: 20 mL at 1.15 g/mL is 23 g (worked example, m = ρV)', () => {
      expect(partsNeeded(planFor(singlePart))).toEqual([{ part: 'single', quantityG: 23, densityGPerMl: 1.15 }]);
    });
  });

  describe('drawForPour', () => {
    it('should take each part from its own container and cost it as amount × price / size (worked example)', () => {
      const shelf = [container('a'), container('b', { part: 'B', priceMinor: 2000 })];

      const draw = drawForPour(plan, shelf);

      // 9.9 g × 2500 / 500 = 49.5 cents; 9.9 g × 2000 / 500 = 39.6 cents, kept exact (a report rounds once).
      expect(draw).toEqual({
        uses: [
          { containerId: 'a', part: 'A', quantity: 9.9, costMinor: 49.5 },
          { containerId: 'b', part: 'B', quantity: 9.9, costMinor: 39.6 },
        ],
        shortfall: [],
      });
    });

    it('should take from the oldest container first, then the next (common practice: first in, first out)', () => {
      const shelf = [
        container('newer', { boughtOn: '2026-06-01' }),
        container('older', { boughtOn: '2026-01-01', sizeQty: 5, priceMinor: 100, remainingQty: 5 }),
        container('b', { part: 'B' }),
      ];

      const { uses } = drawForPour(plan, shelf);

      // 5 g of the older 5 g tin at 1.00 costs 100 cents; the other 4.9 g × 2500 / 500 = 24.5 cents.
      expect(uses.filter((use) => use.part === 'A')).toEqual([
        { containerId: 'older', part: 'A', quantity: 5, costMinor: 100 },
        { containerId: 'newer', part: 'A', quantity: 4.9, costMinor: 24.5 },
      ]);
    });

    it('should turn grams into millilitres by the part density for a container measured by volume (worked example)', () => {
      const shelf = [
        container('a', { unit: 'mL', sizeQty: 250 }),
        container('b', { part: 'B', unit: 'mL', sizeQty: 250, priceMinor: 2000 }),
      ];

      const { uses } = drawForPour(plan, shelf);

      // V = m / ρ: 9.9 g / 1.1 g/mL = 9 mL, costing 9 × 2500 / 250 = 90 cents;
      // 9.9 g / 0.9 g/mL = 11 mL, costing 11 × 2000 / 250 = 88 cents.
      expect(uses).toEqual([
        { containerId: 'a', part: 'A', quantity: 9, costMinor: 90 },
        { containerId: 'b', part: 'B', quantity: 11, costMinor: 88 },
      ]);
    });

    it('should round millilitres to the thousandth, after counting what a bottle by volume holds in grams (worked example)', () => {
      const shelf = [
        container('tin', { part: 'single', boughtOn: '2026-01-01', remainingQty: 7 }),
        container('bottle', { part: 'single', unit: 'mL', sizeQty: 250, priceMinor: 3000, remainingQty: 100 }),
      ];

      const { uses } = drawForPour(planFor(singlePart), shelf);

      // 7 g × 2500 / 500 = 35 cents from the tin; the other 23 g - 7 g = 16 g from the bottle:
      // 16 / 1.15 = 13.9130434… mL → 13.913 mL, costing 13.913 × 3000 / 250 = 166.956 cents.
      expect(uses).toEqual([
        { containerId: 'tin', part: 'single', quantity: 7, costMinor: 35 },
        { containerId: 'bottle', part: 'single', quantity: 13.913, costMinor: 166.956 },
      ]);
    });

    it('should count 5 mL left in a bottle as 5.5 g of part A at 1.1 g/mL (worked example, m = ρV)', () => {
      const shelf = [
        container('bottle', { unit: 'mL', sizeQty: 250, remainingQty: 5, boughtOn: '2026-01-01' }),
        container('tin'),
        container('b', { part: 'B' }),
      ];

      const { uses } = drawForPour(plan, shelf);

      // 5 mL × 1.1 = 5.5 g from the older bottle, all of it; the other 4.4 g from the tin.
      expect(uses.filter((use) => use.part === 'A').map((use) => [use.containerId, use.quantity])).toEqual([
        ['bottle', 5],
        ['tin', 4.4],
      ]);
    });

    it('should draw only from the chosen containers, oldest first among them', () => {
      const shelf = [
        container('oldest', { boughtOn: '2026-01-01' }),
        container('chosen-newer', { boughtOn: '2026-09-01', remainingQty: 4 }),
        container('chosen-older', { boughtOn: '2026-03-01', remainingQty: 3 }),
        container('b', { part: 'B' }),
      ];

      const draw = drawForPour(plan, shelf, ['chosen-newer', 'chosen-older', 'b']);

      expect(draw.uses.filter((use) => use.part === 'A').map((use) => [use.containerId, use.quantity])).toEqual([
        ['chosen-older', 3],
        ['chosen-newer', 4],
      ]);
      expect(draw.shortfall).toEqual([{ part: 'A', quantityG: 2.9 }]);
    });

    it('should report what the shelf cannot cover as a shortfall, taking all there is and never overdrawing', () => {
      const shelf = [container('small', { sizeQty: 5, remainingQty: 5 }), container('emptied', { remainingQty: -2 })];

      const draw = drawForPour(plan, shelf);

      expect(draw).toEqual({
        uses: [{ containerId: 'small', part: 'A', quantity: 5, costMinor: 2500 }],
        shortfall: [
          { part: 'A', quantityG: 4.9 },
          { part: 'B', quantityG: 9.9 },
        ],
      });
    });

    const gramsArb = fc.integer({ min: -2000, max: 30_000 }).map((milli) => milli / 1000);
    const shelfArb = fc.uniqueArray(
      fc.record({
        id: fc.string({ minLength: 1, maxLength: 4 }),
        part: fc.constantFrom('A' as const, 'B' as const),
        boughtOn: fc.constantFrom('2026-01-01', '2026-02-01', '2026-03-01'),
        remainingQty: gramsArb,
      }),
      { selector: (item) => item.id, maxLength: 6 },
    );

    it('should take exactly what each part needs, less its shortfall, and no more than a container holds (property)', () => {
      fc.assert(
        fc.property(shelfArb, (items) => {
          const shelf = items.map((item) => container(item.id, item));
          const milli = (value: number) => Math.round(value * 1000);

          const draw = drawForPour(plan, shelf);

          for (const { part, quantityG } of partsNeeded(plan)) {
            const taken = draw.uses
              .filter((use) => use.part === part)
              .reduce((sum, use) => sum + milli(use.quantity), 0);
            const short = draw.shortfall.find((entry) => entry.part === part)?.quantityG ?? 0;
            expect(taken + milli(short)).toBe(milli(quantityG));
          }
          for (const use of draw.uses) {
            expect(use.quantity).toBeGreaterThan(0);
            expect(use.quantity).toBeLessThanOrEqual(shelf.find((item) => item.id === use.containerId)!.remainingQty);
          }
        }),
      );
    });
  });

  describe('containers kept in millilitres', () => {
    // Densities that make grams and millilitres disagree in the last place (invented figures).
    const densityArb = fc.integer({ min: 800, max: 1600 }).map((milli) => milli / 1000);
    const pourArb = fc.record({
      lengthMm: fc.integer({ min: 5, max: 400 }),
      depthMm: fc.integer({ min: 1, max: 30 }),
      densityA: densityArb,
      densityB: densityArb,
    });
    const mlShelfArb = fc.uniqueArray(
      fc.record({
        id: fc.string({ minLength: 1, maxLength: 4 }),
        part: fc.constantFrom('A' as const, 'B' as const),
        unit: fc.constantFrom('g' as const, 'mL' as const),
        boughtOn: fc.constantFrom('2026-01-01', '2026-02-01', '2026-03-01'),
        remainingQty: fc.integer({ min: 0, max: 60_000 }).map((milli) => milli / 1000),
      }),
      { selector: (item) => item.id, minLength: 1, maxLength: 6 },
    );

    it('should never take more than a container holds, to the thousandth of a millilitre (property)', () => {
      fc.assert(
        fc.property(pourArb, mlShelfArb, ({ lengthMm, depthMm, densityA, densityB }, items) => {
          const result = planPour({
            shape: { kind: 'rectangle', lengthMm, widthMm: 37 },
            depthMm,
            material: { ...twoPart, densityAGPerMl: densityA, densityBGPerMl: densityB, maxLayerMm: 30 },
            roomTempC: 20,
            startAtMs: Date.UTC(2026, 10, 20, 18),
            scaleResolutionG: 0.01,
          });
          if (!result.ok) return;
          const shelf = items.map((item) => container(item.id, item));

          const draw = drawForPour(result.plan, shelf);

          for (const use of draw.uses) {
            const held = shelf.find((item) => item.id === use.containerId)!.remainingQty;
            expect(Math.round(use.quantity * 1000)).toBeLessThanOrEqual(Math.round(held * 1000));
          }
          // and a container the pour emptied is left at exactly 0, never -0.001
          for (const item of shelf) {
            const taken = draw.uses
              .filter((use) => use.containerId === item.id)
              .reduce((sum, use) => sum + use.quantity, 0);
            expect(Math.round((item.remainingQty - taken) * 1000)).toBeGreaterThanOrEqual(0);
          }
        }),
        { numRuns: 500 },
      );
    });
  });

  describe('stockShortMessage', () => {
    it('should say in plain words what the shelf holds, what the pour needs and what to do', () => {
      const draw = drawForPour(plan, [container('small', { remainingQty: 5 }), container('b', { part: 'B' })]);

      expect(stockShortMessage(plan, draw.shortfall)).toBe(
        'The shelf holds 5 g of part A; this pour needs 9.9 g. ' +
          'Add a container, or record the rest as taken from a bottle not on the shelf.',
      );
    });

    it('should name every short part, and call a single-part medium "this material"', () => {
      expect(stockShortMessage(plan, drawForPour(plan, []).shortfall)).toBe(
        'The shelf holds 0 g of part A; this pour needs 9.9 g. The shelf holds 0 g of part B; this pour needs 9.9 g. ' +
          'Add a container, or record the rest as taken from a bottle not on the shelf.',
      );
      const single = planFor(singlePart);
      expect(stockShortMessage(single, [{ part: 'single', quantityG: 3 }])).toContain(
        'The shelf holds 20 g of this material; this pour needs 23 g.',
      );
    });
  });
});
