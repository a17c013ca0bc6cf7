import {
  recoatClosesMissed,
  afterQuietHours,
  defaultReminderPreferences,
  reminderPreferencesSchema,
} from '../../shared/reminder-preferences.js';

const at = (iso: string) => Date.parse(iso);
const night = { from: '22:00', until: '07:00' };

describe('quiet hours', () => {
  it('should send at once outside quiet hours', () => {
    // 21:40 in London in December is 21:40 UTC (GMT, IANA tz database).
    expect(afterQuietHours(at('2026-12-02T21:40:00Z'), night, 'Europe/London')).toBe(at('2026-12-02T21:40:00Z'));
  });

  it('should hold a reminder due after the window opens until 07:00 the next morning', () => {
    expect(afterQuietHours(at('2026-12-02T23:15:00Z'), night, 'Europe/London')).toBe(at('2026-12-03T07:00:00Z'));
  });

  it('should hold a reminder due after midnight until 07:00 the same morning', () => {
    expect(afterQuietHours(at('2026-12-03T03:00:00Z'), night, 'Europe/London')).toBe(at('2026-12-03T07:00:00Z'));
  });

  it('should treat the window as starting at its first minute and ending before its last', () => {
    expect(afterQuietHours(at('2026-12-02T22:00:00Z'), night, 'Europe/London')).toBe(at('2026-12-03T07:00:00Z'));
    expect(afterQuietHours(at('2026-12-03T07:00:00Z'), night, 'Europe/London')).toBe(at('2026-12-03T07:00:00Z'));
  });

  it('should count the hours on the member’s own clock, not the server’s', () => {
    // New York is UTC−5 in December (EST, IANA tz database): 03:30 UTC is 22:30 there, quiet until 07:00 EST = 12:00 UTC.
    expect(afterQuietHours(at('2026-12-03T03:30:00Z'), night, 'America/New_York')).toBe(at('2026-12-03T12:00:00Z'));
  });

  it('should end the window at 07:00 local time across the change to summer time', () => {
    // London moves to BST (UTC+1) at 01:00 UTC on the last Sunday of March, 29 March 2026 (IANA tz
    // database; UK Summer Time Order): a reminder due at 23:30 GMT on the 28th waits until 07:00 BST = 06:00 UTC.
    expect(afterQuietHours(at('2026-03-28T23:30:00Z'), night, 'Europe/London')).toBe(at('2026-03-29T06:00:00Z'));
  });

  it('should handle a window within one day', () => {
    const afternoon = { from: '13:00', until: '15:30' };
    expect(afterQuietHours(at('2026-12-02T14:00:00Z'), afternoon, 'UTC')).toBe(at('2026-12-02T15:30:00Z'));
    expect(afterQuietHours(at('2026-12-02T16:00:00Z'), afternoon, 'UTC')).toBe(at('2026-12-02T16:00:00Z'));
  });

  it('should send at once with no window or an empty one', () => {
    expect(afterQuietHours(at('2026-12-02T23:00:00Z'), null, 'UTC')).toBe(at('2026-12-02T23:00:00Z'));
    expect(afterQuietHours(at('2026-12-02T23:00:00Z'), { from: '22:00', until: '22:00' }, 'UTC')).toBe(
      at('2026-12-02T23:00:00Z'),
    );
  });
});

describe('reminder preferences', () => {
  it('should accept the defaults and fall back to UTC for an unknown zone', () => {
    expect(reminderPreferencesSchema.parse(defaultReminderPreferences('Europe/Berlin')).timeZone).toBe('Europe/Berlin');
    expect(defaultReminderPreferences('Mars/Olympus_Mons').timeZone).toBe('UTC');
  });

  it('should refuse a bad time of day, a repeated channel and an unknown zone in plain words', () => {
    const result = reminderPreferencesSchema.safeParse({
      kinds: ['demould'],
      channels: ['push', 'push'],
      quietHours: { from: '24:00', until: '7' },
      timeZone: 'Nowhere/Atlantis',
    });
    expect(result.success).toBeFalse();
    const messages = result.error!.issues.map((issue) => issue.message);
    expect(messages).toContain('Quiet from must be a time of day like 22:30');
    expect(messages).toContain('Quiet until must be a time of day like 22:30');
    expect(messages).toContain('Each channel once');
    expect(messages).toContain('Choose a time zone from the list');
  });
});

// Worked by hand: a reminder goes out `lead` before the window closes; inside quiet hours it waits for their end.
describe('recoat windows quiet hours would hold past their close', () => {
  it('should name the closing times from quiet start plus the lead until quiet end', () => {
    // Quiet 22:00–07:00, lead 30 min: a window closing at 22:29 is reminded at 21:59, before quiet; one
    // closing at 22:30 would be reminded at 22:00, held to 07:00.
    expect(recoatClosesMissed({ from: '22:00', until: '07:00' }, 30)).toEqual({ from: '22:30', until: '07:00' });
  });

  it('should wrap past midnight', () => {
    expect(recoatClosesMissed({ from: '23:45', until: '01:00' }, 30)).toEqual({ from: '00:15', until: '01:00' });
  });

  it('should find none when the lead spans the quiet hours, or there are none', () => {
    expect(recoatClosesMissed({ from: '22:00', until: '07:00' }, 9 * 60)).toBeNull();
    expect(recoatClosesMissed(null, 30)).toBeNull();
  });

  it('should refuse a negative or missing lead', () => {
    expect(() => recoatClosesMissed({ from: '22:00', until: '07:00' }, -1)).toThrowError(RangeError);
    expect(() => recoatClosesMissed({ from: '22:00', until: '07:00' }, Number.NaN)).toThrowError(RangeError);
  });
});
