import fc from 'fast-check';
import {
  baseForFootprint,
  compareScales,
  customScale,
  figureHeightAtScaleMm,
  findScale,
  gaugeAtScaleMm,
  modelToRealMm,
  PROTOTYPE_GAUGES,
  realToModelMm,
  STANDARD_SCALES,
  toMm,
} from '../../shared/index.js';

function scale(id: string) {
  const found = findScale(id);
  if (!found) {
    throw new Error(`No scale ${id}`);
  }
  return found;
}

function prototypeGauge(id: string): number {
  const found = PROTOTYPE_GAUGES.find((gauge) => gauge.id === id);
  if (!found) {
    throw new Error(`No prototype gauge ${id}`);
  }
  return found.gaugeMm;
}

describe('scale', () => {
  describe('standard scales table', () => {
    it('should hold the NMRA S-1.2 ratios and gauges: N 1:160 9 mm, HO 1:87.1 16.5 mm, S 1:64 22.43 mm, O 1:48 1.25 in', () => {
      expect(scale('n')).toEqual(jasmine.objectContaining({ ratio: 160, gaugeMm: 9 }));
      expect(scale('ho')).toEqual(jasmine.objectContaining({ ratio: 87.1, gaugeMm: 16.5 }));
      expect(scale('s')).toEqual(jasmine.objectContaining({ ratio: 64, gaugeMm: 22.43 }));
      expect(scale('o-na').ratio).toBe(48);
      expect(scale('o-na').gaugeMm).toBe(toMm(1.25, 'in'));
    });

    it('should hold the NEM 010 ratios and gauges: Z 1:220 6.5, N 1:160 9, TT 1:120 12, H0 1:87 16.5, 0 1:45 32, 1 1:32 45 mm', () => {
      const nem: [string, number, number][] = [
        ['z', 220, 6.5],
        ['n', 160, 9],
        ['tt', 120, 12],
        ['h0', 87, 16.5],
        ['0', 45, 32],
        ['1', 32, 45],
        ['ii', 22.5, 64],
      ];
      for (const [id, ratio, gaugeMm] of nem) {
        expect(scale(id)).withContext(id).toEqual(jasmine.objectContaining({ ratio, gaugeMm }));
      }
    });

    it('should put HO at NMRA 3.5 mm to the foot, which is 1:87.1 to one decimal (NMRA HO definition, from memory)', () => {
      expect(Math.round((toMm(1, 'ft') / 3.5) * 10) / 10).toBe(scale('ho').ratio);
    });

    it('should give standard-gauge track within 0.5% of 1435 mm / N for every scale the standards tie to 1435 mm (UIC, NEM 010, NMRA S-1.2)', () => {
      for (const id of ['z', 'n', 'tt', 'ho', 'h0', 's', '0', '1', 'ii']) {
        const entry = scale(id);
        const exact = gaugeAtScaleMm(prototypeGauge('standard'), entry.ratio);
        expect(Math.abs((entry.gaugeMm ?? 0) / exact - 1))
          .withContext(id)
          .toBeLessThan(0.005);
      }
    });

    it('should mark OO as under gauge: 16.5 mm track under 1:76.2 bodies (common practice, British)', () => {
      expect(scale('oo').source).toContain('common practice');
      expect(gaugeAtScaleMm(1435, 76.2)).toBeGreaterThan(18.8);
      expect(scale('oo').gaugeMm).toBe(16.5);
    });

    it('should mark military and figure scales 1:6 to 1:72 as common practice', () => {
      const figures = STANDARD_SCALES.filter((entry) => entry.family === 'military-figure');
      expect(figures.map((entry) => entry.ratio).sort((a, b) => a - b)).toEqual([6, 16, 24, 32, 35, 48, 72]);
      expect(figures.every((entry) => entry.source === 'common practice')).toBeTrue();
    });

    it('should give every entry a unique id, a valid ratio and a source', () => {
      expect(new Set(STANDARD_SCALES.map((entry) => entry.id)).size).toBe(STANDARD_SCALES.length);
      for (const entry of STANDARD_SCALES) {
        expect(entry.ratio).toBeGreaterThan(0);
        expect(entry.source.length).toBeGreaterThan(0);
      }
    });
  });

  describe('prototype gauges', () => {
    it('should hold standard gauge as 4 ft 8.5 in, 1435 mm to the mm (UIC; NIST Handbook 44 1 in = 25.4 mm)', () => {
      expect(toMm(56.5, 'in')).toBeCloseTo(1435.1, 9);
      expect(Math.round(toMm(56.5, 'in'))).toBe(prototypeGauge('standard'));
    });

    it('should hold the feet-and-inches gauges by NIST factors: 3 ft 914.4, 2 ft 609.6, 3 ft 6 in 1067, 5 ft 6 in 1676 (NIST Handbook 44)', () => {
      expect(prototypeGauge('3ft')).toBeCloseTo(toMm(3, 'ft'), 9);
      expect(prototypeGauge('2ft')).toBeCloseTo(toMm(2, 'ft'), 9);
      expect(prototypeGauge('cape')).toBe(Math.round(toMm(3.5, 'ft')));
      expect(prototypeGauge('indian')).toBe(Math.round(toMm(5.5, 'ft')));
    });
  });

  describe('conversions', () => {
    it('should reproduce the design example: 40 m of riverbank is 833 mm at 1:48, 459 mm at 1:87.1, 250 mm at 1:160 (design.md; model = real / N)', () => {
      const bases = baseForFootprint({ realWidthMm: 40_000, realDepthMm: 8_000 }, [48, 87.1, 160]);
      expect(bases.map((base) => Math.round(base.widthMm))).toEqual([833, 459, 250]);
      expect(bases.map((base) => base.ratio)).toEqual([48, 87.1, 160]);
      expect(bases[2]?.depthMm).toBe(50);
    });

    it('should scale a 1.8 m figure to 25 mm at 1:72 and 51.4 mm at 1:35 (model = real / N)', () => {
      expect(figureHeightAtScaleMm(1800, 35)).toBeCloseTo(51.43, 2);
      expect(figureHeightAtScaleMm(1800, 72)).toBe(25);
    });

    it('should go there and back (property)', () => {
      fc.assert(
        fc.property(
          fc.double({ min: 0, max: 1e7, noNaN: true }),
          fc.double({ min: 1, max: 1000, noNaN: true }),
          (realMm, ratio) => {
            expect(modelToRealMm(realToModelMm(realMm, ratio), ratio)).toBeCloseTo(realMm, 6);
          },
        ),
      );
    });
  });

  describe('compareScales', () => {
    it('should say 1:48 is 87.1/48 = 1.81 times longer than 1:87.1 and 5.98 times the volume (volume is length cubed)', () => {
      const comparison = compareScales(48, 87.1);
      expect(comparison.lengthFactor).toBeCloseTo(1.8146, 4);
      expect(comparison.volumeFactor).toBeCloseTo(1.8146 ** 3, 2);
    });

    it('should say 1:35 against 1:72 is about twice as long and over eight times the resin', () => {
      const comparison = compareScales(35, 72);
      expect(comparison.lengthFactor).toBeCloseTo(72 / 35, 12);
      expect(comparison.volumeFactor).toBeGreaterThan(8);
    });

    it('should always give the volume factor as the cube of the length factor (property)', () => {
      const ratio = fc.double({ min: 1, max: 500, noNaN: true });
      fc.assert(
        fc.property(ratio, ratio, (a, b) => {
          const { lengthFactor, volumeFactor } = compareScales(a, b);
          expect(volumeFactor).toBeCloseTo(lengthFactor ** 3, 9);
          expect(compareScales(b, a).lengthFactor * lengthFactor).toBeCloseTo(1, 12);
        }),
      );
    });
  });

  describe('customScale', () => {
    it('should accept any finite ratio above 0', () => {
      expect(customScale(100)).toEqual(jasmine.objectContaining({ ratio: 100, name: '1:100', family: 'custom' }));
    });

    it('should refuse 0, negative, NaN and Infinity', () => {
      for (const ratio of [0, -87, Number.NaN, Number.POSITIVE_INFINITY]) {
        expect(() => customScale(ratio))
          .withContext(String(ratio))
          .toThrowError(RangeError);
        expect(() => realToModelMm(1000, ratio)).toThrowError(RangeError);
      }
    });
  });
});
