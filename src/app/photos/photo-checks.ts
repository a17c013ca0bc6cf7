import { MAX_PHOTO_BYTES } from '@benchtide/shared';

/** The kinds of picture the server can turn into copies today; it cannot decode HEIC yet. */
export type ReadableType = 'image/jpeg' | 'image/png' | 'image/webp';

export type PhotoCheck =
  { readonly ok: true; readonly type: ReadableType } | { readonly ok: false; readonly message: string };

const MIB = 1024 * 1024;
/** ISO base media brands that mark a HEIC or HEIF still picture. */
const HEIF_BRANDS = ['heic', 'heix', 'heim', 'heis', 'hevc', 'hevx', 'mif1', 'msf1'];

/**
 * Whether a chosen file can be queued: a picture the server reads, by its first bytes (a file's stated type
 * is often missing or wrong), and no larger than the server takes. Says why not in plain words.
 */
export async function checkPhoto(file: File): Promise<PhotoCheck> {
  const name = `“${file.name || 'The file'}”`;
  if (file.size === 0) return refused(`${name} is empty, so it was not added.`);
  let head: Uint8Array;
  try {
    head = new Uint8Array(await file.slice(0, 16).arrayBuffer());
  } catch {
    return refused(`${name} could not be read on this device, so it was not added. Try choosing it again.`);
  }
  const type = sniff(head);
  const saysHeic = /\.hei[cf]$/i.test(file.name) || /^image\/hei[cf]/i.test(file.type);
  if (type === 'heic' || (type === null && saysHeic)) {
    return refused(
      `${name} is a HEIC photo, which Benchtide cannot read yet, so it was not added. ` +
        'Choose a JPEG copy of it instead: most phones can save or share photos as JPEG.',
    );
  }
  if (type === null) {
    return refused(
      `${name} is not a picture Benchtide can read, so it was not added. Choose a JPEG, PNG or WebP photo.`,
    );
  }
  if (file.size > MAX_PHOTO_BYTES) {
    return refused(
      `${name} is ${megabytes(file.size)}; a photo can be at most ${megabytes(MAX_PHOTO_BYTES)}, so it was not added. ` +
        'Choose a smaller copy of it.',
    );
  }
  return { ok: true, type };
}

function sniff(head: Uint8Array): ReadableType | 'heic' | null {
  const text = (from: number, to: number) => String.fromCharCode(...head.subarray(from, to));
  if (head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (text(0, 8) === '\x89PNG\r\n\x1a\n') return 'image/png';
  if (text(0, 4) === 'RIFF' && text(8, 12) === 'WEBP') return 'image/webp';
  if (text(4, 8) === 'ftyp' && HEIF_BRANDS.includes(text(8, 12))) return 'heic';
  return null;
}

/** In binary megabytes, as phones show sizes; rounded up, so a file just over the limit never reads as the limit. */
export function megabytes(bytes: number): string {
  return `${Math.ceil((bytes / MIB) * 10) / 10} MB`;
}

function refused(message: string): PhotoCheck {
  return { ok: false, message };
}
