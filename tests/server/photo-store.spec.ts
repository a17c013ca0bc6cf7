import { createServer, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Readable } from 'node:stream';
import { readConfig } from '../../server/config.js';
import { diskPhotoStore } from '../../server/photos/disk-photo-store.js';
import type { PhotoStore } from '../../server/photos/photo-store.js';
import { s3PhotoStore } from '../../server/photos/s3-photo-store.js';

async function read(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of body) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

/** What every store must do, whatever keeps the bytes. */
function behavesAsAPhotoStore(store: () => PhotoStore) {
  it('should give back what was put, and null once it is removed', async () => {
    const bytes = Buffer.from('first layer, 4 mm');
    await store().put('w1/p1.display.jpg', bytes, 'image/jpeg');

    const copy = await store().get('w1/p1.display.jpg');
    expect(await read(copy!.body)).toEqual(bytes);
    expect(copy!.bytes).toBe(bytes.length);

    await store().remove('w1/p1.display.jpg');
    expect(await store().get('w1/p1.display.jpg')).toBeNull();
  });

  it('should answer null for a key never put, and take removing it calmly', async () => {
    expect(await store().get('w1/never.jpg')).toBeNull();
    await expectAsync(store().remove('w1/never.jpg')).toBeResolved();
  });

  it('should replace what a key held', async () => {
    await store().put('w1/p2.thumb.jpg', Buffer.from('old'), 'image/jpeg');
    await store().put('w1/p2.thumb.jpg', Buffer.from('new'), 'image/jpeg');

    expect((await read((await store().get('w1/p2.thumb.jpg'))!.body)).toString()).toBe('new');
  });

  it('should refuse keys that could reach outside the store', async () => {
    for (const key of [
      '../outside.jpg',
      '/etc/passwd',
      'w1/../../outside.jpg',
      'w1//p.jpg',
      '',
      '.hidden',
      'w1\\p.jpg',
    ]) {
      await expectAsync(store().put(key, Buffer.from('x'), 'image/jpeg'))
        .withContext(key)
        .toBeRejectedWithError(/Not a photo store key/);
      await expectAsync(store().get(key))
        .withContext(key)
        .toBeRejectedWithError(/Not a photo store key/);
    }
  });
}

describe('the disk photo store', () => {
  let root: string;

  beforeEach(() => {
    root = mkdtempSync(join(tmpdir(), 'benchtide-store-spec-'));
  });

  afterEach(() => rmSync(root, { recursive: true, force: true }));

  behavesAsAPhotoStore(() => diskPhotoStore(join(root, 'photos')));

  it('should keep the bytes at the key under its folder and leave no temporary file behind', async () => {
    await diskPhotoStore(root).put('w1/p1.display.jpg', Buffer.from('bytes'), 'image/jpeg');

    expect(readFileSync(join(root, 'w1', 'p1.display.jpg'), 'utf8')).toBe('bytes');
    expect(readdirSync(join(root, 'w1'))).toEqual(['p1.display.jpg']);
  });
});

/**
 * A stand-in for an S3-compatible service on 127.0.0.1: objects in a Map by path ("/bucket/key").
 * It does not verify signatures, but refuses any request that is not signed the SigV4 way.
 */
class StandInS3 {
  readonly objects = new Map<string, { bytes: Buffer; type: string }>();
  readonly seen: string[] = [];
  private readonly server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      const path = decodeURIComponent(new URL(req.url ?? '/', 'http://stand-in').pathname);
      this.seen.push(`${req.method} ${path}`);
      const signed =
        /^AWS4-HMAC-SHA256 Credential=STANDINKEY\/\d{8}\/eu-test-1\/s3\/aws4_request, SignedHeaders=[a-z0-9;-]+, Signature=[0-9a-f]{64}$/.test(
          req.headers.authorization ?? '',
        ) && /^\d{8}T\d{6}Z$/.test(String(req.headers['x-amz-date']));
      if (!signed) return this.error(res, 403, 'AccessDenied');
      if (req.method === 'PUT') {
        this.objects.set(path, { bytes: Buffer.concat(chunks), type: req.headers['content-type'] ?? '' });
        return res.writeHead(200, { ETag: '"stand-in"' }).end();
      }
      if (req.method === 'GET') {
        const object = this.objects.get(path);
        if (!object) return this.error(res, 404, 'NoSuchKey');
        return res
          .writeHead(200, { 'Content-Type': object.type, 'Content-Length': object.bytes.length })
          .end(object.bytes);
      }
      if (req.method === 'DELETE') {
        this.objects.delete(path);
        return res.writeHead(204).end();
      }
      return this.error(res, 405, 'MethodNotAllowed');
    });
  });

  private error(res: ServerResponse, status: number, code: string) {
    res.writeHead(status, { 'Content-Type': 'application/xml' });
    res.end(`<?xml version="1.0" encoding="UTF-8"?><Error><Code>${code}</Code><Message>${code}</Message></Error>`);
  }

  async listen(): Promise<string> {
    await new Promise<void>((resolve) => this.server.listen(0, '127.0.0.1', resolve));
    return `http://127.0.0.1:${(this.server.address() as AddressInfo).port}`;
  }

  close(): Promise<void> {
    return new Promise((resolve) => this.server.close(() => resolve()));
  }
}

describe('the S3 photo store, against a stand-in service', () => {
  let standIn: StandInS3;
  let endpoint: string;
  let store: PhotoStore;

  beforeAll(async () => {
    standIn = new StandInS3();
    endpoint = await standIn.listen();
    const config = readConfig({
      PHOTO_STORE: 's3',
      S3_ENDPOINT: endpoint,
      S3_BUCKET: 'bench-photos',
      S3_REGION: 'eu-test-1',
      S3_ACCESS_KEY_ID: 'STANDINKEY',
      S3_SECRET_ACCESS_KEY: 'stand-in-secret',
    });
    store = s3PhotoStore(config.photoStore as Extract<typeof config.photoStore, { kind: 's3' }>);
  });

  afterAll(() => standIn.close());

  behavesAsAPhotoStore(() => store);

  it('should address the bucket in the path and keep the content type with the object', async () => {
    await store.put('w9/p9.display.jpg', Buffer.from('jpeg bytes'), 'image/jpeg');

    expect(standIn.seen).toContain('PUT /bench-photos/w9/p9.display.jpg');
    expect(standIn.objects.get('/bench-photos/w9/p9.display.jpg')?.type).toBe('image/jpeg');
  });

  it('should be refused by the stand-in when a request is not signed', async () => {
    const unsigned = await fetch(`${endpoint}/bench-photos/w9/p9.display.jpg`);

    expect(unsigned.status).toBe(403);
  });
});

describe('the photo store settings', () => {
  it('should keep photos on disk under .data/photos unless told otherwise', () => {
    expect(readConfig({}).photoStore).toEqual({ kind: 'disk', dir: join(process.cwd(), '.data', 'photos') });
  });

  it('should refuse an S3 store without a bucket, or with half a key pair', () => {
    expect(() => readConfig({ PHOTO_STORE: 's3' })).toThrowError(/S3_BUCKET/);
    expect(() => readConfig({ PHOTO_STORE: 's3', S3_BUCKET: 'b', S3_ACCESS_KEY_ID: 'k' })).toThrowError(
      /together, or neither/,
    );
    expect(() => readConfig({ PHOTO_STORE: 'ftp' })).toThrowError(/disk or s3/);
  });
});
