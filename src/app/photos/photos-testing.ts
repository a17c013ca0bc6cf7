import type { PhotoRecord } from '@benchtide/shared';
import { v7 } from 'uuid';
import { nextTask } from '../sync/sync-testing';
import type { PickedPhoto } from '../sync/photo-upload-queue';

/**
 * For the photo specs: real pictures drawn in the browser, with an EXIF block written by hand where a spec
 * needs a taken time, and records as the server sends them.
 */
export async function drawnPicture(type: 'image/jpeg' | 'image/png' | 'image/webp', colour = '#17606b') {
  const canvas = new OffscreenCanvas(16, 12);
  const context = canvas.getContext('2d');
  if (context === null) throw new Error('This browser cannot draw the test picture');
  context.fillStyle = colour;
  context.fillRect(0, 0, 16, 12);
  return new Uint8Array(await (await canvas.convertToBlob({ type })).arrayBuffer());
}

/**
 * A JPEG whose APP1 segment holds an Exif block with DateTimeOriginal ("2025:03:01 09:30:00") and, if
 * given, OffsetTimeOriginal ("+01:00"): TIFF header, IFD0 with the pointer to the Exif IFD, then the Exif
 * IFD and its ASCII values, all big-endian.
 */
export async function jpegTaken(name: string, dateTime: string, offset?: string): Promise<File> {
  const jpeg = await drawnPicture('image/jpeg');
  const app1 = exifSegment(dateTime, offset);
  // Right after the start-of-image marker, where cameras put it.
  const bytes = new Uint8Array([...jpeg.subarray(0, 2), ...app1, ...jpeg.subarray(2)]);
  return new File([bytes], name, { type: 'image/jpeg' });
}

export async function pictureFile(name: string, type: 'image/jpeg' | 'image/png' | 'image/webp' = 'image/jpeg') {
  return new File([await drawnPicture(type)], name, { type });
}

/** The first bytes of an ISO base media file of brand heic: enough for the checks, which go by them. */
export function heicFile(name = 'IMG_0001.HEIC'): File {
  const head = [0, 0, 0, 24, ...ascii('ftypheic'), 0, 0, 0, 0, ...ascii('mif1heic')];
  return new File([new Uint8Array(head)], name, { type: 'image/heic' });
}

export function picked(file: File, takenAt: string | null = null, id = v7()): PickedPhoto {
  return { id, file, takenAt };
}

/** A photo as the server sends it in a pull or an upload's answer. */
export function serverPhoto(
  workshopId: string,
  id: string,
  buildId: string,
  changeNumber: number,
  more: Partial<PhotoRecord> = {},
): PhotoRecord {
  return {
    id,
    workshopId,
    buildId,
    stepId: null,
    pourId: null,
    caption: '',
    takenAt: '2025-03-01T09:30:00.000Z',
    width: 2048,
    height: 1536,
    contentHash: 'ab'.repeat(32),
    uploadedBy: 'u-ada',
    createdAt: '2025-03-01T10:00:00.000Z',
    updatedAt: '2025-03-01T10:00:00.000Z',
    deletedAt: null,
    changeNumber,
    ...more,
  };
}

/** Waits until an answer from the device store holds; fails after 4.5 s, inside the 5 s a spec may take. */
export async function eventually(check: () => Promise<boolean>, what: string): Promise<void> {
  const giveUpAt = performance.now() + 4_500;
  while (!(await check())) {
    if (performance.now() > giveUpAt) throw new Error(`Gave up waiting for ${what}`);
    await nextTask();
  }
}

/** Puts a file into a hidden file input as the browser does after a choice, and says it changed. */
export function chooseFiles(input: HTMLInputElement, files: readonly File[]): void {
  const transfer = new DataTransfer();
  for (const file of files) transfer.items.add(file);
  input.files = transfer.files;
  input.dispatchEvent(new Event('change'));
}

function exifSegment(dateTime: string, offset?: string): number[] {
  const values: [number, string][] = [[0x9003, `${dateTime}\0`]];
  if (offset !== undefined) values.push([0x9011, `${offset}\0`]);
  const exifIfdAt = 8 + 2 + 12 + 4;
  let dataAt = exifIfdAt + 2 + 12 * values.length + 4;
  const tiff = [...ascii('MM'), ...u16(42), ...u32(8)];
  tiff.push(...u16(1), ...u16(0x8769), ...u16(4), ...u32(1), ...u32(exifIfdAt), ...u32(0));
  const data: number[] = [];
  tiff.push(...u16(values.length));
  for (const [tag, text] of values) {
    tiff.push(...u16(tag), ...u16(2), ...u32(text.length), ...u32(dataAt));
    data.push(...ascii(text));
    dataAt += text.length;
  }
  tiff.push(...u32(0), ...data);
  const body = [...ascii('Exif'), 0, 0, ...tiff];
  return [0xff, 0xe1, ...u16(body.length + 2), ...body];
}

function ascii(text: string): number[] {
  return Array.from(text, (char) => char.charCodeAt(0));
}
function u16(value: number): number[] {
  return [(value >> 8) & 0xff, value & 0xff];
}
function u32(value: number): number[] {
  return [(value >>> 24) & 0xff, (value >> 16) & 0xff, (value >> 8) & 0xff, value & 0xff];
}
