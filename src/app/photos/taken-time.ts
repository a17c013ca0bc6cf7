/** EXIF keeps local wall-clock time as "2025:03:01 09:30:00", its offset (if any) as "+01:00". */
const EXIF_TIME = /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})/;
const OFFSET = /^[+-]\d{2}:\d{2}$/;
type Six = [number, number, number, number, number, number];

/**
 * When the camera took each photo, from its EXIF, as ISO instants (null where a file does not say). The
 * reader is loaded only here, when photos are chosen, so it never weighs on the first screens.
 */
export async function readTakenTimes(
  files: readonly Blob[],
  onRead: (done: number) => void = () => undefined,
): Promise<(string | null)[]> {
  let exifr: typeof import('exifr/dist/full.esm.mjs');
  try {
    exifr = await import('exifr/dist/full.esm.mjs');
  } catch {
    // The reader could not be loaded (a new version deployed while offline): the photos go without their times.
    return files.map(() => null);
  }
  const times: (string | null)[] = [];
  for (const file of files) {
    try {
      const tags = await exifr.parse(file, { pick: ['DateTimeOriginal', 'OffsetTimeOriginal'], reviveValues: false });
      times.push(exifInstant(tags?.['DateTimeOriginal'], tags?.['OffsetTimeOriginal']));
    } catch {
      // A file exifr cannot parse simply has no taken time.
      times.push(null);
    }
    onRead(times.length);
  }
  return times;
}

/** The instant an EXIF time stands for: at its own offset when given, otherwise in this device's time zone. */
export function exifInstant(dateTime: unknown, offset: unknown): string | null {
  const parts = typeof dateTime === 'string' ? EXIF_TIME.exec(dateTime.trim()) : null;
  if (parts === null) return null;
  const [year, month, day, hour, minute, second] = parts.slice(1, 7).map(Number) as Six;
  const local = new Date(year, month - 1, day, hour, minute, second);
  // Date rolls 31 February over into March: a time that does not exist is no time at all.
  if (local.getDate() !== day || local.getMonth() !== month - 1 || hour > 23 || minute > 59 || second > 59) {
    return null;
  }
  const ms =
    typeof offset === 'string' && OFFSET.test(offset)
      ? Date.parse(`${parts[1]}-${parts[2]}-${parts[3]}T${parts[4]}:${parts[5]}:${parts[6]}${offset}`)
      : local.getTime();
  // Cameras with an unset clock write zeros, or 1970.
  return Number.isFinite(ms) && year > 1990 ? new Date(ms).toISOString() : null;
}
