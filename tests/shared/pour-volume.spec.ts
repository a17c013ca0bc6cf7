import fc from 'fast-check';
import { polygonAreaMm2, pourVolume, shapeAreaMm2, type PourShape } from '../../shared/index.js';

describe('pour volume', () => {
  describe('shapeAreaMm2', () => {
    it('should give a rectangle length x width', () => {
      expect(shapeAreaMm2({ kind: 'rectangle', lengthMm: 300, widthMm: 120 })).toBe(36_000);
    });

    it('should give a circle pi r^2: 100 mm across is 7853.98 mm2 (circle area pi r^2)', () => {
      expect(shapeAreaMm2({ kind: 'circle', diameterMm: 100 })).toBeCloseTo(7853.981634, 6);
    });

    it('should give an ellipse pi a b from its full axes: 200 x 100 mm is 15707.96 mm2 (ellipse area pi a b)', () => {
      expect(shapeAreaMm2({ kind: 'ellipse', lengthMm: 200, widthMm: 100 })).toBeCloseTo(15707.963268, 6);
    });

    it('should equal the circle when both axes are the same (ellipse a = b = r)', () => {
      const ellipse = shapeAreaMm2({ kind: 'ellipse', lengthMm: 80, widthMm: 80 });
      expect(ellipse).toBeCloseTo(shapeAreaMm2({ kind: 'circle', diameterMm: 80 }), 9);
    });

    it('should give the classic shoelace polygon (3,4),(5,11),(12,8),(9,5),(5,6) an area of 30 (shoelace formula worked example)', () => {
      const points = [
        [3, 4],
        [5, 11],
        [12, 8],
        [9, 5],
        [5, 6],
      ].map(([xMm = 0, yMm = 0]) => ({ xMm, yMm }));
      expect(polygonAreaMm2(points)).toBe(30);
      expect(polygonAreaMm2([...points].reverse())).toBe(30);
    });

    it('should give a traced unit square of 10 mm an area of 100 mm2 (shoelace formula)', () => {
      const square = [
        { xMm: 0, yMm: 0 },
        { xMm: 10, yMm: 0 },
        { xMm: 10, yMm: 10 },
        { xMm: 0, yMm: 10 },
      ];
      expect(shapeAreaMm2({ kind: 'polygon', points: square })).toBe(100);
    });

    it('should refuse an outline of fewer than 3 points', () => {
      expect(() =>
        polygonAreaMm2([
          { xMm: 0, yMm: 0 },
          { xMm: 1, yMm: 1 },
        ]),
      ).toThrowError(RangeError);
    });

    it('should take a typed-in area as it is', () => {
      expect(shapeAreaMm2({ kind: 'area', areaMm2: 1234.5 })).toBe(1234.5);
    });
  });

  describe('pourVolume', () => {
    const pond: PourShape = { kind: 'rectangle', lengthMm: 200, widthMm: 100 };

    it('should turn 1000 mm3 into 1 mL: 200 x 100 x 5 mm is 100 mL (1 mL = 1 cm3 = 1000 mm3, SI)', () => {
      const volume = pourVolume({ shape: pond, depthMm: 5 });
      expect(volume.grossVolumeMl).toBe(100);
      expect(volume.netVolumeMl).toBe(100);
      expect(volume.totalToMixMl).toBe(100);
      expect(volume.warnings).toEqual([]);
    });

    it('should take off what rocks displace and add the waste allowance', () => {
      const volume = pourVolume({ shape: pond, depthMm: 5, displacedMl: 20, wastePercent: 10 });
      expect(volume.netVolumeMl).toBe(80);
      expect(volume.totalToMixMl).toBeCloseTo(88, 12);
    });

    it('should never go below 0 and warn when rocks displace more than the pour', () => {
      const volume = pourVolume({ shape: pond, depthMm: 1, displacedMl: 50 });
      expect(volume.netVolumeMl).toBe(0);
      expect(volume.totalToMixMl).toBe(0);
      expect(volume.warnings.map((warning) => warning.code)).toEqual(['displacement-exceeds-volume']);
    });

    it('should refuse negative depth, displacement or waste', () => {
      expect(() => pourVolume({ shape: pond, depthMm: -1 })).toThrowError(RangeError);
      expect(() => pourVolume({ shape: pond, depthMm: 1, displacedMl: -1 })).toThrowError(RangeError);
      expect(() => pourVolume({ shape: pond, depthMm: 1, wastePercent: Number.NaN })).toThrowError(RangeError);
    });

    const size = fc.double({ min: 1, max: 2000, noNaN: true });
    const depth = fc.double({ min: 0.1, max: 100, noNaN: true });
    const extra = fc.double({ min: 0.001, max: 100, noNaN: true });

    it('should grow with depth (property)', () => {
      fc.assert(
        fc.property(size, size, depth, extra, (lengthMm, widthMm, depthMm, more) => {
          const shape: PourShape = { kind: 'rectangle', lengthMm, widthMm };
          const shallow = pourVolume({ shape, depthMm, displacedMl: 0, wastePercent: 5 });
          const deep = pourVolume({ shape, depthMm: depthMm + more, displacedMl: 0, wastePercent: 5 });
          expect(deep.totalToMixMl).toBeGreaterThan(shallow.totalToMixMl);
        }),
      );
    });

    it('should grow with area (property)', () => {
      fc.assert(
        fc.property(size, depth, extra, (diameterMm, depthMm, more) => {
          const small = pourVolume({ shape: { kind: 'circle', diameterMm }, depthMm });
          const large = pourVolume({ shape: { kind: 'circle', diameterMm: diameterMm + more }, depthMm });
          expect(large.netVolumeMl).toBeGreaterThan(small.netVolumeMl);
        }),
      );
    });

    it('should never give a negative amount to mix, whatever is displaced (property)', () => {
      fc.assert(
        fc.property(size, depth, fc.double({ min: 0, max: 1e6, noNaN: true }), (areaMm2, depthMm, displacedMl) => {
          const volume = pourVolume({ shape: { kind: 'area', areaMm2 }, depthMm, displacedMl, wastePercent: 15 });
          expect(volume.totalToMixMl).toBeGreaterThanOrEqual(0);
          expect(volume.netVolumeMl).toBeLessThanOrEqual(volume.grossVolumeMl);
        }),
      );
    });
  });
});
