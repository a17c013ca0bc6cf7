import { splitKit, shoppingList, shoppingListText } from '../../shared/index.js';

// Worked examples by hand arithmetic (the sums written out beside each check); the data sheets are invented.
describe('a kit bought as one', () => {
  it('should split a 2:1-by-weight kit of 300 g into 200 g and 100 g, and its price by the same weights', () => {
    // 300 g × 2/3 = 200 g, 300 g × 1/3 = 100 g; 30.00 split 2:1 is 20.00 and 10.00.
    const [a, b] = splitKit({
      sizeQty: 300,
      unit: 'g',
      priceMinor: 3000,
      sheet: { mixRatio: { basis: 'weight', partA: 2, partB: 1 }, densityAGPerMl: 1.15, densityBGPerMl: 0.97 },
    });
    expect(a).toEqual({ part: 'A', sizeQty: jasmine.any(Number), priceMinor: 2000 });
    expect(a.sizeQty).toBeCloseTo(200, 6);
    expect(b.sizeQty).toBeCloseTo(100, 6);
    expect(b.priceMinor).toBe(1000);
  });

  it('should split a 1:1-by-volume litre into two half litres priced by what each weighs', () => {
    // 0.5 L each; 500 mL × 1.16 g/mL = 580 g and 500 mL × 0.98 g/mL = 490 g;
    // 50.00 × 580/1070 = 27.1028… → 27.10, and the rest, 22.90, so the parts add up to the kit.
    const [a, b] = splitKit({
      sizeQty: 1,
      unit: 'L',
      priceMinor: 5000,
      sheet: { mixRatio: { basis: 'volume', partA: 1, partB: 1 }, densityAGPerMl: 1.16, densityBGPerMl: 0.98 },
    });
    expect(a.sizeQty).toBeCloseTo(0.5, 9);
    expect(b.sizeQty).toBeCloseTo(0.5, 9);
    expect([a.priceMinor, b.priceMinor]).toEqual([2710, 2290]);
  });

  it('should turn a by-weight ratio into volumes when the kit is sold by volume', () => {
    // 100:45 by weight at 1.10 and 0.95 g/mL: 100/1.10 = 90.9091 mL and 45/0.95 = 47.3684 mL per unit of
    // ratio, 138.2775 mL in all, so 1000 mL holds 7.23183 units: A 657.44 mL, B 342.56 mL.
    const [a, b] = splitKit({
      sizeQty: 1000,
      unit: 'mL',
      priceMinor: 4500,
      sheet: { mixRatio: { basis: 'weight', partA: 100, partB: 45 }, densityAGPerMl: 1.1, densityBGPerMl: 0.95 },
    });
    expect(a.sizeQty).toBeCloseTo(657.44, 2);
    expect(b.sizeQty).toBeCloseTo(342.56, 2);
    // 4500 × 100/145 = 3103.45 → 3103; the rest 1397.
    expect([a.priceMinor, b.priceMinor]).toEqual([3103, 1397]);
  });

  it('should refuse a single-part medium, a kit in pieces, and a price that is not whole minor units', () => {
    const sheet = {
      mixRatio: { basis: 'weight' as const, partA: 2, partB: 1 },
      densityAGPerMl: 1.1,
      densityBGPerMl: 1,
    };
    expect(() =>
      splitKit({ sizeQty: 1, unit: 'L', priceMinor: 1, sheet: { ...sheet, mixRatio: { basis: 'volume', partA: 1 } } }),
    ).toThrowError(RangeError, /single-part/);
    expect(() => splitKit({ sizeQty: 2, unit: 'pcs', priceMinor: 1, sheet })).toThrowError(
      RangeError,
      /weight or volume/,
    );
    expect(() => splitKit({ sizeQty: 2, unit: 'g', priceMinor: 1.5, sheet })).toThrowError(RangeError, /whole number/);
    expect(() => splitKit({ sizeQty: 0, unit: 'g', priceMinor: 1, sheet })).toThrowError(RangeError, /more than 0/);
  });
});

describe('the shopping list', () => {
  const board = { id: 'board', name: 'Foam board', lowMarkQty: 0.5, lowMarkUnit: 'm2' as const };
  const resin = {
    id: 'resin',
    name: 'Clear casting resin',
    lowMarkQty: 500,
    lowMarkUnit: 'mL' as const,
    dataSheet: { densityAGPerMl: 1.1, densityBGPerMl: 0.95 },
  };
  const figures = { id: 'figures', name: 'Figures', lowMarkQty: 4, lowMarkUnit: 'pcs' as const };
  const containers = [
    { id: 'b1', materialId: 'board', part: 'single' as const, unit: 'm2' as const },
    { id: 'ra', materialId: 'resin', part: 'A' as const, unit: 'g' as const },
    { id: 'rb', materialId: 'resin', part: 'B' as const, unit: 'g' as const },
    { id: 'f1', materialId: 'figures', part: 'single' as const, unit: 'pcs' as const },
  ];

  it('should list what is at or under its mark, summed over its containers, with how much to buy', () => {
    // Board: 0.72 m² bought, 0.30 used, 0.42 left ≤ 0.5: buy 0.08 m².
    // Resin: 300 g of A at 1.10 g/mL = 272.727 mL and 150 g of B at 0.95 = 157.895 mL, 430.622 mL ≤ 500: buy 69.378 mL.
    // Figures: 9 left > 4, not listed.
    const items = shoppingList([board, resin, figures], containers, { b1: 0.42, ra: 300, rb: 150, f1: 9 });
    expect(items.map((item) => item.name)).toEqual(['Clear casting resin', 'Foam board']);
    expect(items[1]!.buyQty).toBeCloseTo(0.08, 9);
    expect(items[0]!.onHandQty).toBeCloseTo(430.622, 3);
    expect(items[0]!.buyQty).toBeCloseTo(69.378, 3);
  });

  it('should add what a pour was short of, in the mark unit, even above the mark', () => {
    // 100 g of part B short at 0.95 g/mL = 105.263 mL; the shelf holds 1000 mL worth, above its mark.
    const items = shoppingList([resin], containers, { ra: 1100 }, [{ materialId: 'resin', part: 'B', quantityG: 100 }]);
    expect(items.length).toBe(1);
    expect(items[0]!.shortQty).toBeCloseTo(105.263, 3);
    expect(items[0]!.buyQty).toBeCloseTo(105.263, 3);
  });

  it('should write one line per item to tick off', () => {
    const text = shoppingListText(shoppingList([board], containers, { b1: 0.42 }));
    expect(text.split('\n')).toEqual([
      'Benchtide shopping list',
      '[ ] Foam board: buy at least 0.08 m² (0.42 m² left, mark 0.5 m²)',
    ]);
  });

  it('should refuse a negative mark and a negative shortfall', () => {
    expect(() => shoppingList([{ ...board, lowMarkQty: -1 }], containers, {})).toThrowError(RangeError, /0 or more/);
    expect(() =>
      shoppingList([resin], containers, {}, [{ materialId: 'resin', part: 'A', quantityG: -5 }]),
    ).toThrowError(RangeError, /0 g or more/);
  });
});
