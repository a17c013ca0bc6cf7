import {
  containerUnitProblem,
  convertAmount,
  MATERIAL_KIND_WORDS,
  MATERIAL_KINDS,
  materialMeasureProblem,
  newMaterialSchema,
  formatStock,
  stockUnitsOf,
  unitDimension,
  unitMismatch,
  type AmountUnit,
} from '../../shared/index.js';

// Factors from NIST Handbook 44 (2024), Appendix C, General Tables of Units of Measurement:
// 1 lb = 453.592 37 g, 1 oz = 28.349 523 125 g, 1 US fl oz = 29.573 529 562 5 mL, 1 ft = 0.304 8 m,
// 1 ft² = 0.092 903 04 m²; and the SI prefixes: 1 kg = 1000 g, 1 L = 1000 mL, 1 m = 100 cm.
describe('stock units', () => {
  it('should convert within each dimension by the NIST Handbook 44 Appendix C factors', () => {
    const checks: [number, AmountUnit, AmountUnit, number][] = [
      [1, 'lb', 'g', 453.59237],
      [1, 'kg', 'lb', 2.2046226218],
      [16, 'oz', 'lb', 1],
      [1, 'usFlOz', 'mL', 29.5735295625],
      [1, 'L', 'usFlOz', 33.8140227018],
      [1, 'ft', 'm', 0.3048],
      [10, 'ft', 'cm', 304.8],
      [1, 'ft2', 'm2', 0.09290304],
      [1, 'm2', 'ft2', 10.7639104167],
      [12, 'pcs', 'pcs', 12],
      [2.5, 'kg', 'g', 2500],
    ];
    for (const [quantity, from, to, expected] of checks) {
      expect(convertAmount(quantity, from, to))
        .withContext(`${quantity} ${from} in ${to}`)
        .toBeCloseTo(expected, 9);
    }
  });

  it('should refuse to turn one dimension into another, in plain words', () => {
    expect(() => convertAmount(1, 'g', 'm')).toThrowError(RangeError, 'Cannot turn a weight (g) into m');
    expect(() => convertAmount(3, 'pcs', 'm2')).toThrowError(RangeError, /a count of pieces/);
    expect(() => convertAmount(Number.NaN, 'g', 'kg')).toThrowError(RangeError, /finite/);
    expect(unitMismatch('g', 'length')).toBe('g is a weight, but this is measured as a length: choose m.');
    expect(unitMismatch('m2', 'area')).toBeNull();
  });

  it('should group the units bought in by dimension', () => {
    expect(stockUnitsOf('mass')).toEqual(['g', 'kg']);
    expect(stockUnitsOf('volume')).toEqual(['mL', 'L']);
    expect(stockUnitsOf('count')).toEqual(['pcs']);
    expect(unitDimension('m2')).toBe('area');
  });

  it('should show amounts in their own unit, or the imperial one on an imperial device', () => {
    expect(formatStock(405.5, 'g')).toBe('405.5 g');
    // 500 g / 28.349523125 = 17.637 oz (NIST Handbook 44)
    expect(formatStock(500, 'g', true)).toBe('17.64 oz');
    expect(formatStock(12, 'pcs', true)).toBe('12 pcs');
    // 0.5 m² / 0.09290304 = 5.382 ft²
    expect(formatStock(0.5, 'm2', true)).toBe('5.38 ft²');
    expect(formatStock(3, 'm')).toBe('3 m');
  });
});

describe('materials beyond pours', () => {
  const sheet = { mixRatio: { basis: 'weight' }, densityAGPerMl: 1.1 };

  it('should ask a pour material for its data sheet, and the rest for how they are measured', () => {
    expect(materialMeasureProblem({ kind: 'two-part-epoxy', dataSheet: null })?.path).toBe('dataSheet');
    expect(materialMeasureProblem({ kind: 'foam-and-boards', dataSheet: null, measure: null })).toEqual({
      path: 'measure',
      message: 'Say how it is bought and used: by weight, volume, pieces, length or area.',
    });
    expect(materialMeasureProblem({ kind: 'foam-and-boards', measure: 'area' })).toBeNull();
    expect(materialMeasureProblem({ kind: 'other', dataSheet: sheet })).toBeNull();
  });

  it('should keep a container in a unit that fits its material, in plain words when it does not', () => {
    expect(containerUnitProblem({ kind: 'two-part-epoxy', dataSheet: sheet }, 'L')).toBeNull();
    expect(containerUnitProblem({ kind: 'two-part-epoxy', dataSheet: sheet }, 'pcs')).toBe(
      'A pour material is kept by weight or volume: choose g, kg, mL or L.',
    );
    expect(containerUnitProblem({ kind: 'track', measure: 'length' }, 'g')).toBe(
      'g is a weight, but this is measured as a length: choose m.',
    );
    expect(containerUnitProblem({ kind: 'kits-figures-details', measure: 'count' }, 'pcs')).toBeNull();
  });

  it('should refuse a new material that does not hold together, through the shared schema', () => {
    const base = { id: '01928c1e-0000-7000-8000-000000000001', name: 'Blue foam board' };
    expect(newMaterialSchema.safeParse({ ...base, kind: 'foam-and-boards', measure: 'area' }).success).toBeTrue();
    const refused = newMaterialSchema.safeParse({ ...base, kind: 'foam-and-boards' });
    expect(refused.success).toBeFalse();
    expect(refused.error?.issues[0]?.path).toEqual(['measure']);
    expect(newMaterialSchema.safeParse({ ...base, kind: 'water-gel' }).success).toBeFalse();
  });

  it('should name every kind in the trade words', () => {
    expect(MATERIAL_KINDS.map((kind) => MATERIAL_KIND_WORDS[kind])).toEqual([
      'Two-part epoxy',
      'Single-part medium',
      'Water gel',
      'Foam and boards',
      'Plaster and fillers',
      'Paints and washes',
      'Scenic materials',
      'Kits, figures and details',
      'Track',
      'Adhesives',
      'Other',
    ]);
  });
});
