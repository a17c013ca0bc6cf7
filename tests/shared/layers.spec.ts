import fc from 'fast-check';
import { splitIntoLayers, volumePerLayerMl } from '../../shared/index.js';

describe('layers', () => {
  it('should pour 12 mm in 4 mm layers as exactly 3 layers (n = ceil(depth / max), common practice)', () => {
    expect(splitIntoLayers(12, 4)).toEqual({ count: 3, layerDepthMm: 4 });
  });

  it('should not add a layer for binary residue: 2.1 / 0.7 and 4.2 / 1.4 are 3 layers, 3 / 0.1 is 30', () => {
    expect(splitIntoLayers(2.1, 0.7).count).toBe(3);
    expect(splitIntoLayers(4.2, 1.4).count).toBe(3);
    expect(splitIntoLayers(3, 0.1).count).toBe(30);
  });

  it('should round up a part layer and share the depth evenly: 13 mm in 6 mm layers is 3 of 4.33 mm', () => {
    const split = splitIntoLayers(13, 6);
    expect(split.count).toBe(3);
    expect(split.layerDepthMm).toBeCloseTo(13 / 3, 12);
  });

  it('should pour a thin coat as one layer', () => {
    expect(splitIntoLayers(0.5, 6)).toEqual({ count: 1, layerDepthMm: 0.5 });
  });

  it('should refuse a depth or maximum layer of 0 or below', () => {
    expect(() => splitIntoLayers(0, 4)).toThrowError(RangeError);
    expect(() => splitIntoLayers(10, 0)).toThrowError(RangeError);
    expect(() => splitIntoLayers(Number.NaN, 4)).toThrowError(RangeError);
  });

  it('should share the volume evenly between layers', () => {
    expect(volumePerLayerMl(90, 3)).toBe(30);
    expect(() => volumePerLayerMl(90, 0)).toThrowError(RangeError);
  });

  const depth = fc.double({ min: 0.05, max: 200, noNaN: true });
  const maxLayer = fc.double({ min: 0.1, max: 50, noNaN: true });

  it('should split depths into the layers worked out by hand (n = ceil(depth / max), common practice)', () => {
    // [depth, maximum layer, layers, each layer], each worked by hand
    const worked: [number, number, number, number][] = [
      [25, 10, 3, 8.333333333333334], // 25 / 10 = 2.5 -> 3 layers of 25 / 3
      [2.1, 0.7, 3, 0.7], // exactly 3 maximum layers, though 2.1 / 0.7 is 3.0000000000000004 in binary
      [0.05, 50, 1, 0.05], // a skim coat is one layer
      [60, 50, 2, 30], // 1.2 -> 2 layers of 30 mm, not one of 50 and one of 10
      [100, 12.5, 8, 12.5],
    ];
    for (const [depthMm, maxLayerMm, count, layerDepthMm] of worked) {
      const split = splitIntoLayers(depthMm, maxLayerMm);
      expect(split.count).withContext(`${depthMm} at ${maxLayerMm}`).toBe(count);
      expect(split.layerDepthMm).withContext(`${depthMm} at ${maxLayerMm}`).toBeCloseTo(layerDepthMm, 12);
    }
  });

  it('should never exceed the maximum layer and never use more layers than needed (property)', () => {
    fc.assert(
      fc.property(depth, maxLayer, (depthMm, maxLayerMm) => {
        const { count, layerDepthMm } = splitIntoLayers(depthMm, maxLayerMm);
        expect(Number.isInteger(count) && count >= 1).toBeTrue();
        expect(layerDepthMm).toBeLessThanOrEqual(maxLayerMm * (1 + 1e-9));
        expect((count - 1) * maxLayerMm).toBeLessThan(depthMm);
      }),
    );
  });

  it('should give n layers for a depth of exactly n maximum layers (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 200 }), fc.integer({ min: 1, max: 100 }), (count, tenths) => {
        const maxLayerMm = tenths / 10;
        expect(splitIntoLayers(count * maxLayerMm, maxLayerMm).count).toBe(count);
      }),
    );
  });
});
