import { formatMoney, summariseCosts, type CostRow } from '../../shared/index.js';

const row = (fields: Partial<CostRow>): CostRow => ({
  buildId: 'b-mill',
  buildName: 'Mill race',
  materialId: 'm-clear',
  materialName: 'Clear resin',
  month: '2026-11',
  currency: 'EUR',
  costMinor: 0,
  ...fields,
});

describe('summariseCosts (worked example by hand)', () => {
  // Two uses in the mill race (4.23 + 1.10), one in the harbour in December (2.00), waste of 0.50 in
  // November, and one use bought in pounds sterling (3.00), which is never added to the euros.
  const rows = [
    row({ costMinor: 423 }),
    row({ costMinor: 110, materialId: 'm-gel', materialName: 'Water gel' }),
    row({ costMinor: 200, buildId: 'b-harbour', buildName: 'Harbour', month: '2026-12' }),
    row({ costMinor: 50, buildId: null, buildName: null }),
    row({ costMinor: 300, currency: 'GBP' }),
  ];
  const report = summariseCosts(rows);

  it('should sum per build, leaving waste out, each currency apart', () => {
    expect(report.byBuild).toEqual([
      { key: 'b-harbour', label: 'Harbour', currency: 'EUR', costMinor: 200 },
      { key: 'b-mill', label: 'Mill race', currency: 'EUR', costMinor: 533 },
      { key: 'b-mill', label: 'Mill race', currency: 'GBP', costMinor: 300 },
    ]);
  });

  it('should count waste for the material and the month', () => {
    expect(report.byMaterial.find((line) => line.key === 'm-clear' && line.currency === 'EUR')?.costMinor).toBe(
      423 + 200 + 50,
    );
    expect(report.byMonth.filter((line) => line.currency === 'EUR').map((line) => [line.key, line.costMinor])).toEqual([
      ['2026-11', 423 + 110 + 50],
      ['2026-12', 200],
    ]);
  });

  it('should total each currency on its own', () => {
    expect(report.total).toEqual([
      { key: 'EUR', label: 'EUR', currency: 'EUR', costMinor: 783 },
      { key: 'GBP', label: 'GBP', currency: 'GBP', costMinor: 300 },
    ]);
  });

  it('should leave out lines that come to nothing', () => {
    expect(summariseCosts([row({ costMinor: 0 })]).byBuild).toEqual([]);
  });
});

describe('summariseCosts with exact costs', () => {
  it('should sum exactly and round each line once: 0.4 + 0.4 + 0.4 cents on one build is 1 cent, not 0', () => {
    const report = summariseCosts([row({ costMinor: 0.4 }), row({ costMinor: 0.4 }), row({ costMinor: 0.4 })]);
    expect(report.byBuild.map((line) => line.costMinor)).toEqual([1]);
    expect(report.total.map((line) => line.costMinor)).toEqual([1]);
  });

  it('should refuse a cost that is not a number or is below 0, in plain words', () => {
    expect(() => summariseCosts([row({ costMinor: 100 }), row({ costMinor: Number.NaN })])).toThrowError(
      RangeError,
      /A cost in the stock book is not a number \(NaN\)\. Material Clear resin, 2026-11\./,
    );
    expect(() => summariseCosts([row({ costMinor: -5 })])).toThrowError(RangeError, /must be 0 or more, got -5/);
  });
});

describe('formatMoney (ISO 4217 minor units: EUR 2 decimals, JPY 0)', () => {
  it('should round exact minor units once, half away from zero, and refuse NaN rather than print it', () => {
    expect(formatMoney(149.95, 'EUR', 'en-GB')).toBe('€1.50');
    expect(formatMoney(0.4999, 'EUR', 'en-GB')).toBe('€0.00');
    expect(() => formatMoney(Number.NaN, 'EUR', 'en-GB')).toThrowError(RangeError);
  });

  it('should turn minor units into the amount the currency writes', () => {
    expect(formatMoney(1234, 'EUR', 'en-GB')).toBe('€12.34');
    expect(formatMoney(500, 'JPY', 'en-GB')).toBe('JP¥500');
    expect(formatMoney(5, 'USD', 'en-US')).toBe('$0.05');
  });
});
