/**
 * Bench photo files: the types, sizes and addresses every side agrees on, without the validation
 * library, so a screen that only shows photos does not load it.
 */

/** What the server accepts, sniffed from the bytes. HEIC only where the image decoder can read it. */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'image/heic'] as const;
export type PhotoType = (typeof PHOTO_TYPES)[number];

/** 25 MiB: a full-size photo from a current phone camera is 3–12 MB (common practice). */
export const MAX_PHOTO_BYTES = 25 * 1024 * 1024;
/** The longer side of the copies kept, in pixels. */
export const PHOTO_DISPLAY_PX = 2048;
export const PHOTO_THUMB_PX = 480;
export const PHOTO_SIZES = ['display', 'thumb'] as const;
export type PhotoSize = (typeof PHOTO_SIZES)[number];

/** Where a member's browser fetches a copy of a photo. */
export function photoUrl(workshopId: string, photoId: string, size: PhotoSize): string {
  return `/api/workshops/${workshopId}/photos/${photoId}/${size}`;
}
