import { eq } from 'drizzle-orm';
import exifr from 'exifr';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { v7 } from 'uuid';
import { MAX_PHOTO_BYTES } from '../../shared/photo-files.js';
import { photos } from '../../server/db/schema/index.js';
import { makeAccount, makeWorkshop, type TestAccount } from '../support/accounts.js';
import { benchJpeg, uploadPhoto, type UploadFields } from '../support/photos.js';
import { addBuild, api } from '../support/shelf.js';
import { testServer, type TestServer } from '../support/test-app.js';

/** Invented for the test: somewhere on a riverbank, on an evening in November, two hours east of UTC. */
const WHERE_AND_WHEN = {
  IFD2: { DateTimeOriginal: '2026:11:20 18:30:15', OffsetTimeOriginal: '+02:00' },
  IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 22/1 3000/100', GPSLongitudeRef: 'E', GPSLongitude: '4/1 53/1 0/1' },
};

describe('uploading bench photos', () => {
  let server: TestServer;
  let photoDir: string;
  let owner: TestAccount;
  let workshopId: string;
  let buildId: string;

  beforeAll(async () => {
    photoDir = mkdtempSync(join(tmpdir(), 'benchtide-photo-spec-'));
    server = await testServer({ photoStore: { kind: 'disk', dir: photoDir } });
  });

  afterAll(() => rmSync(photoDir, { recursive: true, force: true }));

  beforeEach(async () => {
    owner = await makeAccount(server.ctx, 'Ada');
    workshopId = (await makeWorkshop(server.ctx, owner)).id;
    buildId = await addBuild(api(server, owner, workshopId));
  });

  const upload = (
    photoId: string,
    bytes: Buffer,
    fields: UploadFields = { buildId },
    file: { name?: string; type?: string } = {},
  ) => uploadPhoto(server, owner, workshopId, photoId, fields, { bytes, ...file });

  /** Every file in the store under this spec's workshop (the store keeps a folder per workshop). */
  function storedFiles(): string[] {
    const dir = join(photoDir, workshopId);
    try {
      return readdirSync(dir, { recursive: true, encoding: 'utf8' }).filter((name) =>
        statSync(join(dir, name)).isFile(),
      );
    } catch {
      return [];
    }
  }

  const rowsOf = (photoId: string) => server.ctx.db.select().from(photos).where(eq(photos.id, photoId));

  async function expectNothingStored(photoId: string) {
    expect(await rowsOf(photoId)).toEqual([]);
    expect(storedFiles()).toEqual([]);
  }

  describe('when the photo carries location, time and orientation', () => {
    it('should take the device’s reading of a camera time that has no zone, and the file’s own zone over it', async () => {
      // EXIF 2.32: DateTimeOriginal is the camera's clock; OffsetTimeOriginal, when written, its zone.
      const unzoned = await benchJpeg({ exif: { IFD2: { DateTimeOriginal: '2026:11:20 18:30:15' } } });
      const read = await upload(v7(), unzoned, { buildId, takenAt: '2026-11-20T17:30:15.000Z' }).expect(201);
      expect(read.body.takenAt).toBe('2026-11-20T17:30:15.000Z');
      const zoned = await benchJpeg({ exif: WHERE_AND_WHEN, shade: 3 });
      const own = await upload(v7(), zoned, { buildId, takenAt: '2026-11-20T18:30:15.000Z' }).expect(201);
      expect(own.body.takenAt).toBe('2026-11-20T16:30:15.000Z');
      await upload(v7(), unzoned, { buildId, takenAt: 'yesterday' }).expect(400);
    });

    it('should keep copies with no metadata at all, and take the time the camera wrote', async () => {
      const original = await benchJpeg({ width: 800, height: 600, exif: WHERE_AND_WHEN });
      // The fixture must really carry what the server is to strip.
      expect((await exifr.gps(original))?.latitude).toBeCloseTo(52.375, 6);
      const photoId = v7();

      const created = await upload(photoId, original).expect(201);

      expect(created.body).toEqual({
        id: photoId,
        workshopId,
        buildId,
        stepId: null,
        pourId: null,
        caption: '',
        takenAt: '2026-11-20T16:30:15.000Z',
        width: 800,
        height: 600,
        contentHash: createHash('sha256').update(original).digest('hex'),
        uploadedBy: owner.id,
        createdAt: jasmine.any(String),
        updatedAt: jasmine.any(String),
        deletedAt: null,
        changeNumber: jasmine.any(Number),
      });
      const files = storedFiles();
      expect(files.length).toBe(2);
      for (const name of files) {
        const stored = readFileSync(join(photoDir, workshopId, name));
        expect(await exifr.parse(stored, true))
          .withContext(name)
          .toBeUndefined();
        expect(await exifr.gps(stored))
          .withContext(name)
          .toBeUndefined();
      }
      for (const size of ['display', 'thumb']) {
        const served = await request(server.app)
          .get(`/api/workshops/${workshopId}/photos/${photoId}/${size}`)
          .set('Cookie', owner.cookie)
          .buffer(true)
          .parse((res, done) => {
            const chunks: Buffer[] = [];
            res.on('data', (chunk: Buffer) => chunks.push(chunk));
            res.on('end', () => done(null, Buffer.concat(chunks)));
          })
          .expect(200);
        const bytes = served.body as Buffer;
        expect(served.headers['content-type']).toBe('image/jpeg');
        expect(served.headers['cache-control']).toBe('private, max-age=31536000, immutable');
        expect(served.headers['x-content-type-options']).toBe('nosniff');
        expect(await exifr.parse(bytes, true))
          .withContext(size)
          .toBeUndefined();
        expect(await exifr.gps(bytes))
          .withContext(size)
          .toBeUndefined();
        const { exif, xmp, icc, iptc } = await sharp(bytes).metadata();
        expect([exif, xmp, icc, iptc]).withContext(size).toEqual([undefined, undefined, undefined, undefined]);
      }
    });

    it('should turn a photo the camera held on its side upright (orientation 6), swapping width and height', async () => {
      // Stored sideways: red on the left, blue on the right. Upright (turned a quarter clockwise), red is on top.
      const half = { width: 400, height: 600, channels: 3 } as const;
      const red = await sharp({ create: { ...half, background: '#ff0000' } })
        .png()
        .toBuffer();
      const sideways = await sharp({ create: { ...half, width: 800, background: '#0000ff' } })
        .composite([{ input: red, left: 0, top: 0 }])
        .jpeg()
        .withMetadata({ orientation: 6 })
        .toBuffer();
      const photoId = v7();

      const created = await upload(photoId, sideways).expect(201);

      expect([created.body.width, created.body.height]).toEqual([600, 800]);
      const display = readFileSync(
        join(
          photoDir,
          workshopId,
          storedFiles().find((name) => name.includes('display'))!,
        ),
      );
      const { data, info } = await sharp(display).raw().toBuffer({ resolveWithObject: true });
      const pixel = (x: number, y: number) => [
        ...data.subarray((y * info.width + x) * 3, (y * info.width + x) * 3 + 3),
      ];
      const [top, bottom] = [pixel(300, 100), pixel(300, 700)];
      expect(top[0]).toBeGreaterThan(200);
      expect(top[2]).toBeLessThan(60);
      expect(bottom[2]).toBeGreaterThan(200);
      expect(bottom[0]).toBeLessThan(60);
    });
  });

  it('should keep a large photo at most 2048 px on its longer side and its thumbnail at most 480 px', async () => {
    const photoId = v7();

    const created = await upload(photoId, await benchJpeg({ width: 3000, height: 1500 })).expect(201);

    expect([created.body.width, created.body.height]).toEqual([2048, 1024]);
    const thumb = storedFiles().find((name) => name.includes('thumb'))!;
    const { width, height } = await sharp(join(photoDir, workshopId, thumb)).metadata();
    expect([width, height]).toEqual([480, 240]);
  });

  it('should read the type from the bytes: a PNG sent as "bench.jpg" is kept as the PNG it is', async () => {
    const png = await sharp({ create: { width: 300, height: 200, channels: 4, background: '#22664488' } })
      .png()
      .toBuffer();

    const created = await upload(v7(), png, { buildId }, { name: 'bench.jpg', type: 'image/jpeg' }).expect(201);

    expect([created.body.width, created.body.height, created.body.takenAt]).toEqual([300, 200, null]);
  });

  describe('when the file is not a photo the server can keep', () => {
    it('should refuse a file over 25 MB with 413 photo_too_large, keeping nothing', async () => {
      const huge = Buffer.alloc(MAX_PHOTO_BYTES + 1, 0x20);
      huge.set([0xff, 0xd8, 0xff, 0xe0]);
      const photoId = v7();

      const refused = await upload(photoId, huge).expect(413);

      expect(refused.body.error.code).toBe('photo_too_large');
      expect(refused.body.error.message).toContain('25 MB');
      await expectNothingStored(photoId);
    });

    it('should refuse a text file named .jpg and sent as image/jpeg with 415 not_a_photo, keeping nothing', async () => {
      const photoId = v7();

      const refused = await upload(photoId, Buffer.from('Riverbank: first layer poured at 18:00.\n'.repeat(50)), {
        buildId,
      }).expect(415);

      expect(refused.body.error.code).toBe('not_a_photo');
      await expectNothingStored(photoId);
    });

    it('should refuse JPEG magic bytes followed by a web page, keeping nothing', async () => {
      const polyglot = Buffer.concat([
        Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10]),
        Buffer.from('<html><body><script>alert("bench")</script></body></html>'.repeat(40)),
      ]);
      const photoId = v7();

      const refused = await upload(photoId, polyglot);

      expect(refused.status).toBe(422);
      expect(refused.body.error.code).toBe('photo_unreadable');
      await expectNothingStored(photoId);
    });

    it('should refuse a real JPEG cut in half with 422 photo_unreadable, keeping nothing', async () => {
      const whole = await benchJpeg({ width: 1200, height: 900 });
      const photoId = v7();

      const refused = await upload(photoId, whole.subarray(0, Math.floor(whole.length / 2))).expect(422);

      expect(refused.body.error.code).toBe('photo_unreadable');
      expect(refused.body.error.message).toContain('damaged or cut short');
      await expectNothingStored(photoId);
    });

    it('should refuse HEIC, which the image library here cannot read, saying JPEG works', async () => {
      // An ISO media file header with the HEIC brand, as phones write it.
      const heic = Buffer.alloc(4096);
      heic.writeUInt32BE(24, 0);
      heic.write('ftypheic', 4, 'latin1');
      heic.write('mif1heic', 16, 'latin1');
      const photoId = v7();

      const refused = await upload(photoId, heic, { buildId }, { name: 'IMG_0001.HEIC', type: 'image/heic' }).expect(
        415,
      );

      expect(refused.body.error.code).toBe('not_a_photo');
      expect(refused.body.error.message).toMatch(/HEIC.*JPEG works/);
      await expectNothingStored(photoId);
    });

    it('should refuse a form without a file with 400 photo_missing', async () => {
      const photoId = v7();

      const refused = await uploadPhoto(server, owner, workshopId, photoId, { buildId }, null).expect(400);

      expect(refused.body.error.code).toBe('photo_missing');
      await expectNothingStored(photoId);
    });

    it('should refuse a photo without a build with 400 naming the field, keeping nothing', async () => {
      const photoId = v7();

      const refused = await upload(photoId, await benchJpeg(), {}).expect(400);

      expect(refused.body.error.fields).toEqual({ buildId: 'A photo must belong to a build' });
      await expectNothingStored(photoId);
    });

    it('should refuse a form cut off half-way with 400 bad_upload, keeping nothing', async () => {
      const photoId = v7();

      const refused = await request(server.app)
        .put(`/api/workshops/${workshopId}/photos/${photoId}`)
        .set('Cookie', owner.cookie)
        .set('Content-Type', 'multipart/form-data; boundary=bench')
        .send(`--bench\r\nContent-Disposition: form-data; name="buildId"\r\n\r\n${buildId}\r\n--bench\r\nContent-Disp`)
        .expect(400);

      expect(refused.body.error.code).toBe('bad_upload');
      await expectNothingStored(photoId);
    });

    it('should refuse two files with 400 bad_upload, keeping nothing', async () => {
      const photoId = v7();
      const bytes = await benchJpeg();

      const refused = await upload(photoId, bytes).attach('photo', bytes, 'second.jpg').expect(400);

      expect(refused.body.error.message).toBe('Send one photo, in the form field "photo".');
      await expectNothingStored(photoId);
    });

    it('should refuse a body that is not a form with 400 photo_missing', async () => {
      const photoId = v7();

      const refused = await request(server.app)
        .put(`/api/workshops/${workshopId}/photos/${photoId}`)
        .set('Cookie', owner.cookie)
        .send({ buildId })
        .expect(400);

      expect(refused.body.error.code).toBe('photo_missing');
    });
  });

  describe('when the photo is placed where it cannot go', () => {
    it('should refuse a step of another build with 422 not_in_build, keeping nothing', async () => {
      const client = api(server, owner, workshopId);
      const otherBuild = await addBuild(client);
      const stepId = v7();
      await client
        .post('/steps', {
          id: stepId,
          buildId: otherBuild,
          kind: 'painting',
          title: 'Sky',
          happenedAt: '2026-11-02T10:00:00Z',
        })
        .expect(201);
      const photoId = v7();

      const refused = await upload(photoId, await benchJpeg(), { buildId, stepId }).expect(422);

      expect(refused.body.error.code).toBe('not_in_build');
      expect(refused.body.error.fields).toEqual({ stepId: 'Choose a step of the same build' });
      await expectNothingStored(photoId);
    });

    it('should refuse a deleted build with 404, keeping nothing', async () => {
      await api(server, owner, workshopId).delete(`/builds/${buildId}`).expect(204);
      const photoId = v7();

      const refused = await upload(photoId, await benchJpeg()).expect(404);

      expect(refused.body.error.message).toBe('There is no such build in this workshop.');
      await expectNothingStored(photoId);
    });

    it('should refuse a step and a pour at once with 400', async () => {
      const refused = await upload(v7(), await benchJpeg(), { buildId, stepId: v7(), pourId: v7() }).expect(400);

      expect(refused.body.error.fields).toEqual({ pourId: 'A photo belongs to a step or to a pour, not both' });
    });
  });

  describe('when the same id comes again', () => {
    it('should answer a retry with the same bytes 200 and the photo kept, storing nothing new', async () => {
      const bytes = await benchJpeg();
      const photoId = v7();
      const first = await upload(photoId, bytes).expect(201);
      const filesBefore = storedFiles();

      const retried = await upload(photoId, bytes).expect(200);

      expect(retried.body).toEqual(first.body);
      expect((await rowsOf(photoId)).length).toBe(1);
      expect(storedFiles()).toEqual(filesBefore);
    });

    it('should refuse other bytes under a used id with 409, keeping the first photo', async () => {
      const photoId = v7();
      const first = await upload(photoId, await benchJpeg()).expect(201);
      const filesBefore = storedFiles();

      const refused = await upload(photoId, await benchJpeg({ shade: 40 })).expect(409);

      expect(refused.body.error.code).toBe('id_taken');
      expect((await rowsOf(photoId)).map((row) => row.contentHash)).toEqual([first.body.contentHash]);
      expect(storedFiles()).toEqual(filesBefore);
    });

    it('should end two uploads of one photo at once with exactly one row and one set of files', async () => {
      const bytes = await benchJpeg({ width: 1600, height: 1200 });
      const photoId = v7();

      const answers = await Promise.all([upload(photoId, bytes), upload(photoId, bytes)]);

      expect(answers.map((answer) => answer.status).sort()).toEqual([200, 201]);
      expect(answers[0]!.body).toEqual(answers[1]!.body);
      expect((await rowsOf(photoId)).length).toBe(1);
      expect(storedFiles().length).toBe(2);
    });

    it('should end two different photos under one id at once with the winner alone kept', async () => {
      const photoId = v7();

      const answers = await Promise.all([
        upload(photoId, await benchJpeg({ width: 1600, height: 1200 })),
        upload(photoId, await benchJpeg({ width: 1600, height: 1200, shade: 40 })),
      ]);

      expect(answers.map((answer) => answer.status).sort()).toEqual([201, 409]);
      const winner = answers.find((answer) => answer.status === 201)!.body;
      const rows = await rowsOf(photoId);
      expect(rows.map((row) => row.contentHash)).toEqual([winner.contentHash]);
      expect(storedFiles().sort()).toEqual([rows[0]!.displayKey, rows[0]!.thumbKey].map((key) => basename(key)).sort());
    });
  });
});
