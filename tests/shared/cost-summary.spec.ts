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

describe('formatMoney (ISO 4217 minor units: EUR 2 decimals, JPY 0)', () => {
  it('should turn minor units into the amount the currency writes', () => {
    expect(formatMoney(1234, 'EUR', 'en-GB')).toBe('€12.34');
    expect(formatMoney(500, 'JPY', 'en-GB')).toBe('JP¥500');
    expect(formatMoney(5, 'USD', 'en-US')).toBe('$0.05');
  });
});
