import {
  correctedTimes,
  correctForTemperature,
  cureTimeline,
  fromCelsius,
  fromMl,
  layerTimesAt,
  massToVolumeMl,
  pourVolume,
  realToModelMm,
  shapeAreaMm2,
  toCelsius,
  toG,
  toMm,
  type CureDataSheet,
  type LengthUnit,
  type MassUnit,
  type PourShape,
  type TemperatureUnit,
  type VolumeUnit,
} from '../../shared/index.js';

// The schemas are the first line; these are the second: every exported function checks what it is given
// and refuses it in plain words rather than give a positive volume for a negative side, or NaN.

// Invented data sheet for tests only.
const sheet: CureDataSheet = {
  potLifeMin: 30,
  recoatMin: 240,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 10,
};

describe('refusals in the shared maths', () => {
  it('should refuse negative sides, diameters and areas instead of giving a positive area', () => {
    const shapes: [PourShape, RegExp][] = [
      [{ kind: 'rectangle', lengthMm: -100, widthMm: -50 }, /Length must be a finite number of 0 or more, got -100/],
      [{ kind: 'rectangle', lengthMm: 100, widthMm: Number.NaN }, /Width must be/],
      [{ kind: 'circle', diameterMm: -80 }, /Diameter must be a finite number of 0 or more, got -80/],
      [{ kind: 'ellipse', lengthMm: -4, widthMm: -2 }, /Length must be/],
      [{ kind: 'area', areaMm2: Number.POSITIVE_INFINITY }, /Area must be/],
      [
        {
          kind: 'polygon',
          points: [
            { xMm: 0, yMm: 0 },
            { xMm: Number.NaN, yMm: 1 },
            { xMm: 1, yMm: 1 },
          ],
        },
        /finite x and y/,
      ],
    ];
    for (const [shape, message] of shapes) {
      expect(() => shapeAreaMm2(shape)).toThrowError(RangeError, message);
      expect(() => pourVolume({ shape, depthMm: 5 })).toThrowError(RangeError, message);
    }
    expect(() => shapeAreaMm2({ kind: 'hexagon' } as unknown as PourShape)).toThrowError(RangeError, /Unknown shape/);
  });

  it('should refuse NaN, infinite and negative times and temperatures in the cure correction', () => {
    expect(() => correctForTemperature(Number.NaN, 20, 25)).toThrowError(RangeError, /data-sheet time/);
    expect(() => correctForTemperature(-60, 20, 25)).toThrowError(RangeError, /0 minutes or more, got -60/);
    expect(() => correctForTemperature(60, 20, Number.NaN)).toThrowError(RangeError, /Room temperature/);
    expect(() => correctForTemperature(60, Number.POSITIVE_INFINITY, 20)).toThrowError(RangeError, /temperature/);
    expect(() => correctedTimes({ ...sheet, recoatMin: Number.NaN }, 1)).toThrowError(RangeError, /Recoat time/);
    expect(() => correctedTimes(sheet, 0)).toThrowError(RangeError, /factor/);
    expect(() => layerTimesAt(1, Number.NaN, correctedTimes(sheet, 1))).toThrowError(RangeError, /epoch/);
    expect(() => layerTimesAt(0, 0, correctedTimes(sheet, 1))).toThrowError(RangeError, /numbered from 1/);
    expect(() =>
      cureTimeline({ dataSheet: { ...sheet, fullCureMin: -1 }, roomTempC: 20, startAtMs: 0, layerCount: 1 }),
    ).toThrowError(RangeError, /Full cure/);
  });

  it('should refuse a unit it does not know instead of giving NaN', () => {
    expect(() => toMm(1, 'furlong' as LengthUnit)).toThrowError(
      RangeError,
      'Unknown length unit "furlong"; use one of mm, cm, m, in, ft',
    );
    expect(() => fromMl(1, 'gallon' as VolumeUnit)).toThrowError(RangeError, /Unknown volume unit "gallon"/);
    expect(() => toG(1, 'stone' as MassUnit)).toThrowError(RangeError, /Unknown mass unit "stone"/);
    expect(() => toMm(1, 'toString' as LengthUnit)).toThrowError(RangeError, /Unknown length unit/);
  });

  it('should refuse a temperature unit it does not know rather than read it as Fahrenheit', () => {
    expect(() => toCelsius(20, 'K' as TemperatureUnit)).toThrowError(
      RangeError,
      'Unknown temperature unit "K"; use C or F',
    );
    expect(() => fromCelsius(20, 'c' as TemperatureUnit)).toThrowError(RangeError, /Unknown temperature unit "c"/);
    // NIST SP 811: 68 °F is 20 °C
    expect(toCelsius(68, 'F')).toBeCloseTo(20, 12);
  });

  it('should refuse a length or mass that is not a number', () => {
    expect(() => realToModelMm(-1750, 87.1)).toThrowError(RangeError, /real length/);
    expect(() => massToVolumeMl(Number.NaN, 1.1)).toThrowError(RangeError, /mass/);
  });
});
