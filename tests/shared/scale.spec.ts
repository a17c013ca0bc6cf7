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

    it('should scale standard-gauge track (UIC 1435 mm) to 1435 / N, worked by hand, beside the nominal gauge the standards give', () => {
      // [scale, 1435 / N by hand, the nominal gauge of NEM 010 / NMRA S-1.2]
      const worked: [string, number, number][] = [
        ['z', 6.523, 6.5],
        ['n', 8.969, 9],
        ['tt', 11.958, 12],
        ['ho', 16.475, 16.5],
        ['h0', 16.494, 16.5],
        ['s', 22.422, 22.43],
        ['0', 31.889, 32],
        ['1', 44.844, 45],
        ['ii', 63.778, 64],
      ];
      for (const [id, trueGauge, nominal] of worked) {
        expect(gaugeAtScaleMm(prototypeGauge('standard'), scale(id).ratio))
          .withContext(id)
          .toBeCloseTo(trueGauge, 3);
        expect(scale(id).gaugeMm).withContext(id).toBe(nominal);
      }
    });

    it('should mark OO as under gauge: 16.5 mm track under 1:76.2 bodies (common practice, British)', () => {
      expect(scale('oo').source).toContain('common practice');
      // worked by hand: 1435 / 76.2 = 18.83 mm would be true to scale
      expect(gaugeAtScaleMm(1435, 76.2)).toBeCloseTo(18.832, 3);
      expect(scale('oo').gaugeMm).toBe(16.5);
    });

    it('should mark military and figure scales 1:6 to 1:72 as common practice', () => {
      const figures = STANDARD_SCALES.filter((entry) => entry.family === 'military-figure');
      expect(figures.map((entry) => entry.ratio).sort((a, b) => a - b)).toEqual([6, 16, 24, 32, 35, 48, 72]);
      expect(figures.every((entry) => entry.source === 'common practice')).toBeTrue();
    });

    it('should give every entry a unique id and name one of the sources these specs check it against', () => {
      expect(new Set(STANDARD_SCALES.map((entry) => entry.id)).size).toBe(STANDARD_SCALES.length);
      const sources = ['NEM 010', 'NMRA S-1.2', 'NEM 010; NMRA S-1.2', 'common practice', 'common practice (British)'];
      for (const entry of STANDARD_SCALES) {
        expect(sources).withContext(entry.id).toContain(entry.source);
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
    it('should scale 40 m of riverbank to 833 mm at 1:48, 459 mm at 1:87.1, 250 mm at 1:160 (worked by hand: model = real / N, e.g. 40 000 / 48 = 833.3)', () => {
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
      // worked by hand: (87.1 / 48)^3 = 5.9749
      expect(comparison.volumeFactor).toBeCloseTo(5.9749, 4);
    });

    it('should say 1:35 against 1:72 is about twice as long and over eight times the resin', () => {
      const comparison = compareScales(35, 72);
      expect(comparison.lengthFactor).toBeCloseTo(72 / 35, 12);
      // worked by hand: (72 / 35)^3 = 8.7055
      expect(comparison.volumeFactor).toBeCloseTo(8.7055, 4);
    });

    it('should give the volume factor of a real box built at both scales (property)', () => {
      const ratio = fc.double({ min: 1, max: 500, noNaN: true });
      const side = fc.double({ min: 100, max: 1e5, noNaN: true });
      fc.assert(
        fc.property(ratio, ratio, side, side, side, (a, b, x, y, z) => {
          const { volumeFactor } = compareScales(a, b);
          // a box x by y by z in the real world, as a model at each scale: (x/a)(y/a)(z/a) against (x/b)(y/b)(z/b)
          const modelA = (x / a) * (y / a) * (z / a);
          const modelB = (x / b) * (y / b) * (z / b);
          expect(volumeFactor / (modelA / modelB)).toBeCloseTo(1, 9);
          const { lengthFactor } = compareScales(a, b);
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
