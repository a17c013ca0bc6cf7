import {
  materialDataSheetSchema,
  planPour,
  pourPlanRequestSchema,
  type PourPlanRequestInput,
} from '../../shared/index.js';

// Invented data sheet for tests only; not any maker's figures.
const material: PourPlanRequestInput['material'] = {
  name: 'Test casting resin',
  mixRatio: { basis: 'weight', partA: 2, partB: 1 },
  densityAGPerMl: 1.15,
  densityBGPerMl: 0.95,
  potLifeMin: 40,
  recoatMin: 360,
  demouldMin: 1440,
  fullCureMin: 10_080,
  referenceTempC: 25,
  minCureTempC: 15,
  maxLayerMm: 6,
};

const request: PourPlanRequestInput = {
  shape: { kind: 'rectangle', lengthMm: 200, widthMm: 100 },
  depthMm: 12,
  displacedMl: 40,
  wastePercent: 10,
  material,
  roomTempC: 25,
  startAtMs: Date.UTC(2025, 0, 10, 9, 0),
  scaleResolutionG: 0.1,
};

function errorsFor(input: unknown): { path: string; message: string }[] {
  const result = planPour(input);
  return result.ok ? [] : [...result.errors];
}

describe('planPour', () => {
  it('should combine volume, layers, mix and cure into one plan', () => {
    const result = planPour(request);
    if (!result.ok) {
      fail(result.errors);
      return;
    }
    const { plan } = result;
    // 200 x 100 x 12 mm = 240 mL; less 40 mL displaced; plus 10 %.
    expect(plan.volume.netVolumeMl).toBe(200);
    expect(plan.volume.totalToMixMl).toBeCloseTo(220, 12);
    expect(plan.layers).toEqual({ count: 2, layerDepthMm: 6, volumePerLayerMl: plan.volume.totalToMixMl / 2 });
    expect(plan.mix.layerCount).toBe(2);
    expect(plan.mix.exactTotal.totalMl).toBeCloseTo(220, 9);
    expect(plan.mix.exactPerLayer.partAG / plan.mix.exactPerLayer.partBG).toBeCloseTo(2, 12);
    expect(plan.cure.isEstimate).toBeTrue();
    expect(plan.cure.layers.length).toBe(2);
    expect(plan.warnings).toEqual([]);
    expect(plan.request.cupResolutionMl).toBe(1);
  });

  it('should fill in no displacement and no waste when they are left out', () => {
    const { displacedMl: _d, wastePercent: _w, ...bare } = request;
    const result = planPour(bare);
    expect(result.ok && result.plan.volume.totalToMixMl).toBe(240);
  });

  it('should gather warnings from every step', () => {
    const result = planPour({ ...request, displacedMl: 500, roomTempC: 10 });
    const codes = result.ok ? result.plan.warnings.map((warning) => warning.code) : [];
    expect(codes).toEqual(['displacement-exceeds-volume', 'below-minimum-temperature']);
  });

  it('should plan a single-part medium with no part B density', () => {
    const { densityBGPerMl: _b, ...single } = material;
    const result = planPour({ ...request, material: { ...single, mixRatio: { basis: 'volume', partA: 1 } } });
    expect(result.ok && result.plan.mix.singlePart).toBeTrue();
  });

  describe('when the input is impossible', () => {
    it('should reject a negative depth in plain words', () => {
      expect(errorsFor({ ...request, depthMm: -3 })).toEqual([
        { path: 'depthMm', message: 'Depth must be more than 0 mm' },
      ]);
    });

    it('should reject NaN and Infinity', () => {
      expect(errorsFor({ ...request, depthMm: Number.NaN })).toEqual([
        { path: 'depthMm', message: 'Depth must be a number' },
      ]);
      expect(errorsFor({ ...request, roomTempC: Number.POSITIVE_INFINITY }).map((error) => error.path)).toEqual([
        'roomTempC',
      ]);
    });

    it('should reject a zero ratio and a zero density', () => {
      const errors = errorsFor({
        ...request,
        material: { ...material, mixRatio: { basis: 'weight', partA: 0, partB: 1 }, densityBGPerMl: 0 },
      });
      expect(errors).toEqual([
        { path: 'material.mixRatio.partA', message: 'Part A of the ratio must be more than 0' },
        { path: 'material.densityBGPerMl', message: 'Part B density must be more than 0 g/mL' },
      ]);
    });

    it('should ask for part B density when the ratio has a part B', () => {
      const { densityBGPerMl: _b, ...noDensityB } = material;
      expect(errorsFor({ ...request, material: noDensityB })).toEqual([
        { path: 'material.densityBGPerMl', message: 'Part B density must be more than 0 g/mL' },
      ]);
    });

    it('should reject a traced outline with fewer than 3 points or with no area', () => {
      const twoPoints = {
        kind: 'polygon',
        points: [
          { xMm: 0, yMm: 0 },
          { xMm: 5, yMm: 5 },
        ],
      };
      expect(errorsFor({ ...request, shape: twoPoints })).toEqual([
        { path: 'shape.points', message: 'A traced outline needs at least 3 points' },
      ]);
      const line = {
        kind: 'polygon',
        points: [
          { xMm: 0, yMm: 0 },
          { xMm: 5, yMm: 5 },
          { xMm: 10, yMm: 10 },
        ],
      };
      expect(errorsFor({ ...request, shape: line })).toEqual([
        { path: 'shape.points', message: 'The traced outline has no area: its points lie on one line' },
      ]);
    });

    it('should reject an unknown shape and a recoat window that ends before it opens', () => {
      expect(errorsFor({ ...request, shape: { kind: 'hexagon' } })).toEqual([
        { path: 'shape.kind', message: 'Choose a shape: rectangle, circle, ellipse, traced outline or area' },
      ]);
      const sheet = materialDataSheetSchema.safeParse({ ...material, recoatMin: 300, recoatMaxMin: 200 });
      expect(sheet.success).toBeFalse();
    });

    it('should reject something that is not a request at all, and name missing fields', () => {
      expect(errorsFor(null)).toEqual([
        { path: '', message: 'A pour plan needs a shape, depth, material and room temperature' },
      ]);
      expect(errorsFor({ ...request, depthMm: undefined })).toEqual([
        { path: 'depthMm', message: 'Depth is required' },
      ]);
      expect(pourPlanRequestSchema.safeParse({}).success).toBeFalse();
    });
  });
});

describe('planPour with a chosen number of layers', () => {
  it('should split the depth evenly over more layers than the fewest', () => {
    const result = planPour({ ...request, layerCount: 4 });
    // 12 mm over 4 layers is 3 mm a layer (worked by hand).
    expect(result.ok && result.plan.layers.count).toBe(4);
    expect(result.ok && result.plan.layers.layerDepthMm).toBe(3);
  });

  it('should refuse fewer layers than the maximum layer thickness allows, on the layer count', () => {
    // 12 mm at most 6 mm a layer needs 2 (common practice: thicker layers overheat).
    expect(errorsFor({ ...request, layerCount: 1 }).map((error) => error.path)).toEqual(['layerCount']);
  });

  it('should refuse a depth that would take more than 50 layers', () => {
    // 400 mm at 6 mm a layer is 67 layers.
    expect(errorsFor({ ...request, depthMm: 400 }).map((error) => error.path)).toEqual(['depthMm']);
    expect(errorsFor({ ...request, layerCount: 51 }).map((error) => error.path)).toEqual(['layerCount']);
  });
});
