import { activityText, moneyText, scaleBadge, sizeText } from './build-words';

// HO 1:87.1 by NMRA S-1.2 and H0 1:87 by NEM 010; the figure scales are common practice. Minor units per ISO 4217:
// the euro has 2 decimals, the yen none, the Bahraini dinar 3.

describe('build words', () => {
  describe('scaleBadge', () => {
    it('should name a standard scale with its ratio', () => {
      expect(scaleBadge({ scaleId: 'ho', scaleRatio: 87.1 })).toBe('HO 1:87.1');
      expect(scaleBadge({ scaleId: 'h0', scaleRatio: 87 })).toBe('H0 1:87');
    });

    it('should not repeat a ratio that is already the name', () => {
      expect(scaleBadge({ scaleId: 'fig-35', scaleRatio: 35 })).toBe('1:35');
    });

    it('should show the bare ratio for a scale of the modeller’s own, or one that no longer matches its name', () => {
      expect(scaleBadge({ scaleId: null, scaleRatio: 150 })).toBe('1:150');
      expect(scaleBadge({ scaleId: '', scaleRatio: 100 })).toBe('1:100');
      expect(scaleBadge({ scaleId: 'ho', scaleRatio: 100 })).toBe('1:100');
    });
  });

  describe('sizeText', () => {
    it('should give both sides, or name the one side known', () => {
      expect(sizeText(459.24, 137.77, 'mm')).toBe('459 mm × 138 mm');
      expect(sizeText(40_000, null, 'm')).toBe('40 m wide');
      expect(sizeText(null, 12_000, 'm')).toBe('12 m deep');
      expect(sizeText(null, null, 'mm')).toBeNull();
    });
  });

  describe('moneyText', () => {
    it('should read minor units in the currency’s own decimals', () => {
      expect(moneyText(1240, 'EUR', 'en-US')).toBe('€12.40');
      expect(moneyText(1240, 'JPY', 'en-US')).toBe('¥1,240');
      expect(moneyText(1240, 'BHD', 'en-US')).toBe('BHD\u00a01.240');
    });
  });

  describe('activityText', () => {
    const now = Date.parse('2025-03-10T12:00:00.000Z');

    it('should say how long ago in words', () => {
      expect(activityText('2025-03-10T11:59:30.000Z', now)).toBe('just now');
      expect(activityText('2025-03-10T11:50:00.000Z', now)).toBe('10 minutes ago');
      expect(activityText('2025-03-10T10:00:00.000Z', now)).toBe('2 hours ago');
      expect(activityText('2025-03-07T12:00:00.000Z', now)).toBe('3 days ago');
    });

    it('should not guess at a time it cannot read', () => {
      expect(activityText('not a time', now)).toBe('at an unknown time');
    });
  });
});
