import { instantOf } from '../../server/photos/photo-images.js';

// Times and zones as Exif 2.31 (CIPA DC-008-2016) writes them: "YYYY:MM:DD HH:MM:SS" for DateTimeOriginal, "±HH:MM" for OffsetTimeOriginal.
describe('instantOf, the moment an EXIF time stands for', () => {
  it('should read a clock time east of UTC as that many hours earlier in UTC', () => {
    expect(instantOf('2026:11:20 18:30:15', '+02:00')?.toISOString()).toBe('2026-11-20T16:30:15.000Z');
  });

  it('should read a clock time west of UTC, with minutes in the zone, across midnight', () => {
    expect(instantOf('2026:03:01 22:10:00', '-03:30')?.toISOString()).toBe('2026-03-02T01:40:00.000Z');
  });

  it('should take a clock time without a zone as UTC', () => {
    expect(instantOf('2026:11:20 18:30:15', undefined)?.toISOString()).toBe('2026-11-20T18:30:15.000Z');
  });

  it('should ignore a zone it cannot read rather than guess', () => {
    expect(instantOf('2026:11:20 18:30:15', 'CET')?.toISOString()).toBe('2026-11-20T18:30:15.000Z');
  });

  it('should answer null for a camera whose clock was never set, or a date that does not exist', () => {
    expect(instantOf('0000:00:00 00:00:00', '+00:00')).toBeNull();
    expect(instantOf('2026:02:30 12:00:00', '+00:00')).toBeNull();
    expect(instantOf('    :  :     :  :  ', undefined)).toBeNull();
    expect(instantOf(undefined, undefined)).toBeNull();
  });
});
