import { MAX_PHOTO_BYTES } from '@benchtide/shared';
import { checkPhoto, megabytes } from './photo-checks';
import { drawnPicture, heicFile, pictureFile } from './photos-testing';

describe('checkPhoto', () => {
  describe('pictures the server reads', () => {
    for (const type of ['image/jpeg', 'image/png', 'image/webp'] as const) {
      it(`should take a ${type} picture, by its bytes`, async () => {
        expect(await checkPhoto(await pictureFile('bench.pic', type))).toEqual({ ok: true, type });
      });
    }

    it('should go by the bytes, not the type a file claims', async () => {
      const file = new File([await drawnPicture('image/png')], 'riverbed.jpg', { type: 'image/jpeg' });

      expect(await checkPhoto(file)).toEqual({ ok: true, type: 'image/png' });
    });

    it('should take a photo of exactly the largest size', async () => {
      const jpeg = await drawnPicture('image/jpeg');
      const file = new File([jpeg, new Uint8Array(MAX_PHOTO_BYTES - jpeg.length)], 'big.jpg');

      expect(await checkPhoto(file)).toEqual({ ok: true, type: 'image/jpeg' });
    });
  });

  describe('files it refuses, saying why', () => {
    it('should say a HEIC photo cannot be read yet and to choose a JPEG', async () => {
      const check = await checkPhoto(heicFile('IMG_0042.HEIC'));

      expect(check).toEqual({
        ok: false,
        message:
          '“IMG_0042.HEIC” is a HEIC photo, which Benchtide cannot read yet, so it was not added. ' +
          'Choose a JPEG copy of it instead: most phones can save or share photos as JPEG.',
      });
    });

    it('should know a HEIC photo by its name when its bytes say nothing', async () => {
      const check = await checkPhoto(new File(['not much here'], 'harbour.heif'));

      expect(check.ok).toBeFalse();
      expect(check.ok ? '' : check.message).toContain('is a HEIC photo');
    });

    it('should refuse a file that is no picture', async () => {
      const check = await checkPhoto(new File(['resin 1:1 by weight'], 'notes.txt', { type: 'text/plain' }));

      expect(check).toEqual({
        ok: false,
        message:
          '“notes.txt” is not a picture Benchtide can read, so it was not added. Choose a JPEG, PNG or WebP photo.',
      });
    });

    it('should refuse an empty file', async () => {
      expect(await checkPhoto(new File([], 'blank.jpg'))).toEqual({
        ok: false,
        message: '“blank.jpg” is empty, so it was not added.',
      });
    });

    it('should refuse a photo one byte over the largest size, with both sizes', async () => {
      const jpeg = await drawnPicture('image/jpeg');
      const file = new File([jpeg, new Uint8Array(MAX_PHOTO_BYTES + 1 - jpeg.length)], 'huge.jpg');

      expect(await checkPhoto(file)).toEqual({
        ok: false,
        message:
          '“huge.jpg” is 25.1 MB; a photo can be at most 25 MB, so it was not added. Choose a smaller copy of it.',
      });
    });
  });

  describe('megabytes', () => {
    it('should round up to a tenth, so a file just over the limit never reads as the limit', () => {
      expect(megabytes(25 * 1024 * 1024)).toBe('25 MB');
      expect(megabytes(25 * 1024 * 1024 + 1)).toBe('25.1 MB');
      expect(megabytes(3_500_000)).toBe('3.4 MB');
    });
  });
});
