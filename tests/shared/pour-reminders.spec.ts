import { cureTimeline, type CureDataSheet } from '../../shared/cure.js';
import { pourReminders } from '../../shared/pour-reminders.js';

// A data sheet of our own invention (demo-style numbers, not a real product): times at 24 °C.
const sheet: CureDataSheet = {
  referenceTempC: 24,
  potLifeMin: 40,
  recoatMin: 360,
  recoatMaxMin: 1440,
  demouldMin: 1440,
  fullCureMin: 4320,
  minCureTempC: 15,
  maxLayerMm: 6,
};
const start = Date.parse('2026-12-02T18:00:00Z');
const minutes = (n: number) => n * 60_000;

describe('the reminders a pour earns', () => {
  it('should remind of each next layer, demould and full cure, in time order, at the data sheet times', () => {
    // At the reference temperature the corrected times are the data sheet's own (t = t_ref × 2^0).
    const cure = cureTimeline({ dataSheet: sheet, roomTempC: 24, startAtMs: start, layerCount: 3 });
    const reminders = pourReminders(cure, { buildName: 'Harbour at Skellan', feature: 'Inner basin' });
    expect(reminders.map((r) => [r.key, r.dueAtMs])).toEqual([
      ['next-layer-due:2', start + minutes(360)],
      ['next-layer-due:3', start + minutes(720)],
      ['demould', start + minutes(720 + 1440)],
      ['full-cure', start + minutes(720 + 4320)],
    ]);
    expect(reminders[0]!.title).toBe('Layer 2 of 3 can go on');
    expect(reminders[0]!.body).toContain('Inner basin on Harbour at Skellan');
  });

  it('should stretch with a colder room: 10 °C colder doubles each wait (rule of thumb, common practice)', () => {
    const cure = cureTimeline({ dataSheet: sheet, roomTempC: 14, startAtMs: start, layerCount: 1 });
    const reminders = pourReminders(cure, { buildName: 'Harbour at Skellan', feature: '' });
    // 14 °C is below the 15 °C minimum: the estimate is clamped to 15 °C, 2^(9/10) times the reference.
    const factor = 2 ** ((24 - 15) / 10);
    expect(reminders.map((r) => r.kind)).toEqual(['demould', 'full-cure']);
    expect(reminders[0]!.dueAtMs).toBeCloseTo(start + minutes(1440 * factor), -4);
    expect(reminders[1]!.body.startsWith('Harbour at Skellan has fully cured')).toBeTrue();
  });

  it('should give the same keys every time it is worked out for the same pour', () => {
    const cure = cureTimeline({ dataSheet: sheet, roomTempC: 20, startAtMs: start, layerCount: 2 });
    const once = pourReminders(cure, { buildName: 'B', feature: 'F' }).map((r) => r.key);
    const again = pourReminders(cure, { buildName: 'B', feature: 'F' }).map((r) => r.key);
    expect(again).toEqual(once);
    expect(new Set(once).size).toBe(once.length);
  });
});
