import fc from 'fast-check';
import { unit } from 'mathjs';
import {
  celsiusToFahrenheit,
  DISPLAY_UNITS,
  fahrenheitToCelsius,
  fromCelsius,
  fromG,
  fromMl,
  fromMm,
  LENGTH_UNITS,
  MASS_UNITS,
  toCelsius,
  toG,
  toMl,
  toMm,
  VOLUME_UNITS,
} from '../../shared/index.js';
import { LAST_DIGIT, relativeDifference } from './closeness.js';

// mathjs carries binary residue (e.g. 1 floz -> 29.573529562500003 mL): agreement is to the last digit, not bit for bit.
const DIGITS = 12;

function expectLastDigit(actual: number, expectedByMathjs: number): void {
  expect(relativeDifference(actual, expectedByMathjs))
    .withContext(`${actual} vs mathjs ${expectedByMathjs}`)
    .toBeLessThan(LAST_DIGIT);
}

describe('units', () => {
  describe('exact factors', () => {
    it('should use 1 in = 25.4 mm exactly (NIST Handbook 44 Appendix C)', () => {
      expect(toMm(1, 'in')).toBe(25.4);
    });

    it('should use 1 ft = 0.3048 m exactly (NIST Handbook 44 Appendix C)', () => {
      expect(toMm(1, 'ft')).toBe(304.8);
    });

    it('should use 1 US fl oz = 29.5735295625 mL exactly (NIST Handbook 44 Appendix C)', () => {
      expect(toMl(1, 'usFlOz')).toBe(29.5735295625);
    });

    it('should use 1 in3 = 16.387064 cm3 exactly (NIST Handbook 44 Appendix C)', () => {
      expect(toMl(1, 'in3')).toBe(16.387064);
      expect(toMl(1, 'cm3')).toBe(1);
    });

    it('should use 1 oz avdp = 28.349523125 g exactly (NIST Handbook 44 Appendix C)', () => {
      expect(toG(1, 'oz')).toBe(28.349523125);
    });

    it('should use 1 lb = 453.59237 g exactly, 16 oz (NIST Handbook 44 Appendix C)', () => {
      expect(toG(1, 'lb')).toBe(453.59237);
      expect(toG(16, 'oz')).toBeCloseTo(toG(1, 'lb'), DIGITS);
    });
  });

  describe('agreement with mathjs', () => {
    const lengthNames = { mm: 'mm', cm: 'cm', m: 'm', in: 'inch', ft: 'foot' } as const;
    const volumeNames = { mL: 'mL', L: 'L', usFlOz: 'floz', in3: 'cuin', cm3: 'cm^3' } as const;
    const massNames = { g: 'g', kg: 'kg', oz: 'oz', lb: 'lb' } as const;

    it('should convert every length unit to and from mm as mathjs does (registry library mathjs)', () => {
      for (const lengthUnit of LENGTH_UNITS) {
        for (const value of [1, 3, 0.5, 12.7, 1435]) {
          expectLastDigit(toMm(value, lengthUnit), unit(value, lengthNames[lengthUnit]).toNumber('mm'));
          expectLastDigit(fromMm(value, lengthUnit), unit(value, 'mm').toNumber(lengthNames[lengthUnit]));
        }
      }
    });

    it('should convert every volume unit to and from mL as mathjs does (registry library mathjs)', () => {
      for (const volumeUnit of VOLUME_UNITS) {
        for (const value of [1, 2.5, 100, 473]) {
          expectLastDigit(toMl(value, volumeUnit), unit(value, volumeNames[volumeUnit]).toNumber('mL'));
          expectLastDigit(fromMl(value, volumeUnit), unit(value, 'mL').toNumber(volumeNames[volumeUnit]));
        }
      }
    });

    it('should convert every mass unit to and from g as mathjs does (registry library mathjs)', () => {
      for (const massUnit of MASS_UNITS) {
        for (const value of [1, 0.25, 16, 1000]) {
          expectLastDigit(toG(value, massUnit), unit(value, massNames[massUnit]).toNumber('g'));
          expectLastDigit(fromG(value, massUnit), unit(value, 'g').toNumber(massNames[massUnit]));
        }
      }
    });

    it('should convert temperatures as mathjs degC/degF do (registry library mathjs)', () => {
      for (const celsius of [-40, 0, 15.5, 20, 25, 37, 100]) {
        expect(celsiusToFahrenheit(celsius)).toBeCloseTo(unit(celsius, 'degC').toNumber('degF'), DIGITS);
        expect(fahrenheitToCelsius(celsius)).toBeCloseTo(unit(celsius, 'degF').toNumber('degC'), DIGITS);
      }
    });
  });

  describe('temperature', () => {
    it('should map freezing and boiling points of water, 0/32 and 100/212 (NIST SP 811, F = C x 9/5 + 32)', () => {
      expect(celsiusToFahrenheit(0)).toBe(32);
      expect(celsiusToFahrenheit(100)).toBe(212);
      expect(fahrenheitToCelsius(212)).toBe(100);
    });

    it('should meet at -40 (NIST SP 811, F = C x 9/5 + 32)', () => {
      expect(celsiusToFahrenheit(-40)).toBe(-40);
    });

    it('should pass degrees C through unchanged and convert degrees F', () => {
      expect(toCelsius(21, 'C')).toBe(21);
      expect(fromCelsius(20, 'F')).toBe(68);
      expect(toCelsius(68, 'F')).toBe(20);
    });
  });

  describe('round trips (property)', () => {
    const amount = fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true });

    it('should return the value after converting out and back for every unit', () => {
      fc.assert(
        fc.property(amount, fc.constantFrom(...LENGTH_UNITS), (value, lengthUnit) => {
          expect(fromMm(toMm(value, lengthUnit), lengthUnit)).toBeCloseTo(value, 6);
        }),
      );
      fc.assert(
        fc.property(amount, fc.constantFrom(...VOLUME_UNITS), (value, volumeUnit) => {
          expect(fromMl(toMl(value, volumeUnit), volumeUnit)).toBeCloseTo(value, 6);
        }),
      );
      fc.assert(
        fc.property(amount, fc.constantFrom(...MASS_UNITS), (value, massUnit) => {
          expect(fromG(toG(value, massUnit), massUnit)).toBeCloseTo(value, 6);
        }),
      );
      fc.assert(
        fc.property(amount, (celsius) => {
          expect(fahrenheitToCelsius(celsiusToFahrenheit(celsius))).toBeCloseTo(celsius, 6);
        }),
      );
    });
  });

  describe('display units', () => {
    it('should show mm, mL, g and degrees C for metric and in, fl oz, oz and degrees F for imperial', () => {
      expect(DISPLAY_UNITS.metric).toEqual({ length: 'mm', volume: 'mL', mass: 'g', temperature: 'C' });
      expect(DISPLAY_UNITS.imperial).toEqual({ length: 'in', volume: 'usFlOz', mass: 'oz', temperature: 'F' });
    });
  });
});
