import fc from 'fast-check';
import {
  correctForTemperature,
  cureTimeline,
  HOT_ROOM_TEMP_C,
  temperatureCorrection,
  type CureDataSheet,
} from '../../shared/index.js';

const MINUTE = 60_000;

// Invented data sheet for tests only; not any maker's figures.
const sheet: CureDataSheet = {
  potLifeMin: 40,
  recoatMin: 360,
  recoatMaxMin: 1440,
  demouldMin: 1440,
  fullCureMin: 10_080,
  referenceTempC: 25,
  minCureTempC: 15,
  maxLayerMm: 6,
};

describe('cure', () => {
  describe('correctForTemperature (10-degree rule: rule of thumb, common practice; Arrhenius / van t Hoff)', () => {
    it('should keep the data-sheet time at the reference temperature', () => {
      expect(correctForTemperature(360, 25, 25)).toBe(360);
    });

    it('should halve the time 10 degrees C warmer and double it 10 degrees C colder', () => {
      expect(correctForTemperature(360, 25, 35)).toBe(180);
      expect(correctForTemperature(360, 25, 15)).toBe(720);
    });

    it('should stretch by the square root of 2 five degrees colder (2^(5/10))', () => {
      expect(correctForTemperature(100, 25, 20)).toBeCloseTo(100 * Math.SQRT2, 12);
    });

    it('should halve the corrected time for each 10 degrees C rise (property)', () => {
      fc.assert(
        fc.property(
          fc.double({ min: 1, max: 100_000, noNaN: true }),
          fc.double({ min: 0, max: 40, noNaN: true }),
          fc.double({ min: -10, max: 50, noNaN: true }),
          (minutes, refTempC, roomTempC) => {
            const colder = correctForTemperature(minutes, refTempC, roomTempC);
            const warmer = correctForTemperature(minutes, refTempC, roomTempC + 10);
            expect(warmer / colder).toBeCloseTo(0.5, 12);
          },
        ),
      );
    });
  });

  describe('temperatureCorrection', () => {
    it('should work at the minimum cure temperature, flagged unreliable, when the room is colder', () => {
      const correction = temperatureCorrection(sheet, 10);
      expect(correction.effectiveTempC).toBe(15);
      expect(correction.factor).toBe(2);
      expect(correction.reliable).toBeFalse();
      expect(correction.warnings.map((warning) => warning.code)).toEqual(['below-minimum-temperature']);
    });

    it('should warn of a hot room above 30 degrees C (common practice) and still shorten the times', () => {
      const correction = temperatureCorrection(sheet, 35);
      expect(HOT_ROOM_TEMP_C).toBe(30);
      expect(correction.factor).toBe(0.5);
      expect(correction.reliable).toBeTrue();
      expect(correction.warnings.map((warning) => warning.code)).toEqual(['hot-room']);
    });

    it('should give no warning in an ordinary room', () => {
      expect(temperatureCorrection(sheet, 21).warnings).toEqual([]);
    });
  });

  describe('cureTimeline', () => {
    const startAtMs = Date.UTC(2025, 0, 10, 9, 0);

    it('should say it is an estimate', () => {
      expect(cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs, layerCount: 1 }).isEstimate).toBeTrue();
    });

    it('should pour each layer at the earliest recoat time of the one before, at the reference temperature', () => {
      const timeline = cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs, layerCount: 3 });
      expect(timeline.layers.map((layer) => (layer.pourAtMs - startAtMs) / MINUTE)).toEqual([0, 360, 720]);
      expect(timeline.layers[0]).toEqual({
        layer: 1,
        pourAtMs: startAtMs,
        potLifeEndsAtMs: startAtMs + 40 * MINUTE,
        recoatFromMs: startAtMs + 360 * MINUTE,
        recoatUntilMs: startAtMs + 1440 * MINUTE,
      });
      expect(timeline.demouldAtMs).toBe(startAtMs + (720 + 1440) * MINUTE);
      expect(timeline.fullCureAtMs).toBe(startAtMs + (720 + 10_080) * MINUTE);
    });

    it('should halve every time in a room 10 degrees C warmer', () => {
      const timeline = cureTimeline({ dataSheet: sheet, roomTempC: 35, startAtMs, layerCount: 2 });
      expect(timeline.times).toEqual({
        potLifeMin: 20,
        recoatMin: 180,
        recoatMaxMin: 720,
        demouldMin: 720,
        fullCureMin: 5040,
      });
      expect(timeline.layers[1]?.pourAtMs).toBe(startAtMs + 180 * MINUTE);
    });

    it('should leave out the end of the recoat window when the data sheet gives none', () => {
      const withoutWindow: CureDataSheet = { ...sheet, recoatMaxMin: undefined };
      const timeline = cureTimeline({ dataSheet: withoutWindow, roomTempC: 25, startAtMs, layerCount: 1 });
      expect(timeline.layers[0]?.recoatUntilMs).toBeUndefined();
      expect(timeline.times.recoatMaxMin).toBeUndefined();
    });

    it('should warn when a layer is thicker than the data sheet allows, but not at exactly the maximum', () => {
      const thick = cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs, layerCount: 1, layerDepthMm: 8 });
      expect(thick.warnings.map((warning) => warning.code)).toEqual(['layer-too-thick']);
      const atMax = cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs, layerCount: 3, layerDepthMm: 18 / 3 });
      expect(atMax.warnings).toEqual([]);
    });

    it('should carry the cold-room warning and unreliable flag into the timeline', () => {
      const timeline = cureTimeline({ dataSheet: sheet, roomTempC: 5, startAtMs, layerCount: 1 });
      expect(timeline.reliable).toBeFalse();
      expect(timeline.warnings.map((warning) => warning.code)).toEqual(['below-minimum-temperature']);
    });

    it('should refuse a layer count below 1 and a room temperature that is not a number', () => {
      expect(() => cureTimeline({ dataSheet: sheet, roomTempC: Number.NaN, startAtMs, layerCount: 1 })).toThrowError(
        RangeError,
      );
      expect(() => cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs, layerCount: 0 })).toThrowError(
        RangeError,
      );
    });

    it('should keep every layer in order, inside pot life before recoat, ending with full cure (property)', () => {
      fc.assert(
        fc.property(
          fc.integer({ min: 1, max: 10 }),
          fc.double({ min: -5, max: 45, noNaN: true }),
          (layerCount, roomTempC) => {
            const timeline = cureTimeline({ dataSheet: sheet, roomTempC, startAtMs, layerCount });
            expect(timeline.layers.length).toBe(layerCount);
            timeline.layers.forEach((layer, index) => {
              expect(layer.potLifeEndsAtMs).toBeLessThanOrEqual(layer.recoatFromMs);
              const next = timeline.layers[index + 1];
              if (next) {
                expect(next.pourAtMs).toBe(layer.recoatFromMs);
              }
            });
            expect(timeline.fullCureAtMs).toBeGreaterThanOrEqual(timeline.demouldAtMs);
          },
        ),
      );
    });
  });
});
