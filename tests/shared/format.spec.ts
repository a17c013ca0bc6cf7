import fc from 'fast-check';
import {
  decimalPlaces,
  formatCountdown,
  formatCupped,
  formatDuration,
  formatLength,
  formatMass,
  formatNumber,
  formatTemperature,
  formatVolume,
  formatWeighed,
  roundToSignificant,
  roundToStep,
} from '../../shared/index.js';

describe('rounding', () => {
  it('should never show binary residue: 0.1 + 0.2 is 0.3', () => {
    expect(roundToSignificant(0.1 + 0.2, 3)).toBe(0.3);
    expect(roundToStep(0.1 + 0.2, 0.1)).toBe(0.3);
    expect(formatNumber(0.1 + 0.2)).toBe('0.3');
  });

  it('should land on the step a scale reads, e.g. 123 steps of 0.1 g is 12.3 g', () => {
    expect(roundToStep(12.34, 0.1)).toBe(12.3);
    expect(roundToStep(12.25, 0.5)).toBe(12.5);
    expect(roundToStep(7.4, 1)).toBe(7);
    expect(roundToStep(0.35, 0.1)).toBe(0.4);
    expect(roundToStep(-2.5, 1)).toBe(-3);
  });

  it('should count the decimals of a step, including exponent notation', () => {
    expect(decimalPlaces(1)).toBe(0);
    expect(decimalPlaces(0.1)).toBe(1);
    expect(decimalPlaces(0.05)).toBe(2);
    expect(decimalPlaces(2.5e-7)).toBe(8);
  });

  it('should give a result with no more decimals than the step (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        fc.constantFrom(0.01, 0.05, 0.1, 0.2, 0.5, 1, 2, 5),
        (value, step) => {
          const rounded = roundToStep(value, step);
          expect(Math.abs(rounded - value)).toBeLessThanOrEqual(step / 2 + 1e-9);
          expect(decimalPlaces(rounded)).toBeLessThanOrEqual(decimalPlaces(step));
        },
      ),
    );
  });

  it('should refuse a step of 0 or below', () => {
    expect(() => roundToStep(1, 0)).toThrowError(RangeError);
    expect(() => roundToStep(1, -0.1)).toThrowError(RangeError);
  });
});

describe('formatNumber', () => {
  it('should keep whole digits and add decimals only up to the significant figures', () => {
    expect(formatNumber(1435)).toBe('1435');
    expect(formatNumber(22.43)).toBe('22.4');
    expect(formatNumber(833.3333333333334)).toBe('833');
    expect(formatNumber(0.254)).toBe('0.25');
    expect(formatNumber(0.254, { maxDecimals: 3 })).toBe('0.254');
    expect(formatNumber(16.5)).toBe('16.5');
    expect(formatNumber(9)).toBe('9');
  });

  it('should keep trailing zeros when a fixed number of decimals is asked for', () => {
    expect(formatNumber(12, { decimals: 1 })).toBe('12.0');
    expect(formatNumber(12.345, { decimals: 2 })).toBe('12.35');
  });

  it('should never print -0 or a locale separator', () => {
    expect(formatNumber(-0.0001)).toBe('0');
    expect(formatNumber(12500.5, { maxDecimals: 1, significant: 6 })).toBe('12500.5');
  });

  it('should show a dash for a value that is not a number', () => {
    expect(formatNumber(Number.NaN)).toBe('—');
  });
});

describe('quantity formatting', () => {
  it('should show lengths in the chosen unit (1 in = 25.4 mm, NIST Handbook 44)', () => {
    expect(formatLength(833.333)).toBe('833 mm');
    expect(formatLength(25.4, 'in')).toBe('1 in');
    expect(formatLength(12.7, 'in')).toBe('0.5 in');
    expect(formatLength(1435, 'm')).toBe('1.435 m');
  });

  it('should show volumes in mL or US fl oz (1 US fl oz = 29.5735295625 mL, NIST Handbook 44)', () => {
    expect(formatVolume(250)).toBe('250 mL');
    expect(formatVolume(29.5735295625, 'usFlOz')).toBe('1 fl oz');
    expect(formatVolume(16.387064, 'in3')).toBe('1 in³');
  });

  it('should show masses in g or oz (1 oz = 28.349523125 g, NIST Handbook 44)', () => {
    expect(formatMass(56.7)).toBe('56.7 g');
    expect(formatMass(56.69904625, 'oz')).toBe('2 oz');
    expect(formatMass(12, 'g', { decimals: 1 })).toBe('12.0 g');
  });

  it('should show temperatures in degrees C or F (F = C x 9/5 + 32, NIST SP 811)', () => {
    expect(formatTemperature(21.5)).toBe('21.5 °C');
    expect(formatTemperature(20, 'F')).toBe('68 °F');
  });
});

describe('tiny amounts', () => {
  it('should say "under" rather than show 0 for something too small for the places shown', () => {
    expect(formatVolume(0.04)).toBe('under 0.1 mL');
    expect(formatMass(0.004)).toBe('under 0.01 g');
    expect(formatVolume(0.06)).toBe('0.1 mL');
    expect(formatVolume(0)).toBe('0 mL');
  });

  it('should show grams to the step the scale reads, and "under" the step for a part that rounds to none', () => {
    expect(formatWeighed(12.3, 0.01)).toBe('12.30 g');
    expect(formatWeighed(0, 0.1, 'g', 0.04)).toBe('under 0.1 g');
    expect(formatWeighed(0, 0.1)).toBe('0.0 g');
  });

  it('should show millilitres to the cup\'s marks, "under 1 mL" where the marks would read nothing', () => {
    expect(formatCupped(3, 1)).toBe('3 mL');
    expect(formatCupped(0, 1, 'mL', 0.4)).toBe('under 1 mL');
    // 1 mL = 0.0338 US fl oz (1 US fl oz = 29.5735295625 mL, NIST Handbook 44)
    expect(formatCupped(0, 1, 'usFlOz', 0.4)).toBe('under 0.03 fl oz');
  });
});

describe('formatDuration', () => {
  it('should show minutes under an hour', () => {
    expect(formatDuration(0)).toBe('0 min');
    expect(formatDuration(45)).toBe('45 min');
    expect(formatDuration(44.6)).toBe('45 min');
  });

  it('should show hours and minutes under a day', () => {
    expect(formatDuration(60)).toBe('1 h');
    expect(formatDuration(130)).toBe('2 h 10 min');
  });

  it('should show days and hours from a day on', () => {
    expect(formatDuration(24 * 60)).toBe('1 d');
    expect(formatDuration(3 * 24 * 60 + 4 * 60 + 10)).toBe('3 d 4 h');
    expect(formatDuration(23 * 60 + 59.6)).toBe('1 d');
  });
});

describe('formatCountdown', () => {
  it('should show minutes and seconds under an hour, rounding up so 0:00 means the moment has come', () => {
    expect(formatCountdown(42 * 60_000 + 7000)).toBe('42:07');
    expect(formatCountdown(1)).toBe('0:01');
    expect(formatCountdown(0)).toBe('0:00');
    expect(formatCountdown(-5000)).toBe('0:00');
  });

  it('should show hours, minutes and seconds under a day', () => {
    expect(formatCountdown((2 * 3600 + 10 * 60 + 5) * 1000)).toBe('2:10:05');
  });

  it('should fall back to days and hours beyond a day', () => {
    expect(formatCountdown((3 * 24 + 4) * 3600 * 1000)).toBe('3 d 4 h');
  });
});
