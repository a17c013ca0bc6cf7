import fc from 'fast-check';
import { planPour } from '../../shared/index.js';

/** Any value from `min` to `max`, leaning on the ends where the maths is weakest. */
const within = (min: number, max: number) =>
  fc.oneof(
    fc.double({ min, max, noNaN: true }),
    fc.constantFrom(min, max),
    fc.double({ min, max: min + (max - min) * 1e-6, noNaN: true }),
  );
const positive = (max: number) => within(Number.MIN_VALUE, max);

const request = fc.record({
  shape: fc.oneof(
    fc.record({ kind: fc.constant('rectangle'), lengthMm: positive(10_000), widthMm: positive(10_000) }),
    fc.record({ kind: fc.constant('circle'), diameterMm: positive(10_000) }),
    fc.record({ kind: fc.constant('ellipse'), lengthMm: positive(10_000), widthMm: positive(10_000) }),
    fc.record({ kind: fc.constant('area'), areaMm2: positive(1e8) }),
    fc.record({
      kind: fc.constant('polygon'),
      points: fc.array(fc.record({ xMm: within(-10_000, 10_000), yMm: within(-10_000, 10_000) }), {
        minLength: 3,
        maxLength: 8,
      }),
    }),
  ),
  depthMm: positive(10_000),
  displacedMl: within(0, 1e9),
  wastePercent: within(0, 100),
  material: fc.record({
    mixRatio: fc.record({ basis: fc.constantFrom('volume', 'weight'), partA: positive(1000), partB: within(0, 1000) }),
    densityAGPerMl: within(0.05, 25),
    densityBGPerMl: within(0.05, 25),
    potLifeMin: positive(525_600),
    recoatMin: positive(1),
    demouldMin: positive(1),
    fullCureMin: within(1, 525_600),
    referenceTempC: fc.integer({ min: 15, max: 30 }),
    minCureTempC: fc.integer({ min: -30, max: 15 }),
    maxLayerMm: positive(10_000),
  }),
  roomTempC: within(-30, 60),
  startAtMs: fc.oneof(fc.integer({ min: 0, max: Date.UTC(2200, 0, 1) }), fc.constant(Date.UTC(2200, 0, 1))),
  scaleResolutionG: within(0.001, 100),
  cupResolutionMl: within(0.01, 100),
  layerCount: fc.option(fc.integer({ min: 1, max: 50 }), { nil: undefined }),
});

describe('planPour on every input the schema accepts', () => {
  it('should give a plan or field errors, never throw, and never a number that is not finite', () => {
    let planned = 0;
    fc.assert(
      fc.property(request, (input) => {
        const result = planPour(input);
        if (result.ok) planned += 1;
        if (!result.ok) return result.errors.every((error) => error.message.length > 0);
        const numbers = JSON.stringify(result.plan, (_key, value: unknown) =>
          typeof value === 'number' && !Number.isFinite(value) ? 'NOT FINITE' : value,
        );
        return !numbers.includes('NOT FINITE');
      }),
      { numRuns: 3000 },
    );
    // Many of them plan (the rest mostly need over 50 layers): the bounds above are the schema's own, so the property is not passing on refusals.
    expect(planned).toBeGreaterThan(1000);
  });
});

describe('planPour past any real base', () => {
  const base = {
    shape: { kind: 'rectangle', lengthMm: 300, widthMm: 200 },
    depthMm: 10,
    material: {
      mixRatio: { basis: 'weight', partA: 2, partB: 1 },
      densityAGPerMl: 1.1,
      densityBGPerMl: 1.1,
      potLifeMin: 40,
      recoatMin: 360,
      demouldMin: 1440,
      fullCureMin: 10_080,
      referenceTempC: 25,
      minCureTempC: 15,
      maxLayerMm: 6,
    },
    roomTempC: 22,
    startAtMs: Date.UTC(2026, 11, 4, 9),
    scaleResolutionG: 0.1,
  };
  const errorsOf = (input: unknown) => {
    const result = planPour(input);
    return result.ok ? [] : result.errors.map((error) => `${error.path}: ${error.message}`);
  };

  it('should refuse a side longer than 10 m in plain words (common practice: no base is that large)', () => {
    expect(errorsOf({ ...base, shape: { kind: 'rectangle', lengthMm: 1e15, widthMm: 1e300 } })).toEqual([
      'shape.lengthMm: Length must be at most 10 m (10000 mm)',
      'shape.widthMm: Width must be at most 10 m (10000 mm)',
    ]);
    expect(errorsOf({ ...base, shape: { kind: 'area', areaMm2: 2e8 } })).toEqual([
      'shape.areaMm2: Area must be at most 100 m² (10 m by 10 m)',
    ]);
  });

  it('should refuse a scale that reads finer than a milligram, and a density past any material', () => {
    expect(errorsOf({ ...base, scaleResolutionG: 5e-324 })).toEqual([
      'scaleResolutionG: Scale resolution must be at least 0.001 g',
    ]);
    expect(errorsOf({ ...base, material: { ...base.material, densityAGPerMl: 1e15 } })).toEqual([
      'material.densityAGPerMl: Part A density must be at most 25 g/mL',
    ]);
  });

  it('should still plan a 10 m base to the millimetre', () => {
    expect(planPour({ ...base, shape: { kind: 'rectangle', lengthMm: 10_000, widthMm: 10_000 } }).ok).toBeTrue();
  });
});
