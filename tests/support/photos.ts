import sharp, { type Exif } from 'sharp';
import request from 'supertest';
import type { TestAccount } from './accounts.js';
import type { TestServer } from './test-app.js';

interface BenchPhoto {
  width?: number;
  height?: number;
  /** EXIF written into the file, by IFD: IFD0 the image, IFD2 the Exif block, IFD3 GPS. */
  exif?: Exif;
  /** EXIF orientation 1–8: how a viewer must turn the stored pixels to show them upright. */
  orientation?: number;
  /** A different picture of the same size, for "same id, other bytes". */
  shade?: number;
}

/**
 * An invented bench photo made in the test: noise over a colour, so the file is as hard to
 * compress as a real photo and a cut in it lands in the picture data.
 */
export async function benchJpeg(photo: BenchPhoto = {}): Promise<Buffer> {
  const { width = 640, height = 480, shade = 0 } = photo;
  const pixels = await sharp({
    create: {
      width,
      height,
      channels: 3,
      background: '#000',
      noise: { type: 'gaussian', mean: 110 + shade, sigma: 40 },
    },
  })
    .raw()
    .toBuffer();
  let image = sharp(pixels, { raw: { width, height, channels: 3 } }).jpeg({ quality: 90 });
  if (photo.orientation) image = image.withMetadata({ orientation: photo.orientation });
  if (photo.exif) image = image.withExifMerge(photo.exif);
  return image.toBuffer();
}

export interface UploadFields {
  buildId?: string;
  stepId?: string;
  pourId?: string;
  caption?: string;
  takenAt?: string;
}

/** PUT a photo as the app does: a multipart form with the file in "photo" and the fields beside it. */
export function uploadPhoto(
  server: TestServer,
  account: TestAccount | null,
  workshopId: string,
  photoId: string,
  fields: UploadFields,
  file: { bytes: Buffer; name?: string; type?: string } | null,
) {
  let call = request(server.app).put(`/api/workshops/${workshopId}/photos/${photoId}`);
  if (account) call = call.set('Cookie', account.cookie);
  for (const [name, value] of Object.entries(fields)) call = call.field(name, value);
  if (file) {
    call = call.attach('photo', file.bytes, {
      filename: file.name ?? 'bench.jpg',
      contentType: file.type ?? 'image/jpeg',
    });
  }
  return call;
}
