import { exifInstant, readTakenTimes } from './taken-time';
import { jpegTaken, pictureFile } from './photos-testing';

describe('taken time', () => {
  describe('exifInstant', () => {
    it('should read a time with its offset as that instant', () => {
      expect(exifInstant('2025:03:01 09:30:00', '+01:00')).toBe('2025-03-01T08:30:00.000Z');
      expect(exifInstant('2025:03:01 09:30:00', '-05:00')).toBe('2025-03-01T14:30:00.000Z');
    });

    it("should read a time without an offset in this device's time zone", () => {
      expect(exifInstant('2025:03:01 09:30:00', undefined)).toBe(new Date(2025, 2, 1, 9, 30, 0).toISOString());
    });

    it('should give no time for a date that does not exist, an unset clock or no text', () => {
      expect(exifInstant('2025:02:31 09:30:00', '+01:00')).toBeNull();
      expect(exifInstant('2025:03:01 25:30:00', undefined)).toBeNull();
      expect(exifInstant('0000:00:00 00:00:00', undefined)).toBeNull();
      expect(exifInstant('1970:01:01 00:00:00', '+00:00')).toBeNull();
      expect(exifInstant('    :  :     :  :  ', undefined)).toBeNull();
      expect(exifInstant(undefined, undefined)).toBeNull();
      expect(exifInstant(new Date(), undefined)).toBeNull();
    });
  });

  describe('readTakenTimes', () => {
    it('should read each photo’s taken time from its EXIF, and none from a photo without it, reporting each read', async () => {
      const files = [
        await jpegTaken('a.jpg', '2025:03:01 09:30:00', '+01:00'),
        await pictureFile('b.png', 'image/png'),
        await jpegTaken('c.jpg', '2024:12:24 18:05:09'),
      ];
      const reads: number[] = [];

      const times = await readTakenTimes(files, (done) => reads.push(done));

      expect(times).toEqual(['2025-03-01T08:30:00.000Z', null, new Date(2024, 11, 24, 18, 5, 9).toISOString()]);
      expect(reads).toEqual([1, 2, 3]);
    });

    it('should give no time for bytes that are no picture at all', async () => {
      expect(await readTakenTimes([new Blob(['just some words'])])).toEqual([null]);
    });
  });
});
