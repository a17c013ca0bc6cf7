import fc from 'fast-check';
import { isSinglePart, mixAmounts, mixedDensityGPerMl, type MixRatio } from '../../shared/index.js';

// Worked by hand from the SI definition of density (rho = m / V) and ideal mixing (the parts' volumes add: 1/rho = wA/rhoA + wB/rhoB), common practice.
describe('mix', () => {
  describe('mixedDensityGPerMl', () => {
    it('should weight densities by volume fractions for a volume ratio: 1:1 of 1.1 and 0.9 g/mL is 1.0 g/mL', () => {
      expect(mixedDensityGPerMl({ basis: 'volume', partA: 1, partB: 1 }, 1.1, 0.9)).toBeCloseTo(1, 12);
    });

    it('should take total mass over total volume for a weight ratio: 1:1 of 1.1 and 0.9 g/mL is 0.99 g/mL', () => {
      // 1 g of mix is 0.5/1.1 + 0.5/0.9 = 1/0.99 mL.
      expect(mixedDensityGPerMl({ basis: 'weight', partA: 1, partB: 1 }, 1.1, 0.9)).toBeCloseTo(0.99, 12);
    });

    it('should be part A density for a single-part medium', () => {
      expect(mixedDensityGPerMl({ basis: 'volume', partA: 1 }, 1.05)).toBe(1.05);
      expect(isSinglePart({ basis: 'weight', partA: 1, partB: 0 })).toBeTrue();
    });

    it('should refuse a missing or zero part B density for a two-part ratio', () => {
      expect(() => mixedDensityGPerMl({ basis: 'weight', partA: 2, partB: 1 }, 1.1)).toThrowError(RangeError);
      expect(() => mixedDensityGPerMl({ basis: 'weight', partA: 2, partB: 1 }, 1.1, 0)).toThrowError(RangeError);
      expect(() => mixedDensityGPerMl({ basis: 'weight', partA: 0, partB: 1 }, 1.1, 1)).toThrowError(RangeError);
    });
  });

  describe('mixAmounts', () => {
    it('should split 100 mL of a 1:1 weight ratio into 49.5 g + 49.5 g, i.e. 45 mL + 55 mL (rho = m / V)', () => {
      const mix = mixAmounts({
        volumeMl: 100,
        ratio: { basis: 'weight', partA: 1, partB: 1 },
        densityAGPerMl: 1.1,
        densityBGPerMl: 0.9,
        scaleResolutionG: 0.1,
      });
      expect(mix.exactTotal.totalG).toBeCloseTo(99, 12);
      expect(mix.exactTotal.partAG).toBeCloseTo(49.5, 12);
      expect(mix.exactTotal.partAMl).toBeCloseTo(45, 12);
      expect(mix.exactTotal.partBMl).toBeCloseTo(55, 12);
      expect(mix.perLayer).toEqual({ partAG: 49.5, partBG: 49.5, totalG: 99, partAMl: 45, partBMl: 55, totalMl: 100 });
      expect(mix.warnings).toEqual([]);
    });

    it('should split 90 mL of a 2:1 volume ratio into 60 mL = 69 g and 30 mL = 28.5 g (rho = m / V)', () => {
      const mix = mixAmounts({
        volumeMl: 90,
        ratio: { basis: 'volume', partA: 2, partB: 1 },
        densityAGPerMl: 1.15,
        densityBGPerMl: 0.95,
        scaleResolutionG: 0.1,
      });
      expect(mix.perLayer).toEqual({ partAMl: 60, partBMl: 30, totalMl: 90, partAG: 69, partBG: 28.5, totalG: 97.5 });
    });

    it('should round grams to the scale and mL to the cup, per layer, and multiply up for the total', () => {
      const mix = mixAmounts({
        volumeMl: 90,
        ratio: { basis: 'volume', partA: 2, partB: 1 },
        densityAGPerMl: 1.15,
        densityBGPerMl: 0.95,
        layerCount: 3,
        scaleResolutionG: 1,
      });
      expect(mix.perLayer).toEqual({ partAMl: 20, partBMl: 10, totalMl: 30, partAG: 23, partBG: 10, totalG: 33 });
      expect(mix.total).toEqual({ partAMl: 60, partBMl: 30, totalMl: 90, partAG: 69, partBG: 30, totalG: 99 });
    });

    it('should give a single-part medium no part B', () => {
      const mix = mixAmounts({
        volumeMl: 40,
        ratio: { basis: 'volume', partA: 1 },
        densityAGPerMl: 1.05,
        scaleResolutionG: 0.1,
      });
      expect(mix.singlePart).toBeTrue();
      expect(mix.perLayer).toEqual({ partAMl: 40, partBMl: 0, totalMl: 40, partAG: 42, partBG: 0, totalG: 42 });
      expect(mix.ratioShiftPercent).toBe(0);
    });

    it('should warn that a batch is too small when the smaller part is under 20 scale steps (common practice: one step over 5%)', () => {
      const ratio: MixRatio = { basis: 'weight', partA: 1, partB: 1 };
      const small = mixAmounts({ volumeMl: 30, ratio, densityAGPerMl: 1, densityBGPerMl: 1, scaleResolutionG: 1 });
      expect(small.warnings.map((warning) => warning.code)).toContain('batch-too-small');
      const fine = mixAmounts({ volumeMl: 30, ratio, densityAGPerMl: 1, densityBGPerMl: 1, scaleResolutionG: 0.1 });
      expect(fine.warnings).toEqual([]);
    });

    it('should judge a volume ratio by the scale too, since every part is shown in grams (common practice: weighing beats cup marks)', () => {
      const ratio: MixRatio = { basis: 'volume', partA: 2, partB: 1 };
      // 12 mL of part B is 12 cup marks but 116 steps of a 0.1 g scale: weighable.
      const weighable = mixAmounts({
        volumeMl: 36,
        ratio,
        densityAGPerMl: 1.1,
        densityBGPerMl: 0.97,
        scaleResolutionG: 0.1,
      });
      expect(weighable.warnings).toEqual([]);
      const coarse = mixAmounts({
        volumeMl: 36,
        ratio,
        densityAGPerMl: 1.1,
        densityBGPerMl: 0.97,
        scaleResolutionG: 1,
      });
      expect(coarse.warnings.map((warning) => warning.code)).toContain('batch-too-small');
    });

    it('should warn when rounding moves the ratio more than 2 %: 100:30 of 3 g on a 1 g scale weighs 2 g + 1 g', () => {
      const mix = mixAmounts({
        volumeMl: 3,
        ratio: { basis: 'weight', partA: 100, partB: 30 },
        densityAGPerMl: 1,
        densityBGPerMl: 1,
        scaleResolutionG: 1,
      });
      expect(mix.perLayer.partAG).toBe(2);
      expect(mix.perLayer.partBG).toBe(1);
      expect(mix.ratioShiftPercent).toBeGreaterThan(60);
      // and on the default 1 mL cup 2 mL + 1 mL, as far off
      expect(mix.warnings.map((warning) => warning.code)).toEqual([
        'batch-too-small',
        'ratio-shifted',
        'ratio-shifted-by-volume',
      ]);
    });

    describe('judged on the millilitres shown as well as the grams', () => {
      // Hand-worked: 10 mL at 2:1 by volume is 6.67 mL + 3.33 mL; on a 1 mL cup that shows 7 + 3,
      // and 3/7 against 1/2 is (3/7) / (1/2) - 1 = -14.3 %. On a 0.1 mL cup: 6.7 + 3.3,
      // (3.3/6.7) / (1/2) - 1 = -1.5 %, inside the 2 % allowed without a data-sheet tolerance (common practice).
      const batch = { volumeMl: 10, ratio: { basis: 'volume', partA: 2, partB: 1 } as MixRatio };
      const resin = { densityAGPerMl: 1.1, densityBGPerMl: 0.97, scaleResolutionG: 0.1 };

      it('should warn that a small batch on a 1 mL cup is 14 % off, and advise weighing, a finer cup or more', () => {
        const mix = mixAmounts({ ...batch, ...resin, cupResolutionMl: 1 });
        expect(mix.perLayer.partAMl).toBe(7);
        expect(mix.perLayer.partBMl).toBe(3);
        expect(mix.volumeRatioShiftPercent).toBeCloseTo(14.29, 2);
        const warning = mix.warnings.find((entry) => entry.code === 'ratio-shifted-by-volume');
        expect(warning?.message).toContain('14 % off the ratio');
        expect(warning?.message).toContain('allows 2 %');
        expect(warning?.message).toMatch(/Weigh the parts.*finer marks.*larger batch/);
        // 7.3 g + 3.2 g on a 0.1 g scale is 0.6 % off by weight: weighing is the way out, so no weight warning
        expect(mix.warnings.map((entry) => entry.code)).not.toContain('ratio-shifted');
      });

      it('should not warn on a 0.1 mL cup, 1.5 % off', () => {
        const mix = mixAmounts({ ...batch, ...resin, cupResolutionMl: 0.1 });
        expect(mix.perLayer.partAMl).toBeCloseTo(6.7, 9);
        expect(mix.perLayer.partBMl).toBeCloseTo(3.3, 9);
        expect(mix.volumeRatioShiftPercent).toBeCloseTo(1.49, 2);
        expect(mix.warnings).toEqual([]);
      });

      it("should allow what the data sheet's own tolerance allows", () => {
        const lenient = mixAmounts({ ...batch, ...resin, cupResolutionMl: 1, tolerancePercent: 15 });
        expect(lenient.tolerancePercent).toBe(15);
        expect(lenient.warnings).toEqual([]);
        const strict = mixAmounts({ ...batch, ...resin, cupResolutionMl: 0.1, tolerancePercent: 1 });
        expect(strict.warnings.map((entry) => entry.code)).toEqual(['ratio-shifted-by-volume']);
      });

      it('should warn on grams at 2 % with no tolerance: 3.3 g at 100:30 on a 0.1 g scale is 2.5 g + 0.8 g', () => {
        // Hand-worked: exact 2.538 g + 0.762 g; shown 2.5 g + 0.8 g, (0.8/2.5) / 0.3 - 1 = +6.7 %.
        const mix = mixAmounts({
          volumeMl: 3.3,
          ratio: { basis: 'weight', partA: 100, partB: 30 },
          densityAGPerMl: 1,
          densityBGPerMl: 1,
          scaleResolutionG: 0.1,
          cupResolutionMl: 0.1,
        });
        expect(mix.perLayer.partAG).toBeCloseTo(2.5, 9);
        expect(mix.perLayer.partBG).toBeCloseTo(0.8, 9);
        expect(mix.ratioShiftPercent).toBeCloseTo(6.67, 2);
        expect(mix.warnings.find((entry) => entry.code === 'ratio-shifted')?.message).toContain('6.7 % off the ratio');
      });

      it('should refuse a tolerance that is not a number above 0', () => {
        expect(() => mixAmounts({ ...batch, ...resin, tolerancePercent: Number.NaN })).toThrowError(
          RangeError,
          /Ratio tolerance/,
        );
      });
    });

    it('should give nothing to mix, and no warnings, for 0 mL', () => {
      const mix = mixAmounts({
        volumeMl: 0,
        ratio: { basis: 'weight', partA: 2, partB: 1 },
        densityAGPerMl: 1.1,
        densityBGPerMl: 1,
        scaleResolutionG: 1,
      });
      expect(mix.total.totalG).toBe(0);
      expect(mix.warnings).toEqual([]);
    });

    const ratioArb = fc.record({
      basis: fc.constantFrom<'volume' | 'weight'>('volume', 'weight'),
      partA: fc.double({ min: 0.1, max: 100, noNaN: true }),
      partB: fc.double({ min: 0.1, max: 100, noNaN: true }),
    });
    const density = fc.double({ min: 0.7, max: 2, noNaN: true });
    const volume = fc.double({ min: 0.1, max: 5000, noNaN: true });

    // Together these fix the answer from physics alone: the parts' volumes add up to the pour, each part's
    // mass is its density times its volume (SI definition of density), and the parts keep the ratio.
    it('should give parts that add up to the volume, weigh density times volume and keep the ratio (property)', () => {
      fc.assert(
        fc.property(volume, ratioArb, density, density, (volumeMl, ratio, densityAGPerMl, densityBGPerMl) => {
          const mix = mixAmounts({ volumeMl, ratio, densityAGPerMl, densityBGPerMl, scaleResolutionG: 0.1 });
          const exact = mix.exactTotal;
          expect(exact.partAMl + exact.partBMl).toBeCloseTo(volumeMl, 8);
          expect(exact.partAG).toBeCloseTo(exact.partAMl * densityAGPerMl, 8);
          expect(exact.partBG).toBeCloseTo(exact.partBMl * densityBGPerMl, 8);
          const [a, b] = ratio.basis === 'weight' ? [exact.partAG, exact.partBG] : [exact.partAMl, exact.partBMl];
          expect(a / (a + b)).toBeCloseTo(ratio.partA / (ratio.partA + ratio.partB), 9);
        }),
      );
    });

    it('should round every weighed amount to the scale resolution and add the rounded parts up (property)', () => {
      fc.assert(
        fc.property(
          volume,
          ratioArb,
          density,
          density,
          fc.integer({ min: 1, max: 12 }),
          fc.constantFrom(0.01, 0.1, 0.5, 1),
          (volumeMl, ratio, densityAGPerMl, densityBGPerMl, layerCount, scaleResolutionG) => {
            const mix = mixAmounts({ volumeMl, ratio, densityAGPerMl, densityBGPerMl, layerCount, scaleResolutionG });
            for (const grams of [mix.perLayer.partAG, mix.perLayer.partBG, mix.total.totalG]) {
              const steps = grams / scaleResolutionG;
              expect(Math.abs(steps - Math.round(steps))).toBeLessThan(1e-6);
            }
            expect(mix.perLayer.totalG).toBeCloseTo(mix.perLayer.partAG + mix.perLayer.partBG, 9);
            expect(mix.total.totalG).toBeCloseTo(mix.perLayer.totalG * layerCount, 6);
            expect(Math.abs(mix.total.totalG - mix.exactTotal.totalG)).toBeLessThanOrEqual(
              layerCount * scaleResolutionG + 1e-6,
            );
          },
        ),
      );
    });
  });
});
