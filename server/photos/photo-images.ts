import { createHash } from 'node:crypto';
import exifr from 'exifr';
import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { PHOTO_DISPLAY_PX, PHOTO_THUMB_PX, PHOTO_TYPES } from '../../shared/photo-files.js';
import { AppError } from '../core/app-error.js';

/** Every copy kept is a JPEG: every browser shows one, and any metadata reader can confirm nothing else rides along. */
export const COPY_TYPE = 'image/jpeg';

/** A 200-megapixel phone camera's full-size photo fits; a small file claiming more is a decompression bomb. */
const MAX_INPUT_PIXELS = 210_000_000;

const HEIF_FAMILY = new Set(['image/heic', 'image/heif', 'image/heic-sequence', 'image/heif-sequence']);
const EXIF_HEADER = Buffer.from('Exif\0\0', 'latin1');

export interface PhotoCopies {
  /** When the camera took it; null when the file does not say. */
  takenAt: Date | null;
  /** Whether the file gave its time's zone (EXIF OffsetTimeOriginal); without it the time was read as UTC. */
  takenAtZoned: boolean;
  /** Of the display copy, upright. */
  width: number;
  height: number;
  display: Buffer;
  thumb: Buffer;
}

/** SHA-256 of the bytes uploaded, hex: how a second upload under the same id is told from a different photo. */
export function hashOf(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/**
 * Turns an upload into the two copies kept: upright, no larger than the app shows them, and
 * re-encoded from the pixels alone, so no EXIF, GPS, XMP or colour profile of the original
 * leaves the server. The type is read from the bytes, never from the file name or the sender.
 */
export async function makeCopies(bytes: Buffer): Promise<PhotoCopies> {
  await refuseUnlessPhoto(bytes);
  const options = { failOn: 'error', limitInputPixels: MAX_INPUT_PIXELS } as const;
  try {
    const { exif } = await sharp(bytes, options).metadata();
    const display = await sharp(bytes, options)
      .autoOrient()
      .resize({ width: PHOTO_DISPLAY_PX, height: PHOTO_DISPLAY_PX, fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 82, mozjpeg: true })
      .toBuffer({ resolveWithObject: true });
    const thumb = await sharp(display.data)
      .resize({ width: PHOTO_THUMB_PX, height: PHOTO_THUMB_PX, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 78, mozjpeg: true })
      .toBuffer();
    return {
      ...(await takenAtOf(exif)),
      width: display.info.width,
      height: display.info.height,
      display: display.data,
      thumb,
    };
  } catch (error) {
    throw unreadable(error);
  }
}

async function refuseUnlessPhoto(bytes: Buffer): Promise<void> {
  const type = (await fileTypeFromBuffer(bytes))?.mime;
  if (type && HEIF_FAMILY.has(type) && !heicReadable()) {
    throw new AppError(
      415,
      'not_a_photo',
      'HEIC photos cannot be read here yet, so this one was not saved. JPEG works: most phones can save or share a photo as JPEG.',
    );
  }
  if (!type || !(PHOTO_TYPES as readonly string[]).includes(type)) {
    throw new AppError(415, 'not_a_photo', 'This file is not a JPEG, PNG or WebP photo, so it was not saved.');
  }
}

/** The image library as built here reads AVIF but not HEIC; a build that reads HEIC says so in its suffixes. */
function heicReadable(): boolean {
  return sharp.format.heif.input.fileSuffix?.includes('.heic') ?? false;
}

function unreadable(error: unknown): AppError {
  if (error instanceof Error && /pixel limit/i.test(error.message)) {
    return new AppError(
      422,
      'photo_unreadable',
      `This photo has more than ${MAX_INPUT_PIXELS / 1_000_000} megapixels, more than the server reads, so it was not saved.`,
    );
  }
  return new AppError(
    422,
    'photo_unreadable',
    'This photo could not be read: the file may be damaged or cut short. It was not saved; try sending it again.',
  );
}

async function takenAtOf(exif: Buffer | undefined): Promise<{ takenAt: Date | null; takenAtZoned: boolean }> {
  const unknown = { takenAt: null, takenAtZoned: false };
  if (!exif) return unknown;
  // The image library hands EXIF over with or without its JPEG marker; the reader wants the TIFF block.
  const tiff = exif.subarray(0, EXIF_HEADER.length).equals(EXIF_HEADER) ? exif.subarray(EXIF_HEADER.length) : exif;
  try {
    const tags = await exifr.parse(tiff, { reviveValues: false, pick: ['DateTimeOriginal', 'OffsetTimeOriginal'] });
    const takenAt = instantOf(tags?.DateTimeOriginal, tags?.OffsetTimeOriginal);
    return {
      takenAt,
      takenAtZoned: takenAt !== null && /^[+-]\d{2}:\d{2}$/.test(String(tags?.OffsetTimeOriginal ?? '')),
    };
  } catch {
    return unknown;
  }
}

type Six = [number, number, number, number, number, number];

/**
 * EXIF writes the time as the camera's clock showed it ("2026:11:20 18:30:15") and, since EXIF
 * 2.31, the zone apart ("+02:00"). Without a zone the clock time is taken as UTC.
 */
export function instantOf(clock: unknown, offset: unknown): Date | null {
  const time = typeof clock === 'string' ? /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})/.exec(clock.trim()) : null;
  if (!time) return null;
  const [year, month, day, hour, minute, second] = time.slice(1, 7).map(Number) as Six;
  const utc = new Date(Date.UTC(year, month - 1, day, hour, minute, second));
  const sameFields =
    utc.getUTCFullYear() === year &&
    utc.getUTCMonth() === month - 1 &&
    utc.getUTCDate() === day &&
    utc.getUTCHours() === hour &&
    utc.getUTCMinutes() === minute &&
    utc.getUTCSeconds() === second;
  if (!sameFields) return null;
  const zone = typeof offset === 'string' ? /^([+-])(\d{2}):(\d{2})$/.exec(offset.trim()) : null;
  const offsetMinutes = zone ? (zone[1] === '-' ? -1 : 1) * (Number(zone[2]) * 60 + Number(zone[3])) : 0;
  return new Date(utc.getTime() - offsetMinutes * 60_000);
}
