import { addDays, effectiveUseBy, shelfWarnings, type WatchedContainer } from '../../shared/index.js';

const base: WatchedContainer = { id: 'c1', materialId: 'm1', part: 'A', unit: 'g' };

describe('shelf warnings', () => {
  describe('addDays (calendar arithmetic, checked against ISO 8601 calendar days)', () => {
    it('should cross month ends and the leap day of 2028', () => {
      expect(addDays('2026-01-31', 1)).toBe('2026-02-01');
      expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
      expect(addDays('2027-02-28', 1)).toBe('2027-03-01');
      expect(addDays('2026-03-29', 0)).toBe('2026-03-29');
    });
  });

  describe('effectiveUseBy (common practice: an opened tin keeps for the shelf life the maker gives once opened)', () => {
    it('should take the earlier of the printed day and opened plus shelf life', () => {
      expect(effectiveUseBy({ ...base, useBy: '2027-06-01', openedOn: '2026-11-01' }, 90)).toBe('2027-01-30');
      expect(effectiveUseBy({ ...base, useBy: '2026-12-01', openedOn: '2026-11-01' }, 90)).toBe('2026-12-01');
      expect(effectiveUseBy({ ...base, openedOn: '2026-11-01' }, null)).toBeNull();
      expect(effectiveUseBy(base)).toBeNull();
    });
  });

  it('should warn of low stock at or below the level set, and of an empty container counted on', () => {
    const containers = [
      { ...base, id: 'low', lowStockQty: 100 },
      { ...base, id: 'edge', lowStockQty: 100 },
      { ...base, id: 'fine', lowStockQty: 100 },
      { ...base, id: 'empty', lowStockQty: 50 },
      { ...base, id: 'no-level' },
    ];
    const remaining = { low: 40, edge: 100, fine: 100.5, empty: 0, 'no-level': 1 };

    const kinds = shelfWarnings(containers, remaining, '2026-12-02').map((w) => [w.containerId, w.kind]);

    expect(kinds).toEqual([
      ['low', 'low'],
      ['edge', 'low'],
      ['empty', 'empty'],
    ]);
  });

  it('should warn 14 days ahead of a use-by day and after it, but not for an empty container', () => {
    const containers = [
      { ...base, id: 'past', useBy: '2026-12-01' },
      { ...base, id: 'today', useBy: '2026-12-02' },
      { ...base, id: 'soon', useBy: '2026-12-16' },
      { ...base, id: 'later', useBy: '2026-12-17' },
      { ...base, id: 'gone', useBy: '2026-11-01' },
    ];
    const remaining = { past: 10, today: 10, soon: 10, later: 10, gone: 0 };

    const found = shelfWarnings(containers, remaining, '2026-12-02').map((w) => [w.containerId, w.kind, w.day]);

    expect(found).toEqual([
      ['past', 'expired', '2026-12-01'],
      ['today', 'expiring', '2026-12-02'],
      ['soon', 'expiring', '2026-12-16'],
    ]);
  });
});
